import type { DB } from './database.ts';
import { appendHistory } from './history.ts';
import { appendJobHistory } from './jobs.ts';
import { stableJson } from './json-values.ts';
import type { BoardRow, CircuitRow, NewCircuitRow } from './types.ts';

export interface NewBoardFields {
  reference: string;
  location: string;
  suppliedFrom: string;
}

const phaseOrder = ['L1', 'L2', 'L3'] as const;

/**
 * Circuit numbers of an empty board. Single-phase: 1…N. Three-phase: N ways per phase, numbered
 * per phase in the order the ways sit on the busbar (1L1 1L2 1L3 2L1 …), each with its phase.
 */
export function emptyBoardCircuits(layout: 'single-phase' | 'three-phase', ways: number): { number: string; phase: 'L1' | 'L2' | 'L3' | null }[] {
  if (layout === 'single-phase') return Array.from({ length: ways }, (_, i) => ({ number: String(i + 1), phase: null }));
  return Array.from({ length: ways }, (_, i) => phaseOrder.map((phase) => ({ number: `${i + 1}${phase}`, phase }))).flat();
}

async function insertBoardRow(db: DB, jobId: number, fields: NewBoardFields, phases: 1 | 3): Promise<BoardRow> {
  return db
    .insertInto('boards')
    .values({
      job_id: jobId,
      reference: fields.reference,
      location: fields.location,
      supplied_from: fields.suppliedFrom,
      phases,
      // Board details measured on the day (Zdb, Ipf, confirmations, instruments) start empty.
      zdb_ohm: null,
      ipf_ka: null,
      locked_by: null,
      locked_at: null,
      version: 1,
    })
    .returningAll()
    .executeTakeFirstOrThrow();
}

async function recordBoardCreated(db: DB, board: BoardRow, how: string, userId: number, at: string): Promise<void> {
  await appendHistory(db, {
    board_id: board.id,
    circuit_id: null,
    column_key: null,
    action: 'board-created',
    old_text: null,
    new_text: how,
    user_id: userId,
    how: 'typed',
    version: 1,
    at,
  });
  await appendJobHistory(db, {
    job_id: board.job_id,
    section: null,
    field: null,
    action: 'board-created',
    old_text: null,
    new_text: stableJson({ boardId: board.id, reference: board.reference, how }),
    reason: null,
    user_id: userId,
    version: null,
    at,
  });
}

/** An empty board with N ways; returns the new board. */
export async function createEmptyBoard(
  db: DB,
  jobId: number,
  fields: NewBoardFields,
  layout: 'single-phase' | 'three-phase',
  ways: number,
  userId: number,
): Promise<BoardRow> {
  const board = await insertBoardRow(db, jobId, fields, layout === 'three-phase' ? 3 : 1);
  const circuits: NewCircuitRow[] = emptyBoardCircuits(layout, ways).map((c, index) => ({
    ...blankCircuitColumns,
    board_id: board.id,
    position: index + 1,
    number: c.number,
    phase: c.phase,
    version: 1,
  }));
  // SQLite caps the variables of one statement: insert in slices.
  for (let i = 0; i < circuits.length; i += 100) await db.insertInto('circuits').values(circuits.slice(i, i + 100)).execute();
  await recordBoardCreated(db, board, `empty, ${ways} way${ways === 1 ? '' : 's'} ${layout}`, userId, new Date().toISOString());
  return board;
}

const blankCircuitColumns = {
  points: null,
  live_csa_mm2: null,
  cpc_csa_mm2: null,
  max_disconnection_s: null,
  rating_a: null,
  breaking_ka: null,
  rcd_type: null,
  rcd_rated_residual_ma: null,
  afdd: null,
  spur_ring_id: null,
  spur_origin_point: null,
  spur_length_m: null,
  max_zs_by_hand_ohm: null,
  previous_circuit_id: null,
} satisfies Partial<NewCircuitRow>;

/**
 * A new board on `jobId` holding a copy of another board's circuit details: same numbers, order,
 * cables, devices and remarks; no readings; spur links pointed at the copies of their rings. With
 * `linkPrevious`, each copy remembers the circuit it came from (`previous_circuit_id`), so this
 * visit's readings can be compared with last time.
 */
export async function copyBoard(
  db: DB,
  source: BoardRow,
  jobId: number,
  fields: NewBoardFields,
  options: { linkPrevious: boolean; userId: number; at?: string },
): Promise<BoardRow> {
  const board = await insertBoardRow(db, jobId, fields, source.phases);
  const circuits = await db.selectFrom('circuits').selectAll().where('board_id', '=', source.id).orderBy('position').orderBy('id').execute();
  const newIdByOld = new Map<number, number>();
  for (const circuit of circuits) {
    const { id, board_id: _board, version: _version, spur_ring_id: _spur, previous_circuit_id: _previous, ...details } = circuit satisfies CircuitRow;
    const inserted = await db
      .insertInto('circuits')
      .values({ ...details, board_id: board.id, spur_ring_id: null, previous_circuit_id: options.linkPrevious ? id : null, version: 1 })
      .returning('id')
      .executeTakeFirstOrThrow();
    newIdByOld.set(id, inserted.id);
  }
  for (const circuit of circuits) {
    if (circuit.spur_ring_id === null) continue;
    const ring = newIdByOld.get(circuit.spur_ring_id);
    const spur = newIdByOld.get(circuit.id);
    if (ring !== undefined && spur !== undefined) await db.updateTable('circuits').set({ spur_ring_id: ring }).where('id', '=', spur).execute();
  }
  await recordBoardCreated(db, board, `copy of the circuit details of board ${source.reference} (id ${source.id})`, options.userId, options.at ?? new Date().toISOString());
  return board;
}

/**
 * Copies every board of an earlier job (circuit details, no readings) onto a new job, each
 * circuit linked to the one it came from.
 */
export async function copyBoardsOfJob(db: DB, fromJobId: number, toJobId: number, userId: number): Promise<void> {
  const boards = await db.selectFrom('boards').selectAll().where('job_id', '=', fromJobId).orderBy('id').execute();
  for (const source of boards) {
    await copyBoard(db, source, toJobId, { reference: source.reference, location: source.location, suppliedFrom: source.supplied_from }, { linkPrevious: true, userId });
  }
}

export function boardReferenceTaken(db: DB, jobId: number, reference: string) {
  return db
    .selectFrom('boards')
    .select('id')
    .where('job_id', '=', jobId)
    .where((eb) => eb(eb.fn('lower', ['reference']), '=', reference.trim().toLowerCase()))
    .executeTakeFirst()
    .then((row) => row !== undefined);
}
