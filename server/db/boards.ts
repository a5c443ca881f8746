import type { Board, Circuit, PreviousReadings, UpdateBoardBody } from '../../shared/schemas/boards.ts';
import { isReadingKey } from '../../shared/schemas/columns.ts';
import type { Job, Site } from '../../shared/schemas/sites.ts';
import type { DB } from './database.ts';
import { appendHistory } from './history.ts';
import { toBoard, toCircuit, toJob, toSite } from './mappers.ts';
import { servedCircuit } from './served-circuits.ts';
import type { BoardRow, BoardTable, CellRow } from './types.ts';
import { userNames } from './users.ts';
import type { Updateable } from 'kysely';

export function findBoardRow(db: DB, boardId: number): Promise<BoardRow | undefined> {
  return db.selectFrom('boards').selectAll().where('id', '=', boardId).executeTakeFirst();
}

export async function loadBoard(db: DB, boardId: number): Promise<Board | undefined> {
  const row = await findBoardRow(db, boardId);
  return row ? toBoard(row, await userNames(db)) : undefined;
}

/** Circuits of a board in order, with their cells; optionally only some circuits. */
export async function loadCircuits(db: DB, boardId: number, onlyIds?: readonly number[]): Promise<Circuit[]> {
  if (onlyIds && onlyIds.length === 0) return [];
  let circuitQuery = db.selectFrom('circuits').selectAll().where('board_id', '=', boardId);
  if (onlyIds) circuitQuery = circuitQuery.where('id', 'in', onlyIds);
  const rows = await circuitQuery.orderBy('position').orderBy('id').execute();
  let cellQuery = db
    .selectFrom('cells')
    .innerJoin('circuits', 'circuits.id', 'cells.circuit_id')
    .selectAll('cells')
    .where('circuits.board_id', '=', boardId);
  if (onlyIds) cellQuery = cellQuery.where('cells.circuit_id', 'in', onlyIds);
  const cellRows = await cellQuery.execute();
  const byCircuit = new Map<number, CellRow[]>();
  for (const cell of cellRows) {
    const list = byCircuit.get(cell.circuit_id);
    if (list) list.push(cell);
    else byCircuit.set(cell.circuit_id, [cell]);
  }
  const names = await userNames(db);
  return rows.map((row) => servedCircuit(toCircuit(row, byCircuit.get(row.id) ?? [], names)));
}

export interface BoardWithContext {
  board: Board;
  site: Site;
  job: Job;
  circuits: Circuit[];
  /** Last time's readings of the circuits that were carried over from an earlier job. */
  previousReadings: PreviousReadings[];
}

export async function loadBoardWithContext(db: DB, boardId: number): Promise<BoardWithContext | undefined> {
  const board = await loadBoard(db, boardId);
  if (!board) return undefined;
  const job = await db.selectFrom('jobs').selectAll().where('id', '=', board.jobId).executeTakeFirstOrThrow();
  const site = await db.selectFrom('sites').selectAll().where('id', '=', job.site_id).executeTakeFirstOrThrow();
  return {
    board,
    job: toJob(job),
    site: toSite(site),
    circuits: await loadCircuits(db, boardId),
    previousReadings: await loadPreviousReadings(db, boardId),
  };
}

/**
 * For each circuit of a board that has a previous circuit (the same circuit on an earlier job),
 * that circuit's cells and its job: one query, empty when the board was not started from another.
 */
export async function loadPreviousReadings(db: DB, boardId: number): Promise<PreviousReadings[]> {
  const rows = await db
    .selectFrom('circuits as current')
    .innerJoin('circuits as previous', 'previous.id', 'current.previous_circuit_id')
    .innerJoin('boards as previous_board', 'previous_board.id', 'previous.board_id')
    .innerJoin('jobs as previous_job', 'previous_job.id', 'previous_board.job_id')
    .leftJoin('cells', 'cells.circuit_id', 'previous.id')
    .select([
      'current.id as circuit_id',
      'previous_job.id as job_id',
      'previous_job.kind as job_kind',
      'previous_job.reference as job_reference',
      'previous_job.visit_date as job_visit_date',
      'cells.column_key',
      'cells.text',
      'cells.reason',
    ])
    .where('current.board_id', '=', boardId)
    .execute();
  const byCircuit = new Map<number, PreviousReadings>();
  for (const row of rows) {
    let entry = byCircuit.get(row.circuit_id);
    if (!entry) {
      entry = {
        circuitId: row.circuit_id,
        job: { id: row.job_id, kind: row.job_kind, reference: row.job_reference, visitDate: row.job_visit_date },
        cells: {},
      };
      byCircuit.set(row.circuit_id, entry);
    }
    if (row.column_key !== null && row.text !== null && isReadingKey(row.column_key)) {
      entry.cells[row.column_key] = { text: row.text, reason: row.reason };
    }
  }
  return [...byCircuit.values()].sort((a, b) => a.circuitId - b.circuitId);
}

export async function circuitOrder(db: DB, boardId: number): Promise<number[]> {
  const rows = await db
    .selectFrom('circuits')
    .select('id')
    .where('board_id', '=', boardId)
    .orderBy('position')
    .orderBy('id')
    .execute();
  return rows.map((r) => r.id);
}

const boardColumns = {
  reference: 'reference',
  location: 'location',
  suppliedFrom: 'supplied_from',
  zdbOhm: 'zdb_ohm',
  ipfKa: 'ipf_ka',
  polarityConfirmed: 'polarity_confirmed',
  phaseSequenceConfirmed: 'phase_sequence_confirmed',
  instruments: 'instruments',
} as const;

/** Applies board-detail changes and records each in the history. Caller checks the version. */
export async function updateBoardDetails(
  db: DB,
  board: BoardRow,
  changes: UpdateBoardBody['changes'],
  userId: number,
): Promise<void> {
  const update: Updateable<BoardTable> = { version: board.version + 1 };
  const values = update as Record<string, unknown>;
  for (const [key, value] of Object.entries(changes)) {
    const column = boardColumns[key as keyof typeof boardColumns];
    if (!column || value === undefined) continue;
    values[column] = typeof value === 'boolean' ? (value ? 1 : 0) : value;
    await appendHistory(db, {
      board_id: board.id,
      circuit_id: null,
      column_key: key,
      action: 'board',
      old_text: String((board as Record<string, unknown>)[column] ?? ''),
      new_text: String(value ?? ''),
      user_id: userId,
      how: 'typed',
      version: board.version + 1,
    });
  }
  await db.updateTable('boards').set(update).where('id', '=', board.id).execute();
}

export async function setBoardLock(
  db: DB,
  board: BoardRow,
  lock: { locked: true; userId: number } | { locked: false; userId: number; reason: string },
): Promise<void> {
  const now = new Date().toISOString();
  await db
    .updateTable('boards')
    .set(
      lock.locked
        ? { state: 'locked', locked_by: lock.userId, locked_at: now, version: board.version + 1 }
        : { state: 'open', locked_by: null, locked_at: null, version: board.version + 1 },
    )
    .where('id', '=', board.id)
    .execute();
  await appendHistory(db, {
    board_id: board.id,
    circuit_id: null,
    column_key: null,
    action: lock.locked ? 'locked' : 'unlocked',
    old_text: board.state,
    new_text: lock.locked ? 'locked' : `open: ${lock.reason}`,
    user_id: lock.userId,
    how: 'typed',
    version: board.version + 1,
    at: now,
  });
}
