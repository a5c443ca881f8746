import {
  circuitFieldsSchema,
  type Board,
  type BoardChanges,
  type BoardDetail,
  type Cell,
  type Cells,
  type Circuit,
  type CircuitFields,
} from '../../../../shared/schemas/boards.ts';
import { readingKeys } from '../../../../shared/schemas/columns.ts';
import type { Finding } from '../../../../shared/schemas/findings.ts';
import { cellTarget, fieldTarget, type EditTarget } from './targets.ts';

/**
 * Merging what the server sends into the cached board. Pure functions.
 *
 * Three rules hold throughout:
 * - **Pending edits win.** A cell or detail this page is still sending keeps its cached value: the
 *   typist's value is what they see, and the base their next edit of it builds on.
 * - **Versions never go back.** Cell versions and circuit versions only grow on the server, so an
 *   answer older than what the cache holds (a poll that left before our own write landed) is
 *   ignored for that cell or circuit.
 * - **Untouched stays identical.** A circuit that did not change is returned as the same object,
 *   so React rows keyed on it do not re-render.
 */

const fieldKeys = Object.keys(circuitFieldsSchema.shape) as (keyof CircuitFields)[];

function samePerson(a: Cell['updatedBy'], b: Cell['updatedBy']): boolean {
  return a === b || (a !== null && b !== null && a.id === b.id && a.name === b.name);
}

export function sameCell(a: Cell, b: Cell): boolean {
  return (
    a.text === b.text &&
    a.reason === b.reason &&
    a.version === b.version &&
    a.updatedAt === b.updatedAt &&
    samePerson(a.updatedBy, b.updatedBy)
  );
}

/** Whether the server's cell should replace the cached one. */
function takesCell(cached: Cell | undefined, incoming: Cell): boolean {
  if (!cached) return true;
  if (incoming.version !== cached.version) return incoming.version > cached.version;
  return !sameCell(cached, incoming);
}

/**
 * A circuit as the server sent it, merged into the cached one: newer cells and (when the circuit
 * version is not older) details are taken, except those in `pending`.
 */
export function mergeCircuit(cached: Circuit, incoming: Circuit, pending: ReadonlySet<EditTarget>): Circuit {
  let cells: Cells = cached.cells;
  for (const column of readingKeys) {
    const theirs = incoming.cells[column];
    if (!theirs || pending.has(cellTarget(cached.id, column))) continue;
    if (!takesCell(cached.cells[column], theirs)) continue;
    if (cells === cached.cells) cells = { ...cached.cells };
    cells[column] = theirs;
  }

  let next: Circuit | null = cells === cached.cells ? null : { ...cached, cells };
  if (incoming.version >= cached.version) {
    const writable = (next ??= { ...cached }) as unknown as Record<string, unknown>;
    let changed = cells !== cached.cells;
    for (const field of fieldKeys) {
      if (pending.has(fieldTarget(cached.id, field)) || Object.is(cached[field], incoming[field])) continue;
      writable[field] = incoming[field];
      changed = true;
    }
    if (incoming.version !== cached.version || incoming.position !== cached.position) {
      writable.version = incoming.version;
      writable.position = incoming.position;
      changed = true;
    }
    if (!changed) next = null;
  }
  return next ?? cached;
}

/** The board record, unless the cache already holds a newer or the same one. */
export function mergeBoard(cached: Board, incoming: Board): Board {
  if (incoming.version < cached.version) return cached;
  if (
    incoming.version === cached.version &&
    incoming.state === cached.state &&
    (Object.keys(incoming) as (keyof Board)[]).every((key) =>
      key === 'lockedBy' ? samePerson(cached.lockedBy, incoming.lockedBy) : Object.is(cached[key], incoming[key]),
    )
  ) {
    return cached;
  }
  return incoming;
}

/**
 * Puts circuits into the order of `order` (ids), numbering `position` 1..n as the server does.
 * Returns null when an id is unknown (the cache missed a circuit: reload the board).
 */
export function arrangeCircuits(current: readonly Circuit[], order: readonly number[], byId: ReadonlyMap<number, Circuit>): Circuit[] | null {
  const sameOrder = order.length === current.length && order.every((id, index) => current[index]?.id === id);
  const arranged: Circuit[] = [];
  for (const [index, id] of order.entries()) {
    const circuit = byId.get(id);
    if (!circuit) return null;
    arranged.push(sameOrder || circuit.position === index + 1 ? circuit : { ...circuit, position: index + 1 });
  }
  return arranged;
}

function sameList<T>(a: readonly T[], b: readonly T[]): boolean {
  return a.length === b.length && a.every((item, index) => item === b[index]);
}

/** Findings of the board with those of one circuit replaced (a save answers only its circuit's). */
export function replaceCircuitFindings(findings: readonly Finding[], circuitId: number, fresh: readonly Finding[]): Finding[] {
  return [...findings.filter((f) => f.circuitId !== circuitId), ...fresh];
}

/**
 * The feed's findings when it sends only those that changed (`findingsScope: 'circuits'`): those of
 * the circuits it brings, of any circuit whose findings changed, and the board-wide ones;
 * `findingsCircuits` names the circuits covered (a circuit may have none left). They replace what
 * was known of those circuits and of the board; findings of removed circuits go.
 */
export function mergeScopedFindings(
  findings: readonly Finding[],
  changes: Pick<BoardChanges, 'circuits' | 'order' | 'findings' | 'findingsCircuits'>,
): Finding[] {
  const sent = new Set(changes.findingsCircuits ?? changes.circuits.map((c) => c.id));
  for (const f of changes.findings) if (f.circuitId !== null) sent.add(f.circuitId);
  const onBoard = new Set(changes.order);
  return [...findings.filter((f) => f.circuitId !== null && !sent.has(f.circuitId) && onBoard.has(f.circuitId)), ...changes.findings];
}

export interface MergeChangesOptions {
  /** The cursor the changes were asked after. */
  after: number;
  pending: ReadonlySet<EditTarget>;
  /**
   * Whether to take the answer's circuit order. False when this page changed the structure after
   * the answer was made (an insert or removal answered with a newer cursor): the older order
   * would undo it for a second.
   */
  applyOrder: boolean;
}

/**
 * The changes feed merged into the cached board. `missing` is true when the order names a circuit
 * neither the cache nor the answer holds: only a full reload can fill it in.
 */
export function mergeChanges(cached: BoardDetail, changes: BoardChanges, options: MergeChangesOptions): { detail: BoardDetail; missing: boolean } {
  const byId = new Map(cached.circuits.map((c) => [c.id, c]));
  for (const incoming of changes.circuits) {
    const existing = byId.get(incoming.id);
    if (existing) byId.set(incoming.id, mergeCircuit(existing, incoming, options.pending));
    else if (options.applyOrder) byId.set(incoming.id, incoming);
  }

  let missing = false;
  let circuits: Circuit[] = cached.circuits.map((c) => byId.get(c.id) ?? c);
  if (options.applyOrder) {
    const arranged = arrangeCircuits(circuits, changes.order, byId);
    if (arranged) circuits = arranged;
    else missing = true;
  }
  if (sameList(circuits, cached.circuits)) circuits = cached.circuits;

  const somethingChanged = changes.cursor > options.after;
  const board = mergeBoard(cached.board, changes.board);
  const findings = !somethingChanged
    ? cached.findings
    : changes.findingsScope === 'circuits'
      ? mergeScopedFindings(cached.findings, changes)
      : changes.findings;
  const cursor = Math.max(cached.cursor, changes.cursor);
  if (circuits === cached.circuits && board === cached.board && findings === cached.findings && cursor === cached.cursor) {
    return { detail: cached, missing };
  }
  return { detail: { ...cached, board, circuits, findings, cursor }, missing };
}

/**
 * A freshly fetched board merged into the cached one: the fetched order, findings and cursor are
 * taken; cells and circuits keep what is newer or pending, as in the changes feed.
 */
export function mergeFetched(cached: BoardDetail | undefined, fetched: BoardDetail, pending: ReadonlySet<EditTarget>): BoardDetail {
  if (!cached) return fetched;
  const byId = new Map(cached.circuits.map((c) => [c.id, c]));
  const circuits = fetched.circuits.map((incoming) => {
    const existing = byId.get(incoming.id);
    return existing ? mergeCircuit(existing, incoming, pending) : incoming;
  });
  return {
    ...fetched,
    board: mergeBoard(cached.board, fetched.board),
    circuits: sameList(circuits, cached.circuits) ? cached.circuits : circuits,
  };
}
