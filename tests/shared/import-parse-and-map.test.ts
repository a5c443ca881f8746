import { describe, expect, it } from 'vitest';
import type { Circuit } from '../../shared/schemas/boards.ts';
import { proposeMapping } from '../../shared/import/map-columns.ts';
import { canonicalCircuit, normaliseImported, planImport, writesFor } from '../../shared/import/plan-import.ts';
import { decodeText, readTable } from '../../shared/import/read-table.ts';
import { encodeWindows1252, inventRows, makeReadingsFile, type FileStyle } from '../helpers/instrument-files.ts';

/** Circuits of a three-phase board numbered as the trade numbers them per phase (common practice: 1L1, 1L2, 1L3, 2L1 …). */
function threePhaseCircuits(ways: number): Circuit[] {
  const out: Circuit[] = [];
  for (let w = 1; w <= ways; w++) {
    for (const p of ['L1', 'L2', 'L3'] as const) out.push({ id: out.length + 1, number: `${w}${p}`, phase: p, cells: {} } as unknown as Circuit);
  }
  return out;
}

const expectedTargets = ['circuit', 'r1PlusR2', 'irLiveEarth', 'irLiveLive', 'irTestVoltage', 'zs', 'rcdTimeMs', 'polarity', 'ignore'];

const styles: FileStyle[] = [];
for (const separator of [',', ';', '\t'] as const) {
  for (const encoding of ['utf-8', 'windows-1252'] as const) {
    for (const units of ['header', 'values'] as const) {
      for (const numbering of ['number-phase', 'phase-number'] as const) {
        styles.push({ separator, encoding, units, numbering, decimalComma: separator === ';', preamble: units === 'values' });
      }
    }
  }
}

describe('reading and mapping generated instrument-like files', () => {
  it.each(styles)('when a file is %o, then it is read, mapped and matched by number, and every value is normalised as typed', (style) => {
    const rows = inventRows(24, 'three-phase');
    const bytes = makeReadingsFile(rows, style);
    const result = readTable(bytes, 'readings.csv');
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    const { table } = result;
    // Which encoding: every generated file has "°C" in its header, so it is never plain ASCII.
    expect(table.encoding).toBe(style.encoding);
    expect(table.delimiter).toBe(style.separator);
    expect(table.decimalComma).toBe(style.separator === ';');
    expect(table.rows).toHaveLength(24);
    expect(proposeMapping(table).map((p) => p.target)).toEqual(expectedTargets);

    const plan = planImport(table, expectedTargets as never, threePhaseCircuits(8));
    expect(plan.by).toBe('number');
    expect(plan.unmatched).toEqual([]);
    expect(plan.counts.new).toBe(24 * 7);
    const at = (circuit: string, column: string) => plan.cells.find((c) => c.circuitNumber === circuit && c.column === column)?.incoming;
    // Row 0 (1L1): R1+R2 0.21, IR L-E >299, L-N >299, 500 V, Zs 0.41, 18 ms, PASS → ✓ (the console's tick).
    expect([at('1L1', 'r1PlusR2'), at('1L1', 'irLiveEarth'), at('1L1', 'irLiveLive'), at('1L1', 'irTestVoltage'), at('1L1', 'zs'), at('1L1', 'rcdTimeMs'), at('1L1', 'polarity')]).toEqual([
      '0.21', '>299', '>299', '500', '0.41', '18', '✓',
    ]);
    // Row 7 (3L2): R1+R2 0.21 + 7 × 0.03 = 0.42; Zs 0.41 + 7 × 0.04 = 0.69; 25 ms; IR L-E 127.
    expect([at('3L2', 'r1PlusR2'), at('3L2', 'zs'), at('3L2', 'rcdTimeMs'), at('3L2', 'irLiveEarth')]).toEqual(['0.42', '0.69', '25', '127']);
    expect(writesFor(plan, { byColumn: {}, byCell: {} })).toHaveLength(24 * 7);
  });

  it('when the same text is encoded as Windows-1252, then the decoded text equals what the WHATWG decoder in Node makes of it', () => {
    // Oracle: the WHATWG Encoding Standard's windows-1252 index as implemented by Node's TextDecoder
    // (0xB0 is °, 0xB5 is µ, 0xB2 is ²).
    const bytes = encodeWindows1252('Temp °C;µs;mm²\r\n');
    const decoded = decodeText(bytes);
    expect(decoded.ok && decoded.encoding).toBe('windows-1252');
    expect(decoded.ok && decoded.text).toBe(new TextDecoder('windows-1252').decode(bytes));
    expect([...bytes.subarray(5, 6)]).toEqual([0xb0]);
  });

  it.each([
    ['3L2', '3l2'],
    ['3 L2', '3l2'],
    ['L2-3', '3l2'],
    ['L2/3', '3l2'],
    ['l2.03', '3l2'],
    ['C3L2', '3l2'],
    ['C07', '7'],
    ['way 7', '7'],
    ['07', '7'],
    ['4a', '4a'],
  ])('when a file names circuit %s, then it is read as %s (three-phase numbering per phase, common practice)', (written, canonical) => {
    expect(canonicalCircuit(written)).toBe(canonical);
  });

  // Unit prefixes: milli = 10⁻³, kilo = 10³, mega = 10⁶, giga = 10⁹ (BIPM, The International System of Units, 9th ed., Table 7).
  it.each([
    ['zs', '0.43 Ω', false, '0.43'],
    ['zs', '0.43Ω', false, '0.43'],
    ['zs', '430 mΩ', false, '0.43'],
    ['zs', '0,43 Ω', true, '0.43'],
    ['zs', '.43', false, '0.43'],
    ['irLiveEarth', '>299 MΩ', false, '>299'],
    ['irLiveEarth', '1.2 GΩ', false, '1200'],
    ['irLiveEarth', '950 kΩ', false, '0.95'],
    ['rcdTimeMs', '28 ms', false, '28'],
    ['rcdTimeMs', '0.028 s', false, '28'],
    ['irTestVoltage', '500V', false, '500'],
    ['polarity', 'PASS', false, '✓'],
    ['polarity', 'fail', false, '✗'],
    ['zs', 'n/a', false, 'N/A'],
    ['zs', '---', false, ''],
  ] as const)('when %s holds "%s" (decimal comma: %s), then it is stored as "%s"', (column, raw, decimalComma, stored) => {
    expect(normaliseImported(column, raw, { decimalComma }).text).toBe(stored);
  });

  it.each([['zs', '28 ms'], ['zs', '0.4 MΩ'], ['rcdTimeMs', '0.4 Ω']] as const)('when %s holds "%s", a unit that does not fit, then the text is kept as written so the checker flags it', (column, raw) => {
    const value = normaliseImported(column, raw, { decimalComma: false });
    expect(value.text).toBe(raw);
    expect(value.note).toMatch(/does not fit/);
  });

  it('when the header writes lower-case r1, rn, r2 and upper-case R2, then the ring ends and the long-lead R2 are told apart (common practice)', () => {
    const table = { headers: ['Way', 'r1', 'rn', 'r2', 'R2', 'Zs'], rows: [['1', '0.52', '0.52', '0.86', '', '0.7']] };
    expect(proposeMapping(table).map((p) => p.target)).toEqual(['circuit', 'ringR1', 'ringRn', 'ringR2', 'r2', 'zs']);
  });

  it('when no column names the circuit, then rows are matched by order and rows beyond the board are listed', () => {
    const table = { headers: ['Zs', 'RCD ms'], rows: [['0.5', '20'], ['0.6', '21'], ['0.7', '22']], decimalComma: false };
    const plan = planImport(table, ['zs', 'rcdTimeMs'], threePhaseCircuits(1).slice(0, 2));
    expect(plan.by).toBe('order');
    expect(plan.unmatched).toEqual([{ row: 3, circuit: '', reason: 'the board has only 2 circuits' }]);
  });

  it('when a row names a circuit the board lacks, or names one twice, then it is listed and not dropped silently', () => {
    const table = { headers: ['Circuit', 'Zs'], rows: [['1L1', '0.5'], ['9L3', '0.6'], ['L1-1', '0.7'], ['', '0.8']], decimalComma: false };
    const plan = planImport(table, ['circuit', 'zs'], threePhaseCircuits(2));
    expect(plan.cells.map((c) => [c.circuitNumber, c.incoming])).toEqual([['1L1', '0.5']]);
    expect(plan.unmatched.map((u) => u.row)).toEqual([2, 3, 4]);
    expect(plan.unmatched[1]!.reason).toMatch(/already given by row 1/);
  });

  it('when a cell holds another value, then it is a conflict, written only when the file is taken', () => {
    const circuits = threePhaseCircuits(1);
    circuits[0]!.cells = { zs: { text: '0.44', reason: null, version: 3, updatedBy: null, updatedAt: '' } };
    const table = { headers: ['Circuit', 'Zs'], rows: [['1L1', '0.47'], ['1L2', '0.5']], decimalComma: false };
    const plan = planImport(table, ['circuit', 'zs'], circuits);
    expect(plan.counts).toEqual({ new: 1, same: 0, conflict: 1, blank: 0 });
    expect(writesFor(plan, { byColumn: {}, byCell: {} })).toHaveLength(1);
    const taken = writesFor(plan, { byColumn: { zs: 'take' }, byCell: {} });
    expect(taken.find((w) => w.circuitId === 1)).toEqual({ circuitId: 1, column: 'zs', text: '0.47', reason: null, version: 3 });
    expect(writesFor(plan, { byColumn: { zs: 'take' }, byCell: { '1:zs': 'keep' } })).toHaveLength(1);
  });
});

describe('files that are not readings files', () => {
  it.each([
    ['empty', Buffer.alloc(0), 'empty'],
    ['blank lines only', Buffer.from('\r\n\r\n  \r\n'), 'empty'],
    ['a PNG picture', Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]), 'not-text'],
    ['UTF-16 text', Buffer.from([0xff, 0xfe, 0x5a, 0x00, 0x73, 0x00]), 'unknown-encoding'],
    ['neither UTF-8 nor Windows-1252', Buffer.from([0x5a, 0x73, 0x3b, 0x81, 0x9d, 0x0d, 0x0a]), 'unknown-encoding'],
    ['a letter in prose', Buffer.from('Dear client, the readings will follow next week. Regards\n'), 'no-table'],
    ['numbers without a header', Buffer.from('1,0.43,22\n2,0.51,19\n'), 'no-table'],
    ['a header and no rows', Buffer.from('Circuit,Zs,RCD ms\n'), 'empty'],
  ])('when the file is %s, then it is refused in words', (_what, bytes, code) => {
    const result = readTable(bytes, 'x.csv');
    expect(result.ok).toBe(false);
    if (!result.ok) {
      expect(result.refusal.code).toBe(code);
      expect(result.refusal.message.length).toBeGreaterThan(30);
    }
  });
});
