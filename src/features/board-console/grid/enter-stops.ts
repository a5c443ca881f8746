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
 * Whether Enter (and Shift+Enter, a tick, same-as-above) stops at this cell of the circuit:
 * - a circuit-detail cell: always;
 * - a reading the circuit needs (`requiredColumns` of the checker): always;
 * - any other reading: only when it holds a value, so a value typed where it does not apply can
 *   still be reached and corrected. An empty one is passed.
 */
export function enterStopsAt(circuit: CircuitForStops, column: ColumnKey): boolean {
  if (!isReadingKey(column)) return true;
  if ((circuit.cells[column]?.text ?? '') !== '') return true;
  return readingApplies(circuit, column);
}
