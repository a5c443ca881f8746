/**
 * Which cells Enter stops at when typing by reading column. Pure: the controller builds the grid's
 * `Applies` predicate from it, and the console benchmark plans its keystrokes with the same rule.
 */
import { requiredColumns } from '../../../../shared/checker/index.ts';
import type { Circuit } from '../../../../shared/schemas/boards.ts';
import { isReadingKey, type ColumnKey, type ReadingKey } from '../../../../shared/schemas/columns.ts';

/** What the rule reads of a circuit: what it is (kind, RCD, AFDD) and the text of its readings. */
export type CircuitForStops = Pick<Circuit, 'kind' | 'rcdType' | 'afdd'> & {
  cells: Partial<Record<ReadingKey, { text: string } | undefined>>;
};

/** The checker's required readings, one set per combination (kind × RCD × AFDD), built on first use. */
const requiredSets = new Map<string, ReadonlySet<ReadingKey>>();

function requiredSet(circuit: Pick<Circuit, 'kind' | 'rcdType' | 'afdd'>): ReadonlySet<ReadingKey> {
  const key = `${circuit.kind}|${circuit.rcdType ?? ''}|${circuit.afdd ?? ''}`;
  let set = requiredSets.get(key);
  if (!set) requiredSets.set(key, (set = new Set(requiredColumns(circuit))));
  return set;
}

/** True when the checker counts this reading as one the circuit needs. */
export function readingApplies(circuit: Pick<Circuit, 'kind' | 'rcdType' | 'afdd'>, column: ReadingKey): boolean {
  return requiredSet(circuit).has(column);
}

/**
 * Whether Enter (and Shift+Enter, a tick, same-as-above) stops at this cell of the circuit, when
 * moving from a cell of column `from`:
 * - a circuit-detail cell: only when the move started in a detail column. A pass down a reading
 *   column goes on to the next reading column, never into the circuit's details (a correction
 *   typed after the end of a column must not land in, say, a hand-given maximum Zs);
 * - a reading the circuit needs (`requiredColumns` of the checker): always;
 * - any other reading: only when it holds a value, so a value typed where it does not apply can
 *   still be reached and corrected. An empty one is passed.
 */
export function enterStopsAt(circuit: CircuitForStops, column: ColumnKey, from?: ColumnKey): boolean {
  if (!isReadingKey(column)) return from === undefined || !isReadingKey(from);
  if ((circuit.cells[column]?.text ?? '') !== '') return true;
  return readingApplies(circuit, column);
}

/**
 * Where a jump to a circuit lands when the typist was in `column`: the same column when it is a
 * reading that circuit needs (or already holds a value there), else the circuit's first needed
 * reading still empty, else its first needed reading. A detail column is never kept by a jump.
 */
export function jumpColumn(circuit: CircuitForStops, column: ColumnKey | undefined, order: readonly ColumnKey[]): { column: ColumnKey; kept: boolean } {
  if (column && isReadingKey(column) && ((circuit.cells[column]?.text ?? '') !== '' || readingApplies(circuit, column))) return { column, kept: true };
  const needed = order.filter((key): key is ReadingKey => isReadingKey(key) && readingApplies(circuit, key));
  const empty = needed.find((key) => (circuit.cells[key]?.text ?? '') === '');
  return { column: empty ?? needed[0] ?? column ?? 'description', kept: false };
}
