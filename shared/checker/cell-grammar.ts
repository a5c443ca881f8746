/**
 * The cell grammar: what testers write in a reading cell, read into a typed value.
 *
 * - a number: `0.44`, `.44`, `44.`, optionally followed by the column's unit (`0.44Ω`, `500 V`);
 * - beyond the meter's range: `>200`, `>999` (also `≥200`, `>=200`);
 * - not applicable: `N/A` (also `na`, `n/a`);
 * - a limitation prevented the test: `LIM` (the reason is recorded with the cell);
 * - pass/fail columns: a tick (`✓ ✔ v y yes ok pass`) or a cross (`✗ ✘ x no fail`).
 *
 * Anything else is `invalid` with a message saying what to write instead. Parsing never throws.
 */

import { columnByKey, readingKeys, type ReadingKey } from '../schemas/columns.ts';

/** A cell's text read into a value. */
export type ParsedCell =
  | { kind: 'empty' }
  | { kind: 'number'; value: number }
  /** The meter showed over-range: the reading is more than `value` (the N in ">N"). */
  | { kind: 'over-range'; value: number }
  | { kind: 'na' }
  | { kind: 'lim' }
  | { kind: 'pass' }
  | { kind: 'fail' }
  | { kind: 'invalid'; message: string; problem: CellProblem };

/**
 * Why a cell is invalid: `format` (not a reading at all), `comma` (a comma for a point), `range`
 * (outside the column's plausible range), `test-voltage` (not 250/500/1000 V), `wrong-kind` (a number
 * in a tick column or a tick in a number column).
 */
export type CellProblem = 'format' | 'comma' | 'range' | 'test-voltage' | 'wrong-kind';

/** How a column's cells are read. */
export interface CellGrammar {
  label: string;
  unit: string | null;
  mode: 'reading' | 'pass-fail' | 'test-voltage' | 'any';
  /** Plausible range of a reading, inclusive. */
  min: number;
  max: number;
  /** Whether ">N" makes sense in the column. */
  overRange: boolean;
  /** Unit words accepted after a number, compared in lower case. */
  unitWords: readonly string[];
}

const OHM_WORDS = ['ω', 'Ω', 'ohm', 'ohms'].map((w) => w.toLowerCase());
const MEGOHM_WORDS = ['mω', 'meg', 'megs', 'megohm', 'megohms', 'mohm', 'mohms', 'm'];
const MS_WORDS = ['ms'];
const VOLT_WORDS = ['v', 'vdc', 'v dc'];

function reading(label: string, unit: string, max: number, unitWords: readonly string[]): CellGrammar {
  return { label, unit, mode: 'reading', min: 0, max, overRange: true, unitWords };
}

/** Plausible ranges: a reading outside them is almost certainly a slip of the keyboard. */
export const cellGrammars: Readonly<Record<ReadingKey, CellGrammar>> = {
  ringR1: reading('r1', 'Ω', 20, OHM_WORDS),
  ringRn: reading('rn', 'Ω', 20, OHM_WORDS),
  ringR2: reading('r2', 'Ω', 20, OHM_WORDS),
  r1PlusR2: reading('R1+R2', 'Ω', 20, OHM_WORDS),
  r2: reading('R2', 'Ω', 20, OHM_WORDS),
  irTestVoltage: { label: 'Test voltage', unit: 'V', mode: 'test-voltage', min: 250, max: 1000, overRange: false, unitWords: VOLT_WORDS },
  irLiveLive: reading('IR L-L', 'MΩ', 2000, MEGOHM_WORDS),
  irLiveEarth: reading('IR L-E', 'MΩ', 2000, MEGOHM_WORDS),
  polarity: { label: 'Polarity', unit: null, mode: 'pass-fail', min: 0, max: 0, overRange: false, unitWords: [] },
  // On TT the earth electrode is in the loop: hundreds of ohms are normal (a 30 mA RCD allows up to
  // 1667 Ω, 50 V / IΔn), so the ceiling is the meters' range, not a TN value.
  zs: reading('Zs', 'Ω', 2000, OHM_WORDS),
  rcdTimeMs: reading('RCD time', 'ms', 2000, MS_WORDS),
  rcdTime5Ms: reading('RCD time at 5 × IΔn', 'ms', 2000, MS_WORDS),
  rcdButton: { label: 'RCD button', unit: null, mode: 'pass-fail', min: 0, max: 0, overRange: false, unitWords: [] },
  afddButton: { label: 'AFDD button', unit: null, mode: 'pass-fail', min: 0, max: 0, overRange: false, unitWords: [] },
};

const ANY_COLUMN: CellGrammar = {
  label: 'This cell',
  unit: null,
  mode: 'any',
  min: Number.NEGATIVE_INFINITY,
  max: Number.POSITIVE_INFINITY,
  overRange: true,
  unitWords: [],
};

const TEST_VOLTAGES = new Set([250, 500, 1000]);
/** The words of the grammar (lower case, plus the usual capitals so most cells need no lowering). */
const WORDS = new Map<string, 'na' | 'lim' | 'pass' | 'fail'>();
for (const w of ['n/a', 'na', 'n.a.', 'n.a', 'N/A', 'NA']) WORDS.set(w, 'na');
for (const w of ['lim', 'LIM']) WORDS.set(w, 'lim');
for (const w of ['✓', '✔', '☑', 'v', 'y', 'yes', 'ok', 'pass', 'OK']) WORDS.set(w, 'pass');
for (const w of ['✗', '✘', '☒', 'x', 'no', 'fail', 'X']) WORDS.set(w, 'fail');

const EMPTY: ParsedCell = { kind: 'empty' };
const NA: ParsedCell = { kind: 'na' };
const LIM: ParsedCell = { kind: 'lim' };
const PASS: ParsedCell = { kind: 'pass' };
const FAIL: ParsedCell = { kind: 'fail' };

const readingKeySet: ReadonlySet<string> = new Set(readingKeys);

/** The grammar of a column key; unknown keys accept any reading without a range. */
export function grammarFor(column: ReadingKey | string): CellGrammar {
  return readingKeySet.has(column) ? cellGrammars[column as ReadingKey] : ANY_COLUMN;
}

function invalid(message: string, problem: CellProblem): ParsedCell {
  return { kind: 'invalid', message, problem };
}

function rangeText(g: CellGrammar): string {
  return `${g.min}–${g.max}${g.unit ? ` ${g.unit}` : ''}`;
}

/**
 * Reads a cell as typed into a value, or says what is wrong with it. Never throws.
 *
 * @param column the reading column (see columns.ts); any other string reads the cell without a
 *   plausible range.
 * @param text the cell text exactly as typed.
 */
export function parseCell(column: ReadingKey | string, text: string): ParsedCell {
  return parseWithGrammar(grammarFor(column), text);
}

/** `parseCell` for a column whose grammar is already at hand (the checker's inner loop). */
export function parseWithGrammar(grammar: CellGrammar, text: string): ParsedCell {
  if (typeof text !== 'string') return invalid('A reading must be text.', 'format');
  const length = text.length;
  if (length === 0) return EMPTY;
  // Trim only when there is white space at either end (most cells have none).
  const t = text.charCodeAt(0) <= 32 || text.charCodeAt(length - 1) <= 32 ? text.trim() : text;
  if (t.length === 0) return EMPTY;
  const first = t.charCodeAt(0);
  // Fast path: a number or ">N" (digits, point, comma, '>', '≥').
  if ((first >= 48 && first <= 57) || first === 46 || first === 44 || first === 62 || first === 0x2265) {
    return parseNumber(grammar, t);
  }
  // A lone dash is how paper schedules often mark "not done": say what to write instead.
  if (t.length === 1 && (first === 45 || first === 0x2212 || first === 0x2013 || first === 0x2014)) {
    return invalid('A dash is not a reading: write N/A if the test does not apply (or LIM, with its reason, if it could not be done).', 'format');
  }
  const word = WORDS.get(t) ?? WORDS.get(t.toLowerCase());
  if (word === 'na') return NA;
  if (word === 'lim') return LIM;
  const isPass = word === 'pass';
  const isFail = word === 'fail';
  if (grammar.mode === 'pass-fail' || grammar.mode === 'any') {
    if (isPass) return PASS;
    if (isFail) return FAIL;
  } else if (isPass || isFail) {
    return invalid(`${grammar.label} takes a number${example(grammar)}, not a ${isPass ? 'tick' : 'cross'}.`, 'wrong-kind');
  }
  if (grammar.mode === 'pass-fail') return passFailHelp(grammar, t);
  if (first === 45 || first === 0x2212) return invalid(`${grammar.label} cannot be negative: "${t}".`, 'range');
  if (first === 60 || first === 0x2264) {
    return invalid(`Write the value the meter shows (e.g. 0.01), not "${t}": only ">N" marks a reading beyond the meter's range.`, 'format');
  }
  return invalid(`"${t}" is not a reading: write a number${example(grammar)}, N/A or LIM.`, 'format');
}

function example(g: CellGrammar): string {
  switch (g.mode) {
    case 'test-voltage':
      return ' (250, 500 or 1000)';
    case 'reading':
      return g.unit === 'MΩ' ? ' such as 200 or >200' : g.unit === 'ms' ? ' such as 24' : ' such as 0.44';
    default:
      return ' such as 0.44';
  }
}

function passFailHelp(g: CellGrammar, t: string): ParsedCell {
  return invalid(`${g.label}: write ✓ (or ok) when confirmed, ✗ (or x) when not, N/A or LIM — not "${t}".`, 'format');
}

function parseNumber(g: CellGrammar, t: string): ParsedCell {
  let i = 0;
  let over = false;
  const n = t.length;
  const c0 = t.charCodeAt(0);
  if (c0 === 62 /* > */) {
    over = true;
    i = 1;
    if (i < n && t.charCodeAt(i) === 61 /* = */) i++;
  } else if (c0 === 0x2265 /* ≥ */) {
    over = true;
    i = 1;
  }
  while (i < n && t.charCodeAt(i) === 32) i++;
  const start = i;
  let digits = 0;
  let points = 0;
  let commas = 0;
  let doublePoint = false;
  let previousWasPoint = false;
  for (; i < n; i++) {
    const c = t.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      digits++;
      previousWasPoint = false;
    } else if (c === 46) {
      points++;
      if (previousWasPoint) doublePoint = true;
      previousWasPoint = true;
    } else if (c === 44) {
      commas++;
      previousWasPoint = false;
    } else {
      break;
    }
  }
  const mantissa = start === 0 && i === n ? t : t.slice(start, i);
  const rest = i === n ? '' : t.slice(i).trim();
  if (digits > 0 && commas === 0 && points <= 1 && rest === '' && g.mode === 'reading') {
    // The common case: a plain reading, or ">N", inside the column's range.
    const value = Number(mantissa);
    if (value >= g.min && value <= g.max) return over ? { kind: 'over-range', value } : { kind: 'number', value };
  }

  if (g.mode === 'pass-fail') {
    if (digits > 0) return invalid(`${g.label} takes a tick (✓) or a cross (✗), not a number.`, 'wrong-kind');
    return passFailHelp(g, t);
  }
  if (digits === 0) {
    if (over && mantissa === '' && rest === '') return invalid(`">" needs the meter's range after it, e.g. >200.`, 'format');
    return invalid(`"${t}" is not a reading: write a number${example(g)}, N/A or LIM.`, 'format');
  }
  if (commas > 0) {
    if (commas === 1 && points === 0) {
      const [whole = '', fraction = ''] = mantissa.split(',');
      if (fraction.length === 3 && whole.length >= 1 && whole.length <= 3) {
        return invalid(`Use a point, not a comma, and no thousands separator: ${whole}${fraction} or ${whole}.${fraction}?`, 'comma');
      }
      return invalid(`Use a point, not a comma: ${t.replace(',', '.')}.`, 'comma');
    }
    return invalid('Use a point, not a comma.', 'comma');
  }
  if (doublePoint) {
    return invalid(`Two points in "${t}": did you mean ${t.replace(/\.{2,}/, '.')}?`, 'format');
  }
  if (points > 1) return invalid(`More than one point in "${t}".`, 'format');
  if (rest !== '' && !g.unitWords.includes(rest.toLowerCase())) {
    return invalid(`"${t}" is not a reading: unexpected "${rest}" after the number${g.unit ? ` (the column is in ${g.unit})` : ''}.`, 'format');
  }
  const value = Number(mantissa);
  if (!Number.isFinite(value)) return invalid(`"${t}" is too long to be a reading.`, 'format');
  if (g.mode === 'test-voltage') {
    if (over) return invalid('The test voltage is a setting, not a reading: write 250, 500 or 1000.', 'test-voltage');
    if (!TEST_VOLTAGES.has(value)) {
      return invalid(`Insulation test voltage ${mantissa} V: Table 64 uses 250, 500 or 1000 V DC.`, 'test-voltage');
    }
    return { kind: 'number', value };
  }
  if (value < g.min || value > g.max) {
    const shown = `${over ? '>' : ''}${mantissa}${g.unit ? ` ${g.unit}` : ''}`;
    const hint = !over && g.overRange ? ` (write >${g.max} if the meter shows over-range)` : '';
    return invalid(`${g.label} ${shown} is outside the plausible range ${rangeText(g)}: check the reading${hint}.`, 'range');
  }
  if (over && !g.overRange) return invalid(`${g.label} does not take ">N".`, 'format');
  return over ? { kind: 'over-range', value } : { kind: 'number', value };
}

/** Whether a parsed cell holds a reading that satisfies a required column (a value, a tick, or LIM). */
export function isRecorded(cell: ParsedCell): boolean {
  return cell.kind !== 'empty' && cell.kind !== 'na' && cell.kind !== 'invalid';
}

/** The number in a cell (`0.44` → 0.44, `>200` → 200), or null. */
export function cellNumber(cell: ParsedCell): number | null {
  return cell.kind === 'number' || cell.kind === 'over-range' ? cell.value : null;
}

/** The plausible range of a column as text, e.g. "0–200 Ω". */
export function plausibleRange(column: ReadingKey): string {
  const g = cellGrammars[column];
  return g.mode === 'test-voltage' ? '250, 500 or 1000 V' : rangeText(g);
}

/** The column's label as the trade writes it (r1, R1+R2, Zs…). */
export function columnLabel(column: ReadingKey): string {
  return columnByKey[column].label;
}
