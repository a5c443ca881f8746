/**
 * From a read table and its mapping to a plan of writes: values normalised as typed ones are
 * (units stripped, scaled to the column's unit, short forms spelt out), rows matched to circuits
 * by number (three-phase forms `3L2`, `L2-3` understood) or else by order, unmatched rows listed,
 * and a preview per circuit and column (value now, value from the file, conflict or not) with the
 * checker's findings as they would be after the import. Pure.
 */
import { checkBoard } from '../checker/index.ts';
import { boardToCheckInput } from '../schemas/check.ts';
import { columnByKey, isReadingKey, type ReadingKey } from '../schemas/columns.ts';
import type { BoardDetail, Circuit } from '../schemas/boards.ts';
import type { Finding } from '../schemas/findings.ts';
import type { BatchWrite, ImportTable, ImportTarget } from '../schemas/import.ts';
import { normaliseReading } from '../readings/normalise-reading.ts';

// ---- values -------------------------------------------------------------------------------

/** Unit words by the column's own unit, each with the factor that brings it to that unit. */
const unitFactors: Record<string, Record<string, number>> = {
  'Ω': { 'ω': 1, ohm: 1, ohms: 1, r: 1, 'mω': 0.001, mohm: 0.001, 'kω': 1000, kohm: 1000 },
  'MΩ': { 'mω': 1, mohm: 1, megohm: 1, megohms: 1, meg: 1, megs: 1, m: 1, 'kω': 0.001, kohm: 0.001, 'gω': 1000, gohm: 1000 },
  ms: { ms: 1, s: 1000, sec: 1000 },
  V: { v: 1, vdc: 1, 'v dc': 1, kv: 1000 },
};

export interface ImportedValue {
  /** The text to store ('' when the file has no value there). */
  text: string;
  /** What was done to the file's text on the way, in words (unit stripped, scaled…). */
  note: string | null;
}

/** Decimal scaling without binary noise (0.028 s → 28 ms, not 28.000000000000004). */
function scale(numberText: string, factor: number): string {
  if (factor === 1) return numberText;
  const value = Number(numberText) * factor;
  return String(Number(value.toPrecision(12)));
}

/**
 * A value from the file as the column stores it. In a pass/fail column the words pass/fail/ok are
 * read as the trade's tick and cross. A dash means "not measured" and imports nothing.
 */
export function normaliseImported(column: ReadingKey, raw: string, options: { decimalComma: boolean }): ImportedValue {
  let t = raw.trim().replace(/\u2126/g, 'Ω');
  if (t === '' || /^-+$/.test(t)) return { text: '', note: t === '' ? null : 'a dash in the file: nothing imported' };
  const notes: string[] = [];
  if (options.decimalComma && /^[<>≥]?=?\s*\d*,\d+/.test(t)) {
    t = t.replace(',', '.');
    notes.push('decimal comma read as a point');
  }
  const unit = columnByKey[column].unit;
  const m = /^([<>≥]=?)?\s*(\d+(?:\.\d*)?|\.\d+)\s*([a-zA-ZΩµ][a-zA-ZΩµ ]*)?$/.exec(t);
  if (m && unit) {
    const [, over = '', num = '', word = ''] = m;
    const w = word.trim().toLowerCase();
    let factor = 1;
    if (w !== '') {
      // "mΩ" is milli, "MΩ" mega: in an ohms column a capital M does not fit (a megohm Zs is a slip).
      const megaInOhms = unit === 'Ω' && word.trim().startsWith('M');
      const f = megaInOhms ? undefined : unitFactors[unit]?.[w];
      if (f === undefined) {
        return { text: t, note: `the unit "${word.trim()}" does not fit ${columnByKey[column].label} (${unit}); kept as written` };
      }
      factor = f;
      notes.push(factor === 1 ? `unit ${word.trim()} dropped` : `${num} ${word.trim()} written as ${scale(num, factor)} ${unit}`);
    }
    t = `${over.replace('>=', '>').replace('≥', '>')}${scale(num, factor)}`;
  }
  const text = normaliseReading(column, t);
  return { text, note: notes.length > 0 ? notes.join('; ') : null };
}

// ---- circuits -------------------------------------------------------------------------------

/**
 * A circuit number in one spelling: "3L2", "3 L2", "C3L2", "L2-3", "L2/3", "L2.3" → "3l2";
 * "C07", "way 7", "07" → "7"; "4a" → "4a".
 */
export function canonicalCircuit(text: string): string {
  const t = text.trim().toLowerCase().replace(/\s+/g, '');
  let m = /^(?:c|cct|ckt|circuit|way|no\.?)?0*(\d+)(l[123])$/.exec(t);
  if (m) return `${m[1]}${m[2]}`;
  m = /^(l[123])[-/.:]?0*(\d+)$/.exec(t);
  if (m) return `${m[2]}${m[1]}`;
  m = /^(?:c|cct|ckt|circuit|way|no\.?)?0*(\d+)([a-z]?)$/.exec(t);
  if (m) return `${m[1]}${m[2]}`;
  return t;
}

export interface UnmatchedRow {
  /** 1-based row of the table (below the header). */
  row: number;
  /** The circuit as the file names it (empty when the row names none). */
  circuit: string;
  reason: string;
}

export interface RowMatch {
  row: number;
  circuitId: number;
}

/** Matches rows to circuits by number where a column is the circuit number, else by order. */
export function matchRows(
  table: Pick<ImportTable, 'rows'>,
  targets: readonly ImportTarget[],
  circuits: readonly Pick<Circuit, 'id' | 'number' | 'phase'>[],
): { by: 'number' | 'order'; matches: RowMatch[]; unmatched: UnmatchedRow[] } {
  const numberColumn = targets.indexOf('circuit');
  const matches: RowMatch[] = [];
  const unmatched: UnmatchedRow[] = [];
  if (numberColumn === -1) {
    table.rows.forEach((_, i) => {
      const circuit = circuits[i];
      if (circuit) matches.push({ row: i + 1, circuitId: circuit.id });
      else unmatched.push({ row: i + 1, circuit: '', reason: `the board has only ${circuits.length} circuits` });
    });
    return { by: 'order', matches, unmatched };
  }
  const byNumber = new Map<string, number>();
  for (const c of circuits) {
    byNumber.set(canonicalCircuit(c.number), c.id);
    // A way numbered "3" on phase L2 is also "3L2" to a file that writes it so.
    if (c.phase && c.phase !== 'TP' && /^\d+$/.test(c.number.trim())) {
      const alias = `${Number(c.number)}${c.phase.toLowerCase()}`;
      if (!byNumber.has(alias)) byNumber.set(alias, c.id);
    }
  }
  const seen = new Map<number, number>();
  table.rows.forEach((r, i) => {
    const raw = (r[numberColumn] ?? '').trim();
    if (raw === '') {
      unmatched.push({ row: i + 1, circuit: '', reason: 'the row names no circuit' });
      return;
    }
    const id = byNumber.get(canonicalCircuit(raw));
    if (id === undefined) {
      unmatched.push({ row: i + 1, circuit: raw, reason: `there is no circuit ${raw} on this board` });
      return;
    }
    const earlier = seen.get(id);
    if (earlier !== undefined) {
      unmatched.push({ row: i + 1, circuit: raw, reason: `circuit ${raw} is already given by row ${earlier}; only the first is imported` });
      return;
    }
    seen.set(id, i + 1);
    matches.push({ row: i + 1, circuitId: id });
  });
  return { by: 'number', matches, unmatched };
}

// ---- preview ----------------------------------------------------------------------------------

/**
 * One cell of the preview. `same`: the board already holds the file's value; `new`: the cell is
 * empty and takes the file's value; `conflict`: the cell holds another value (the typist keeps it
 * or takes the file's); `blank`: the file has no value (nothing is written, nothing erased).
 */
export interface PreviewCell {
  circuitId: number;
  circuitNumber: string;
  row: number;
  column: ReadingKey;
  current: string;
  /** Version of the cell now (0 = never written): the write carries it. */
  currentVersion: number;
  /** The file's text as written there. */
  raw: string;
  incoming: string;
  state: 'same' | 'new' | 'conflict' | 'blank';
  note: string | null;
}

export interface ImportPlan {
  by: 'number' | 'order';
  cells: PreviewCell[];
  unmatched: UnmatchedRow[];
  /** Reading columns the mapping fills, in the file's order. */
  columns: ReadingKey[];
  counts: { new: number; same: number; conflict: number; blank: number };
}

/** The plan of an import: every mapped value of every matched row against the board now. */
export function planImport(table: Pick<ImportTable, 'rows' | 'decimalComma'>, targets: readonly ImportTarget[], circuits: readonly Circuit[]): ImportPlan {
  const { by, matches, unmatched } = matchRows(table, targets, circuits);
  const byId = new Map(circuits.map((c) => [c.id, c]));
  const mapped: Array<{ index: number; column: ReadingKey }> = [];
  targets.forEach((t, index) => {
    if (isReadingKey(t)) mapped.push({ index, column: t });
  });
  const cells: PreviewCell[] = [];
  const counts = { new: 0, same: 0, conflict: 0, blank: 0 };
  for (const match of matches) {
    const circuit = byId.get(match.circuitId)!;
    const row = table.rows[match.row - 1]!;
    for (const { index, column } of mapped) {
      const raw = row[index] ?? '';
      const value = normaliseImported(column, raw, { decimalComma: table.decimalComma });
      const cell = circuit.cells[column];
      const current = cell?.text ?? '';
      const state: PreviewCell['state'] = value.text === '' ? 'blank' : current === value.text ? 'same' : current === '' ? 'new' : 'conflict';
      counts[state] += 1;
      cells.push({
        circuitId: circuit.id,
        circuitNumber: circuit.number,
        row: match.row,
        column,
        current,
        currentVersion: cell?.version ?? 0,
        raw,
        incoming: value.text,
        state,
        note: value.note,
      });
    }
  }
  return { by, cells, unmatched, columns: mapped.map((m) => m.column), counts };
}

/** How the typist settled conflicts: per column (`keep` / `take`) and per cell (overrides). */
export interface ConflictChoices {
  byColumn: Partial<Record<ReadingKey, 'keep' | 'take'>>;
  /** Keyed by `${circuitId}:${column}`. */
  byCell: Record<string, 'keep' | 'take'>;
}

export const cellKey = (circuitId: number, column: string) => `${circuitId}:${column}`;

/** The choice for a conflict; unsettled conflicts are `undefined` (nothing is written until all are settled). */
export function choiceFor(cell: Pick<PreviewCell, 'circuitId' | 'column'>, choices: ConflictChoices): 'keep' | 'take' | undefined {
  return choices.byCell[cellKey(cell.circuitId, cell.column)] ?? choices.byColumn[cell.column];
}

/** The writes the confirmed import makes: new cells, and conflicts where the file's value is taken. */
export function writesFor(plan: Pick<ImportPlan, 'cells'>, choices: ConflictChoices): BatchWrite[] {
  const writes: BatchWrite[] = [];
  for (const cell of plan.cells) {
    if (cell.state === 'new' || (cell.state === 'conflict' && choiceFor(cell, choices) === 'take')) {
      writes.push({ circuitId: cell.circuitId, column: cell.column, text: cell.incoming, reason: null, version: cell.currentVersion });
    }
  }
  return writes;
}

/** The checker's findings on the board as it would be after these writes (limits and sources as ever). */
export function findingsAfter(detail: Pick<BoardDetail, 'board' | 'site' | 'circuits' | 'previousReadings'>, writes: readonly BatchWrite[]): Finding[] {
  const byCircuit = new Map<number, BatchWrite[]>();
  for (const w of writes) byCircuit.set(w.circuitId, [...(byCircuit.get(w.circuitId) ?? []), w]);
  const circuits = detail.circuits.map((c) => {
    const mine = byCircuit.get(c.id);
    if (!mine) return c;
    const cells = { ...c.cells };
    for (const w of mine) cells[w.column] = { text: w.text, reason: null, version: w.version + 1, updatedBy: null, updatedAt: '' };
    return { ...c, cells };
  });
  return checkBoard(boardToCheckInput({ ...detail, circuits }));
}
