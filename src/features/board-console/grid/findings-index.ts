/**
 * The checker's findings arranged for the grid: per circuit, per column, the findings on that cell
 * and the worst of them. A finding about a circuit but no column sits on the circuit's number.
 *
 * The index is rebuilt on every change of the board, but a circuit whose findings did not change
 * keeps the same object, so its row in the grid does not re-render.
 */
import type { Finding, Severity } from '../../../../shared/schemas/findings.ts';

export const severityRank: Readonly<Record<Severity, number>> = { error: 3, warning: 2, note: 1 };

/** Symbols shown beside the colour, so no finding is told by colour alone. */
export const severitySymbol: Readonly<Record<Severity, string>> = { error: '✕', warning: '!', note: 'i' };

export const severityWord: Readonly<Record<Severity, string>> = { error: 'Error', warning: 'Warning', note: 'Note' };

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

/** Orders findings worst first, then by the order of their circuits on the board. */
/**
 * Findings that only say a reading is not recorded yet. They block locking as errors do, but on a
 * board being typed there are many of them, so within a severity they come after the findings
 * about values that were typed: a slip just made shows near the top, not below fifty blanks.
 */
const notYetRecordedCodes: ReadonlySet<string> = new Set(['cells-missing', 'rcd-time-missing', 'circuit-untested']);

export function sortFindings(findings: readonly Finding[], circuitOrder: readonly number[]): Finding[] {
  const position = new Map(circuitOrder.map((id, i) => [id, i]));
  const blank = (f: Finding) => (notYetRecordedCodes.has(f.code) ? 1 : 0);
  return [...findings].sort(
    (a, b) =>
      severityRank[b.severity] - severityRank[a.severity] ||
      blank(a) - blank(b) ||
      (a.circuitId === null ? -1 : (position.get(a.circuitId) ?? 1e9)) - (b.circuitId === null ? -1 : (position.get(b.circuitId) ?? 1e9)),
  );
}
