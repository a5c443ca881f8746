/**
 * Readings against the same circuit last time, as a table: this time's and last time's cell, the
 * note expected (or none) and where the threshold comes from. The thresholds are the trade's
 * rule of thumb (common practice): insulation resistance fallen to less than half, Zs or R1+R2
 * risen by more than a fifth; the 0.05 Ω and 100 MΩ floors are the checker's own choices.
 */

import { describe, expect, it } from 'vitest';
import { checkBoard, createBoardChecker, findingCodes, previousReadingCodes } from '../../../shared/checker/index.ts';
import type { CheckCircuit } from '../../../shared/schemas/check.ts';
import type { ReadingKey } from '../../../shared/schemas/columns.ts';
import type { Finding } from '../../../shared/schemas/findings.ts';
import { board, cleanRadialCells, radial, type CellsSpec } from './fixtures.ts';

function cells(spec: CellsSpec): NonNullable<CheckCircuit['previous']> {
  const out: NonNullable<CheckCircuit['previous']> = {};
  for (const [key, value] of Object.entries(spec) as Array<[ReadingKey, CellsSpec[ReadingKey]]>) {
    if (value !== undefined) out[key] = typeof value === 'string' ? { text: value, reason: null } : value;
  }
  return out;
}

/** Only this module's notes (the board's other rules are tested elsewhere). */
function sinceLastTime(findings: readonly Finding[]): Finding[] {
  return findings.filter((f) => f.code in previousReadingCodes);
}

interface Case {
  name: string;
  now: CellsSpec;
  then: CellsSpec;
  expect: null | { code: string; columns: string[]; limit?: string; messageIncludes?: string };
}

const cases: Case[] = [
  // ---- insulation resistance: fallen to less than half ----
  {
    name: 'IR L-E 80 → 30 MΩ: below half (40)',
    now: { irLiveEarth: '30' },
    then: { irLiveEarth: '80' },
    // common practice: less than half of last time → ≥ 40 MΩ
    expect: { code: 'ir-fallen-since-last-time', columns: ['irLiveEarth'], limit: '≥ 40 MΩ (half of last time’s 80 MΩ)', messageIncludes: 'to 38 %' },
  },
  { name: 'IR L-E 80 → 45 MΩ: not below half', now: { irLiveEarth: '45' }, then: { irLiveEarth: '80' }, expect: null },
  { name: 'IR L-E 80 → 40 MΩ: exactly half is not less than half', now: { irLiveEarth: '40' }, then: { irLiveEarth: '80' }, expect: null },
  {
    name: 'IR L-L >200 → 90 MΩ: below half of at least 200, so certainly fallen',
    now: { irLiveLive: '90' },
    then: { irLiveLive: '>200' },
    expect: { code: 'ir-fallen-since-last-time', columns: ['irLiveLive'], limit: '≥ 100 MΩ (half of last time’s >200 MΩ)' },
  },
  { name: 'IR >200 → 150 MΩ: not certain (and 100 MΩ or more is not compared)', now: { irLiveLive: '150' }, then: { irLiveLive: '>200' }, expect: null },
  { name: 'IR 600 → 120 MΩ: still 100 MΩ or more, not compared (the checker’s choice)', now: { irLiveLive: '120' }, then: { irLiveLive: '600' }, expect: null },
  { name: 'IR 80 → >200 MΩ: a rise, nothing to say', now: { irLiveEarth: '>200' }, then: { irLiveEarth: '80' }, expect: null },
  {
    name: 'IR 2.0 → 0.8 MΩ: noted (still above the 1.0 MΩ minimum of Table 64)',
    now: { irLiveEarth: '0.8' },
    then: { irLiveEarth: '2.0' },
    expect: { code: 'ir-fallen-since-last-time', columns: ['irLiveEarth'], limit: '≥ 1.00 MΩ (half of last time’s 2 MΩ)' },
  },

  // ---- Zs: risen by more than a fifth ----
  {
    name: 'Zs 0.50 → 0.62 Ω: above 0.60 (+ a fifth)',
    now: { zs: '0.62' },
    then: { zs: '0.50' },
    // common practice: 0.50 × 1.2 = 0.60 Ω
    expect: { code: 'zs-risen-since-last-time', columns: ['zs'], limit: '≤ 0.60 Ω (last time’s 0.50 Ω + a fifth, at least + 0.05 Ω)', messageIncludes: '(+24 %)' },
  },
  { name: 'Zs 0.52 → 0.62 Ω: within a fifth (0.624)', now: { zs: '0.62' }, then: { zs: '0.52' }, expect: null },
  { name: 'Zs >200 last time: cannot say it rose', now: { zs: '0.62' }, then: { zs: '>200' }, expect: null },
  {
    name: 'Zs 0.50 → >2 Ω this time: certainly risen',
    now: { zs: '>2' },
    then: { zs: '0.50' },
    expect: { code: 'zs-risen-since-last-time', columns: ['zs'] },
  },
  { name: 'Zs LIM last time: nothing compared', now: { zs: '0.62' }, then: { zs: 'LIM' }, expect: null },
  { name: 'Zs N/A this time: nothing compared', now: { zs: 'N/A' }, then: { zs: '0.40' }, expect: null },

  // ---- R1+R2 (or R2): risen by more than a fifth and by more than 0.05 Ω ----
  {
    name: 'R1+R2 0.24 → 0.30 Ω: above 0.29 (0.24 + 0.05 beats 0.288)',
    now: { r1PlusR2: '0.30' },
    then: { r1PlusR2: '0.24' },
    expect: { code: 'continuity-risen-since-last-time', columns: ['r1PlusR2'], limit: '≤ 0.29 Ω (last time’s 0.24 Ω + a fifth, at least + 0.05 Ω)' },
  },
  { name: 'R1+R2 0.25 → 0.30 Ω: exactly a fifth is not more than a fifth', now: { r1PlusR2: '0.30' }, then: { r1PlusR2: '0.25' }, expect: null },
  { name: 'R1+R2 0.10 → 0.14 Ω: +40 % but only 0.04 Ω (test leads, last digit)', now: { r1PlusR2: '0.14' }, then: { r1PlusR2: '0.10' }, expect: null },
  {
    name: 'R1+R2 1.10 → 1.45 Ω: above 1.32',
    now: { r1PlusR2: '1.45' },
    then: { r1PlusR2: '1.10' },
    expect: { code: 'continuity-risen-since-last-time', columns: ['r1PlusR2'], limit: '≤ 1.32 Ω (last time’s 1.10 Ω + a fifth, at least + 0.05 Ω)' },
  },
  {
    name: 'R2 by wander lead 0.80 → 1.05 Ω',
    now: { r1PlusR2: '', r2: '1.05' },
    then: { r2: '0.80' },
    expect: { code: 'continuity-risen-since-last-time', columns: ['r2'], limit: '≤ 0.96 Ω (last time’s 0.80 Ω + a fifth, at least + 0.05 Ω)' },
  },
  { name: 'R1+R2 this time against R2 last time: different readings, not compared', now: { r1PlusR2: '0.60' }, then: { r2: '0.30' }, expect: null },
];

describe('readings against the same circuit last time', () => {
  it.each(cases)('$name', ({ now, then, expect: e }) => {
    const circuit = radial({ cells: { ...cleanRadialCells, ...now }, previous: cells(then) });
    const notes = sinceLastTime(checkBoard(board([circuit], { board: { zdbOhm: null } })));
    if (e === null) {
      expect(notes).toEqual([]);
      return;
    }
    expect(notes).toHaveLength(1);
    const [note] = notes;
    expect(note).toMatchObject({ code: e.code, severity: 'note', circuitId: 1, columns: e.columns });
    expect(note!.source).toContain('common practice');
    if (e.limit) expect(note!.limit).toBe(e.limit);
    if (e.messageIncludes) expect(note!.message).toContain(e.messageIncludes);
    // The board checker knows the code and its severity.
    expect(findingCodes[note!.code as keyof typeof findingCodes]).toBe('note');
  });

  it('a circuit with no previous readings gives exactly what it gave before', () => {
    const plain = radial({ cells: { ...cleanRadialCells, zs: '0.62' } });
    const withEmpty = { ...plain, previous: {} };
    expect(checkBoard(board([withEmpty]))).toEqual(checkBoard(board([plain])));
  });

  it('several readings compared on one circuit, each at its own column', () => {
    const circuit = radial({ cells: { ...cleanRadialCells, irLiveLive: '20', irLiveEarth: '15', zs: '0.90' }, previous: cells({ irLiveLive: '>200', irLiveEarth: '>200', zs: '0.62' }) });
    const notes = sinceLastTime(checkBoard(board([circuit], { board: { zdbOhm: null } })));
    expect(notes.map((n) => `${n.code}:${n.columns.join(',')}`).sort()).toEqual([
      'ir-fallen-since-last-time:irLiveEarth',
      'ir-fallen-since-last-time:irLiveLive',
      'zs-risen-since-last-time:zs',
    ]);
  });

  it('the caching checker gives the same notes as checkBoard', () => {
    const circuits = [
      radial({ id: 1, number: '1', cells: { ...cleanRadialCells, zs: '0.90' }, previous: cells({ zs: '0.62' }) }),
      radial({ id: 2, number: '2', previous: cells({ irLiveEarth: '80', irLiveLive: '90' }), cells: { ...cleanRadialCells, irLiveEarth: '12' } }),
    ];
    const input = board(circuits);
    const checker = createBoardChecker();
    expect(checker(input)).toEqual(checkBoard(input));
    expect(checker(input)).toEqual(checkBoard(input));
  });
});
