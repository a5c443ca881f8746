/**
 * Instrument-like readings files generated for the tests: invented layouts (column names, units,
 * separators, encodings, circuit numbering) of our own, varied the way exported files vary. They
 * model no maker's format.
 */

export interface GeneratedRow {
  circuit: string;
  zs?: string;
  r1PlusR2?: string;
  irLiveEarth?: string;
  irLiveLive?: string;
  testV?: string;
  rcdMs?: string;
  polarity?: string;
}

export interface FileStyle {
  separator: ',' | ';' | '\t';
  encoding: 'utf-8' | 'windows-1252';
  /** Units in the header ("Zs (Ω)") or after each value ("0.43 Ω"). */
  units: 'header' | 'values';
  /** How three-phase circuits are written: as the board does ("3L2") or phase first ("L2-3"). */
  numbering: 'number-phase' | 'phase-number';
  decimalComma?: boolean;
  /** Lines of the instrument's own before the header (serial number, date). */
  preamble?: boolean;
  /** Write a UTF-8 byte-order mark first. */
  bom?: boolean;
}

/** Windows-1252 bytes of a text whose characters all exist in that code page (Latin-1 range here). */
export function encodeWindows1252(text: string): Buffer {
  const bytes: number[] = [];
  for (const ch of text) {
    const code = ch.codePointAt(0)!;
    if (code > 0xff || (code >= 0x80 && code < 0xa0)) throw new Error(`"${ch}" is not written in this test's Windows-1252 range`);
    bytes.push(code);
  }
  return Buffer.from(bytes);
}

function renumber(circuit: string, numbering: FileStyle['numbering']): string {
  const m = /^(\d+)(L[123])$/i.exec(circuit);
  if (!m || numbering === 'number-phase') return circuit;
  return `${m[2]!.toUpperCase()}-${m[1]}`;
}

/** Builds a readings file of the given style. */
export function makeReadingsFile(rows: readonly GeneratedRow[], style: FileStyle): Buffer {
  const ohm = style.encoding === 'windows-1252' ? 'Ohm' : 'Ω';
  const megohm = style.encoding === 'windows-1252' ? 'MOhm' : 'MΩ';
  const u = (value: string | undefined, unit: string) => {
    if (value === undefined || value === '') return '';
    const v = style.decimalComma ? value.replace('.', ',') : value;
    return style.units === 'values' && /\d/.test(v) ? `${v} ${unit}` : v;
  };
  const h = (name: string, unit: string) => (style.units === 'header' ? `${name} (${unit})` : name);
  const header = ['Circuit', h('R1+R2', ohm), h('Insulation L-E', megohm), h('Insulation L-N', megohm), h('Test voltage', 'V'), h('Loop Zs', ohm), h('RCD trip time', 'ms'), 'Polarity', 'Ambient °C'];
  const lines: string[][] = [header];
  for (const r of rows) {
    lines.push([
      renumber(r.circuit, style.numbering),
      u(r.r1PlusR2, ohm),
      u(r.irLiveEarth, megohm),
      u(r.irLiveLive, megohm),
      u(r.testV, 'V'),
      u(r.zs, ohm),
      u(r.rcdMs, 'ms'),
      r.polarity ?? '',
      '21',
    ]);
  }
  const quote = (cell: string) => (cell.includes(style.separator) || cell.includes('"') ? `"${cell.replace(/"/g, '""')}"` : cell);
  let text = lines.map((l) => l.map(quote).join(style.separator)).join('\r\n') + '\r\n';
  if (style.preamble) {
    const pre = [`Readings export${style.separator}Ambient 21 °C`, `Serial${style.separator}TX-40213`, `Date${style.separator}2026-11-30`, ''].join('\r\n');
    text = `${pre}\r\n${text}`;
  }
  if (style.encoding === 'windows-1252') return encodeWindows1252(text);
  const bytes = Buffer.from(text, 'utf8');
  return style.bom ? Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), bytes]) : bytes;
}

/** Invented readings for `count` circuits, numbered as a three-phase board numbers them (1L1, 1L2, 1L3, 2L1…) or plainly. */
export function inventRows(count: number, numbering: 'three-phase' | 'plain', start = 0): GeneratedRow[] {
  const rows: GeneratedRow[] = [];
  for (let i = start; i < start + count; i++) {
    const circuit = numbering === 'three-phase' ? `${Math.floor(i / 3) + 1}L${(i % 3) + 1}` : String(i + 1);
    rows.push({
      circuit,
      r1PlusR2: (0.21 + (i % 17) * 0.03).toFixed(2),
      irLiveEarth: i % 4 === 0 ? '>299' : String(120 + (i % 50)),
      irLiveLive: i % 5 === 0 ? '>299' : String(150 + (i % 40)),
      testV: '500',
      zs: (0.41 + (i % 13) * 0.04).toFixed(2),
      rcdMs: String(18 + (i % 11)),
      polarity: 'PASS',
    });
  }
  return rows;
}
