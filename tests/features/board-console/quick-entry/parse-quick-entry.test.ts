import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { columns, type ColumnKey } from '../../../../shared/schemas/columns.ts';
import {
  columnForWord,
  describeEntries,
  parseQuickEntry,
  previewCircuit,
  quickEntryKeysSection,
  quickEntryWordsSection,
  type QuickEntryContext,
} from '../../../../src/features/board-console/quick-entry/parse-quick-entry.ts';

/** A small three-phase board: single-phase ways 1–8, a three-phase way 9, and way 12 numbered with a letter. */
const circuits = [
  ...[1, 2, 3, 4, 5, 6, 7, 8].map((n) => ({ id: 100 + n, number: String(n) })),
  { id: 201, number: '9L1' },
  { id: 202, number: '9L2' },
  { id: 203, number: '9L3' },
  { id: 212, number: '12A' },
];
const ctx: QuickEntryContext = { circuits, activeColumn: 'zs' };

type Expected = Array<[number, ColumnKey, string]>;

const entriesOf = (input: string, context: QuickEntryContext = ctx) => {
  const result = parseQuickEntry(input, context);
  return result.ok ? result.entries.map((e) => [e.circuitId, e.column, e.text]) : result.message;
};

describe('parseQuickEntry: lines that write', () => {
  it.each<[string, Expected, ColumnKey?]>([
    // A value straight after the circuit goes to the active column, as typed.
    ['7 .44', [[107, 'zs', '.44']]],
    ['7 0.44', [[107, 'zs', '0.44']]],
    ['7 200', [[107, 'zs', '200']]],
    ['7 >200', [[107, 'irLiveEarth', '>200']], 'irLiveEarth'],
    ['7 N/A', [[107, 'zs', 'N/A']]],
    ['7 lim', [[107, 'zs', 'lim']]],
    ['7 ✓', [[107, 'polarity', '✓']], 'polarity'],
    ['7 v', [[107, 'polarity', 'v']], 'polarity'],
    ['7 x', [[107, 'polarity', 'x']], 'polarity'],
    // Column words: aliases, keys and compact labels, any case.
    [
      '7 zs .44 ir >200 rcd 23',
      [
        [107, 'zs', '.44'],
        [107, 'irLiveEarth', '>200'],
        [107, 'rcdTimeMs', '23'],
      ],
    ],
    ['7 ZS .44', [[107, 'zs', '.44']]],
    ['7 r1+r2 .38', [[107, 'r1PlusR2', '.38']]],
    ['7 R1PLUSR2 .38', [[107, 'r1PlusR2', '.38']]],
    ['7 l-e >200', [[107, 'irLiveEarth', '>200']]],
    ['7 r2 .9', [[107, 'ringR2', '.9']]],
    ['7 wander .9', [[107, 'r2', '.9']]],
    ['7 pol v rcdbtn x', [[107, 'polarity', 'v'], [107, 'rcdButton', 'x']]],
    // After a column word the next token is always the value, even a number that is also a circuit.
    ['7 zs 8', [[107, 'zs', '8']]],
    ['7 points 8 zs .44', [[107, 'points', '8'], [107, 'zs', '.44']]],
    // A circuit number after a value starts the next circuit.
    [
      '7 zs .44 8 zs .51',
      [
        [107, 'zs', '.44'],
        [108, 'zs', '.51'],
      ],
    ],
    [
      '7 .44 8 .51',
      [
        [107, 'zs', '.44'],
        [108, 'zs', '.51'],
      ],
    ],
    ['7 .44 ir >200', [[107, 'zs', '.44'], [107, 'irLiveEarth', '>200']]],
    // Three-phase ways, any case.
    ['9L2 .31', [[202, 'zs', '.31']]],
    ['9l2 zs .31 9l3 zs .33', [[202, 'zs', '.31'], [203, 'zs', '.33']]],
    ['12a .8', [[212, 'zs', '.8']]],
    // Quotes keep spaces; a quoted token is always a value.
    ['7 desc "kitchen sockets"', [[107, 'description', 'kitchen sockets']]],
    ['7 desc “kitchen sockets” zs .44', [[107, 'description', 'kitchen sockets'], [107, 'zs', '.44']]],
    ['7 "zs"', [[107, 'description', 'zs']], 'description'],
    // Text and choice columns take any word straight after the circuit.
    ['7 ring', [[107, 'kind', 'ring']], 'kind'],
    ['  7   zs   .44  ', [[107, 'zs', '.44']]],
  ])('%s', (input, expected, activeColumn) => {
    expect(entriesOf(input, activeColumn ? { circuits, activeColumn } : ctx)).toEqual(expected);
  });

  it('says which circuit and number each entry is for', () => {
    const result = parseQuickEntry('9l2 .31', ctx);
    expect(result).toEqual({ ok: true, entries: [{ circuitId: 202, circuitNumber: '9L2', column: 'zs', text: '.31' }] });
  });
});

describe('parseQuickEntry: mistakes, answered in words', () => {
  it.each<[string, string, ColumnKey?]>([
    ['', 'type a circuit and a value, e.g. 7 .44 or 7 zs .44'],
    ['   ', 'type a circuit and a value, e.g. 7 .44 or 7 zs .44'],
    ['17 .44', 'there is no circuit 17 on this board'],
    ['7 zs .44 17 zs .5', 'there is no circuit 17 on this board'],
    ['9 .44', 'circuit 9 is on three phases here: say 9L1, 9L2 or 9L3'],
    ['7 .44 9 .5', 'circuit 9 is on three phases here: say 9L1, 9L2 or 9L3'],
    ['7 zx .44', "'zx' is not a column; try zs, r1, rn, r2, …"],
    ['7 zs .44 zx .5', "'zx' is not a column; try zs, r1, rn, r2, …"],
    ['7 zs', 'zs needs a value'],
    ['7 .44 IR', 'IR needs a value'],
    ['7', 'circuit 7 needs a value: e.g. 7 .44 or 7 zs .44'],
    ['7 .44 8', 'circuit 8 needs a value: e.g. 8 .44 or 8 zs .44'],
    ['7 zs .44 zs .45', 'Zs is given twice for circuit 7'],
    ['7 .44 zs .45', 'Zs is given twice for circuit 7'],
    ['7 zs .44 8 .5 7 zs .46', 'Zs is given twice for circuit 7'],
    ['7 zs .44 .51', "'.51' has no column: say which, e.g. zs .51"],
    ['7 desc "kitchen sockets', 'a quote is not closed: end "kitchen sockets with another "'],
    ['7 desc "kitchen"sockets', 'put a space after "kitchen"'],
    ['7 desc ""', 'Description needs a value: "" is empty (to clear a cell, use Delete in the grid)'],
    ['7 .44 "kitchen"', '"kitchen" has no column: put a column word before it, e.g. desc "kitchen"'],
    ['zs 7 .44', 'say the circuit first, e.g. 7 zs .44'],
    ['"7" .44', '"7" is not a circuit: start with a circuit number, e.g. 7 zs .44'],
  ])('%j', (input, message, activeColumn) => {
    const result = parseQuickEntry(input, activeColumn ? { circuits, activeColumn } : ctx);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.message).toBe(message);
  });

  it('suggests quoting when words after a text value were meant as one value', () => {
    const result = parseQuickEntry('7 kitchen sockets', { circuits, activeColumn: 'description' });
    expect(result).toMatchObject({ ok: false, message: expect.stringContaining('put them in quotes: "kitchen sockets"') });
  });
});

describe('column words', () => {
  it('each word names one column: aliases first, then keys, then compact labels', () => {
    expect(columnForWord('r2')).toBe('ringR2');
    expect(columnForWord('time')).toBe('maxDisconnectionS');
    expect(columnForWord('rcdtimems')).toBe('rcdTimeMs');
    expect(columnForWord('L-L')).toBe('irLiveLive');
    expect(columnForWord('v')).toBeUndefined();
    expect(columnForWord('lim')).toBeUndefined();
  });

  it('no alias is claimed by two columns', () => {
    const aliases = columns.flatMap((c) => c.aliases.map((a) => a.toLowerCase()));
    expect(aliases.length).toBe(new Set(aliases).size);
  });

  it('lists the words and the keys of the line for the keys overlay', () => {
    const section = quickEntryWordsSection();
    expect(section.rows).toContainEqual({ label: 'Zs (Ω): Maximum measured earth fault loop impedance', words: ['zs'] });
    // The R2 column's key is taken by ring r2's alias: the overlay offers only words that reach it.
    expect(section.rows).toContainEqual({ label: 'R2 (Ω): cpc resistance alone, measured with a long lead', words: ['wander', 'lead', 'bigr2'] });
    expect(quickEntryKeysSection().rows).toContainEqual({ label: 'Undo the last entry (on an empty line)', keys: ['$mod+z'] });
  });
});

describe('describeEntries and previewCircuit', () => {
  it('says what went where, circuit by circuit', () => {
    const result = parseQuickEntry('7 zs .44 ir >200 desc "kitchen sockets" 8 zs .51', ctx);
    expect(result.ok && describeEntries(result.entries)).toBe(
      'Wrote Zs .44, L-E >200, Description “kitchen sockets” to circuit 7; Zs .51 to circuit 8',
    );
  });

  it('follows the circuit a half-typed line is heading for', () => {
    expect(previewCircuit('7 zs .44 8', ctx)?.number).toBe('8');
    expect(previewCircuit('7 zs', ctx)?.number).toBe('7');
    expect(previewCircuit('9l3', ctx)?.number).toBe('9L3');
    expect(previewCircuit('17', ctx)).toBeUndefined();
  });
});

describe('parseQuickEntry never throws', () => {
  const token = fc.oneof(
    fc.constantFrom('7', '8', '9', '9L2', '9l3', '12A', '17', 'zs', 'ir', 'r1+r2', 'desc', 'zx', '.44', '>200', 'N/A', 'LIM', '✓', 'v', 'x', '"', '“', '”', '""', ' '),
    fc.string({ maxLength: 6 }),
    fc.string({ unit: 'grapheme', maxLength: 4 }),
  );
  const line = fc.oneof(fc.string({ maxLength: 40 }), fc.array(token, { maxLength: 12 }).map((parts) => parts.join(' ')));
  const board = fc.array(fc.record({ id: fc.integer(), number: fc.string({ maxLength: 5 }) }), { maxLength: 8 });

  it('for any line, board and active column, and an ok result always holds entries of known circuits', () => {
    fc.assert(
      fc.property(line, board, fc.constantFrom(...columns.map((c) => c.key)), (input, someCircuits, activeColumn) => {
        const context = { circuits: [...circuits, ...someCircuits], activeColumn };
        const result = parseQuickEntry(input, context);
        previewCircuit(input, context);
        if (result.ok) {
          expect(result.entries.length).toBeGreaterThan(0);
          expect(describeEntries(result.entries)).toMatch(/^Wrote /);
          for (const entry of result.entries) {
            expect(context.circuits.some((c) => c.id === entry.circuitId)).toBe(true);
            expect(entry.text.trim()).not.toBe('');
          }
        } else {
          expect(result.message.length).toBeGreaterThan(0);
        }
      }),
      { numRuns: 2000 },
    );
  });
});
