/**
 * The columns of a schedule of test results, in the order the console shows them.
 *
 * Two kinds of column live side by side in the grid:
 * - `detail` columns are fields of the circuit row (what the circuit *is*: cable, device, RCD);
 *   they are written with `PATCH /api/boards/:boardId/circuits/:circuitId`.
 * - `reading` columns are test results, one database row per cell, written with
 *   `PUT /api/boards/:boardId/circuits/:circuitId/cells/:column`.
 *
 * Labels use the trade's own terms (r1, rn, r2, R1+R2, Zs, IΔn); keys spell them readably.
 */

export const columnGroups = [
  { id: 'circuit', label: 'Circuit details' },
  { id: 'device', label: 'Protective device' },
  { id: 'continuity', label: 'Continuity' },
  { id: 'insulation', label: 'Insulation' },
  { id: 'loop', label: 'Loop impedance' },
  { id: 'rcd', label: 'RCD / AFDD' },
  { id: 'remarks', label: 'Remarks' },
] as const;

export type ColumnGroupId = (typeof columnGroups)[number]['id'];

export const readingKeys = [
  'ringR1',
  'ringRn',
  'ringR2',
  'r1PlusR2',
  'r2',
  'irTestVoltage',
  'irLiveLive',
  'irLiveEarth',
  'polarity',
  'zs',
  'rcdTimeMs',
  'rcdTime5Ms',
  'rcdButton',
  'afddButton',
] as const;

/** A reading column: stored as text exactly as the tester typed it. */
export type ReadingKey = (typeof readingKeys)[number];

/**
 * Reading columns of optional tests (the RCD at 5 × IΔn since BS 7671:2018+A2): checked when
 * written, never required, and not counted among the cells a board has to fill.
 */
export const optionalReadingKeys: readonly ReadingKey[] = ['rcdTime5Ms'];

export const detailKeys = [
  'description',
  'kind',
  'wiringType',
  'referenceMethod',
  'points',
  'liveCsaMm2',
  'cpcCsaMm2',
  'maxDisconnectionS',
  'cableLengthM',
  'deviceStandard',
  'deviceType',
  'ratingA',
  'breakingKa',
  'maxZsByHandOhm',
  'rcdType',
  'rcdRatedResidualMa',
  'afdd',
  'remarks',
] as const;

/** A circuit-detail column: a typed field of the circuit row. */
export type DetailKey = (typeof detailKeys)[number];

export type ColumnKey = ReadingKey | DetailKey;

/** How a column's text is read: drives the editor and the quick-entry line. */
export type ColumnValueKind = 'text' | 'number' | 'integer' | 'choice' | 'reading' | 'pass-fail';

export interface ColumnDef {
  key: ColumnKey;
  storage: 'detail' | 'reading';
  group: ColumnGroupId;
  /** Short header as the trade writes it. */
  label: string;
  /** One line saying what the column holds, shown in the status line and to screen readers. */
  meaning: string;
  valueKind: ColumnValueKind;
  /** Unit shown after the header, if any. */
  unit?: string;
  /** Allowed values for `choice` columns. */
  choices?: readonly string[];
  /** Words accepted for this column on the quick-entry line (lower case). */
  aliases: readonly string[];
  /** Suggested width in pixels. */
  width: number;
}

export const circuitKinds = ['ring', 'radial', 'spur', 'distribution'] as const;
export type CircuitKind = (typeof circuitKinds)[number];

export const rcdTypes = ['AC', 'A', 'F', 'B', 'S-AC', 'S-A'] as const;

export const columns: readonly ColumnDef[] = [
  { key: 'description', storage: 'detail', group: 'circuit', label: 'Description', meaning: 'What the circuit supplies', valueKind: 'text', aliases: ['desc', 'description'], width: 180 },
  { key: 'kind', storage: 'detail', group: 'circuit', label: 'Kind', meaning: 'Ring final, radial, spur or distribution circuit', valueKind: 'choice', choices: circuitKinds, aliases: ['kind'], width: 92 },
  { key: 'wiringType', storage: 'detail', group: 'circuit', label: 'Wiring', meaning: 'Type of wiring (letter code of the model forms)', valueKind: 'text', aliases: ['wiring', 'wt'], width: 64 },
  { key: 'referenceMethod', storage: 'detail', group: 'circuit', label: 'Ref. method', meaning: 'Installation reference method', valueKind: 'text', aliases: ['ref', 'method'], width: 72 },
  { key: 'points', storage: 'detail', group: 'circuit', label: 'Points', meaning: 'Number of points served', valueKind: 'integer', aliases: ['points', 'pts'], width: 60 },
  { key: 'liveCsaMm2', storage: 'detail', group: 'circuit', label: 'Live', unit: 'mm²', meaning: 'Cross-sectional area of the live conductors', valueKind: 'number', aliases: ['live', 'csa'], width: 60 },
  { key: 'cpcCsaMm2', storage: 'detail', group: 'circuit', label: 'cpc', unit: 'mm²', meaning: 'Cross-sectional area of the circuit protective conductor', valueKind: 'number', aliases: ['cpc'], width: 60 },
  { key: 'maxDisconnectionS', storage: 'detail', group: 'circuit', label: 'Max disc.', unit: 's', meaning: 'Maximum disconnection time permitted', valueKind: 'number', aliases: ['disc', 'time'], width: 70 },
  { key: 'cableLengthM', storage: 'detail', group: 'circuit', label: 'Length', unit: 'm', meaning: 'Length of the circuit cable, when known (a radial’s R1+R2 is checked against it)', valueKind: 'number', aliases: ['length', 'len', 'metres'], width: 60 },
  { key: 'deviceStandard', storage: 'detail', group: 'device', label: 'BS (EN)', meaning: 'Standard of the protective device, e.g. 60898, 61009, 88-2, 3036, 1362', valueKind: 'text', aliases: ['bs', 'standard'], width: 76 },
  { key: 'deviceType', storage: 'detail', group: 'device', label: 'Type', meaning: 'Device type: B, C, D for circuit-breakers; gG for BS 88-2 fuses', valueKind: 'text', aliases: ['type'], width: 52 },
  { key: 'ratingA', storage: 'detail', group: 'device', label: 'In', unit: 'A', meaning: 'Rated current of the protective device', valueKind: 'number', aliases: ['in', 'rating', 'amps'], width: 52 },
  { key: 'breakingKa', storage: 'detail', group: 'device', label: 'kA', meaning: 'Breaking capacity of the protective device', valueKind: 'number', aliases: ['ka', 'breaking'], width: 52 },
  { key: 'ringR1', storage: 'reading', group: 'continuity', label: 'r1', unit: 'Ω', meaning: 'Ring final: line conductor end to end', valueKind: 'reading', aliases: ['r1'], width: 60 },
  { key: 'ringRn', storage: 'reading', group: 'continuity', label: 'rn', unit: 'Ω', meaning: 'Ring final: neutral conductor end to end', valueKind: 'reading', aliases: ['rn'], width: 60 },
  { key: 'ringR2', storage: 'reading', group: 'continuity', label: 'r2', unit: 'Ω', meaning: 'Ring final: cpc end to end', valueKind: 'reading', aliases: ['r2'], width: 60 },
  { key: 'r1PlusR2', storage: 'reading', group: 'continuity', label: 'R1+R2', unit: 'Ω', meaning: 'Line plus cpc resistance at the farthest point', valueKind: 'reading', aliases: ['r1r2', 'r1+r2', 'rr', 'cont'], width: 66 },
  { key: 'r2', storage: 'reading', group: 'continuity', label: 'R2', unit: 'Ω', meaning: 'cpc resistance alone, measured with a long lead', valueKind: 'reading', aliases: ['wander', 'lead', 'bigr2'], width: 60 },
  { key: 'irTestVoltage', storage: 'reading', group: 'insulation', label: 'Test V', unit: 'V', meaning: 'Insulation resistance test voltage (250, 500 or 1000 V DC)', valueKind: 'reading', aliases: ['tv', 'testv', 'volts'], width: 60 },
  { key: 'irLiveLive', storage: 'reading', group: 'insulation', label: 'L-L', unit: 'MΩ', meaning: 'Insulation resistance between live conductors', valueKind: 'reading', aliases: ['ll', 'irll'], width: 60 },
  { key: 'irLiveEarth', storage: 'reading', group: 'insulation', label: 'L-E', unit: 'MΩ', meaning: 'Insulation resistance between live conductors and earth', valueKind: 'reading', aliases: ['ir', 'le', 'irle'], width: 60 },
  { key: 'polarity', storage: 'reading', group: 'insulation', label: 'Polarity', meaning: 'Polarity confirmed (✓) or wrong (✗)', valueKind: 'pass-fail', aliases: ['pol', 'polarity'], width: 64 },
  { key: 'zs', storage: 'reading', group: 'loop', label: 'Zs', unit: 'Ω', meaning: 'Maximum measured earth fault loop impedance', valueKind: 'reading', aliases: ['zs'], width: 60 },
  { key: 'maxZsByHandOhm', storage: 'detail', group: 'loop', label: 'Max Zs given', unit: 'Ω', meaning: 'Maximum Zs entered by hand for a device the published tables do not cover (e.g. from the maker’s data)', valueKind: 'number', aliases: ['maxzs', 'givenzs'], width: 72 },
  { key: 'rcdType', storage: 'detail', group: 'rcd', label: 'RCD type', meaning: 'RCD type (AC, A, F, B; S- for time-delayed); empty when none', valueKind: 'choice', choices: rcdTypes, aliases: ['rcdtype'], width: 70 },
  { key: 'rcdRatedResidualMa', storage: 'detail', group: 'rcd', label: 'IΔn', unit: 'mA', meaning: 'Rated residual operating current of the RCD', valueKind: 'number', aliases: ['idn', 'ma'], width: 56 },
  { key: 'rcdTimeMs', storage: 'reading', group: 'rcd', label: 'Time', unit: 'ms', meaning: 'RCD operating time at IΔn', valueKind: 'reading', aliases: ['rcd', 'trip', 'ms'], width: 60 },
  { key: 'rcdTime5Ms', storage: 'reading', group: 'rcd', label: 'Time 5×', unit: 'ms', meaning: 'RCD operating time at 5 × IΔn, where that optional test is made', valueKind: 'reading', aliases: ['rcd5', 'trip5', 'x5'], width: 60 },
  { key: 'rcdButton', storage: 'reading', group: 'rcd', label: 'RCD btn', meaning: 'RCD test button operates (✓/✗)', valueKind: 'pass-fail', aliases: ['rcdbtn', 'button'], width: 64 },
  { key: 'afdd', storage: 'detail', group: 'rcd', label: 'AFDD', meaning: 'Arc fault detection device fitted (yes / no)', valueKind: 'choice', choices: ['yes', 'no'], aliases: ['afdd'], width: 56 },
  { key: 'afddButton', storage: 'reading', group: 'rcd', label: 'AFDD btn', meaning: 'AFDD test button operates (✓/✗)', valueKind: 'pass-fail', aliases: ['afddbtn'], width: 68 },
  { key: 'remarks', storage: 'detail', group: 'remarks', label: 'Remarks', meaning: 'Remarks on the circuit', valueKind: 'text', aliases: ['remarks', 'note'], width: 200 },
];

export const columnByKey: Readonly<Record<ColumnKey, ColumnDef>> = Object.fromEntries(
  columns.map((c) => [c.key, c]),
) as Record<ColumnKey, ColumnDef>;

export function isReadingKey(key: string): key is ReadingKey {
  return (readingKeys as readonly string[]).includes(key);
}

export function isDetailKey(key: string): key is DetailKey {
  return (detailKeys as readonly string[]).includes(key);
}
