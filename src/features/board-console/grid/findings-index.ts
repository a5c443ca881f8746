/**
 * The checker's findings arranged for the grid: per circuit, per column, the findings on that cell
 * and the worst of them. A finding about a circuit but no column sits on the circuit's number.
 *
 * The index is rebuilt on every change of the board, but a circuit whose findings did not change
 * keeps the same object, so its row in the grid does not re-render.
 */
import type { Finding, Severity } from '../../../../shared/schemas/findings.ts';

/**
 * Worst first. A reading not yet recorded (`todo`) ranks below every finding about a value, so a
 * cell or a circuit shows its real fault before the fact that something else is still to type.
 */
export const severityRank: Readonly<Record<Severity, number>> = { error: 4, warning: 3, note: 2, todo: 1 };

/** Symbols shown beside the colour, so no finding is told by colour alone. */
export const severitySymbol: Readonly<Record<Severity, string>> = { error: '✕', warning: '!', note: 'i', todo: '○' };

export const severityWord: Readonly<Record<Severity, string>> = { error: 'Error', warning: 'Warning', note: 'Note', todo: 'To do' };

/** The severities of findings about values, as the findings list filters them (todo is counted apart). */
export const valueSeverities = ['error', 'warning', 'note'] as const satisfies readonly Severity[];

export interface CellFindings {
  worst: Finding;
  all: readonly Finding[];
}

/** Findings of one circuit by column key; the key `''` holds findings about the circuit as a whole. */
export type RowFindings = ReadonlyMap<string, CellFindings>;

export interface FindingsIndex {
  byCircuit: ReadonlyMap<number, RowFindings>;
  /** Findings about the board as a whole (no circuit). */
  board: readonly Finding[];
  /** The text that identifies each circuit's findings, for reuse between rebuilds. */
  signatures: ReadonlyMap<number, string>;
}

export const emptyFindingsIndex: FindingsIndex = { byCircuit: new Map(), board: [], signatures: new Map() };

/** A text that is equal for two lists of findings exactly when they say the same things. */
export function signatureOf(findings: readonly Finding[]): string {
  return findings.map((f) => `${f.code}|${f.severity}|${f.columns.join(',')}|${f.message}|${f.limit ?? ''}|${f.source ?? ''}`).join('\n');
}

export function worstOf(findings: readonly Finding[]): Finding | null {
  let worst: Finding | null = null;
  for (const f of findings) if (!worst || severityRank[f.severity] > severityRank[worst.severity]) worst = f;
  return worst;
}

/** Builds the index, reusing `previous` rows whose findings are unchanged. */
export function indexFindings(findings: readonly Finding[], previous: FindingsIndex = emptyFindingsIndex): FindingsIndex {
  const perCircuit = new Map<number, Finding[]>();
  const board: Finding[] = [];
  for (const f of findings) {
    if (f.circuitId === null) {
      board.push(f);
      continue;
    }
    let list = perCircuit.get(f.circuitId);
    if (!list) perCircuit.set(f.circuitId, (list = []));
    list.push(f);
  }
  const byCircuit = new Map<number, RowFindings>();
  const signatures = new Map<number, string>();
  for (const [circuitId, list] of perCircuit) {
    const signature = signatureOf(list);
    signatures.set(circuitId, signature);
    const reused = previous.signatures.get(circuitId) === signature ? previous.byCircuit.get(circuitId) : undefined;
    if (reused) {
      byCircuit.set(circuitId, reused);
      continue;
    }
    const cells = new Map<string, Finding[]>();
    for (const f of list) {
      const keys = f.columns.length > 0 ? f.columns : [''];
      for (const key of keys) {
        let cell = cells.get(key);
        if (!cell) cells.set(key, (cell = []));
        cell.push(f);
      }
    }
    const row = new Map<string, CellFindings>();
    for (const [key, all] of cells) {
      const sorted = [...all].sort((a, b) => severityRank[b.severity] - severityRank[a.severity]);
      row.set(key, { worst: sorted[0]!, all: sorted });
    }
    byCircuit.set(circuitId, row);
  }
  return { byCircuit, board, signatures };
}

/**
 * Orders findings worst first, then by the order of their circuits on the board. Readings not yet
 * recorded (`todo`) come after every finding about a value: on a board being typed there are many
 * of them, and a slip just made must show near the top, not below fifty blanks.
 */
export function sortFindings(findings: readonly Finding[], circuitOrder: readonly number[]): Finding[] {
  const position = new Map(circuitOrder.map((id, i) => [id, i]));
  return [...findings].sort(
    (a, b) =>
      severityRank[b.severity] - severityRank[a.severity] ||
      (a.circuitId === null ? -1 : (position.get(a.circuitId) ?? 1e9)) - (b.circuitId === null ? -1 : (position.get(b.circuitId) ?? 1e9)),
  );
}

/** Readings not yet recorded, counted per column, with the first circuit (in board order) lacking each. */
export interface ColumnToDo {
  column: string;
  count: number;
  /** The first todo finding on this column, in board order: where a jump goes. */
  first: Finding;
}

/**
 * Counts the `todo` findings per column, in the order of `columnOrder` (columns not in it last).
 * A finding naming several columns counts once in each.
 */
export function toDoByColumn(findings: readonly Finding[], circuitOrder: readonly number[], columnOrder: readonly string[]): ColumnToDo[] {
  const position = new Map(circuitOrder.map((id, i) => [id, i]));
  const at = (f: Finding) => (f.circuitId === null ? -1 : (position.get(f.circuitId) ?? 1e9));
  const byColumn = new Map<string, ColumnToDo>();
  for (const f of findings) {
    if (f.severity !== 'todo') continue;
    for (const column of f.columns.length > 0 ? f.columns : ['']) {
      const entry = byColumn.get(column);
      if (!entry) byColumn.set(column, { column, count: 1, first: f });
      else {
        entry.count += 1;
        if (at(f) < at(entry.first)) entry.first = f;
      }
    }
  }
  const rank = new Map(columnOrder.map((key, i) => [key, i]));
  return [...byColumn.values()].sort((a, b) => (rank.get(a.column) ?? 1e9) - (rank.get(b.column) ?? 1e9) || (a.column < b.column ? -1 : 1));
}
