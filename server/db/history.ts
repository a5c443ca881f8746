import type { DB } from './database.ts';
import type { HistoryTable } from './types.ts';
import type { Insertable } from 'kysely';

export type HistoryEntry = Omit<Insertable<HistoryTable>, 'id' | 'at'> & { at?: string };

/** Appends one change to the board's history and returns its id (the feed's cursor). */
export async function appendHistory(db: DB, entry: HistoryEntry): Promise<number> {
  const row = await db
    .insertInto('history')
    .values({ ...entry, at: entry.at ?? new Date().toISOString() })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

/** The newest history id of a board (0 when nothing has changed yet). */
export async function latestCursor(db: DB, boardId: number): Promise<number> {
  const row = await db
    .selectFrom('history')
    .select((eb) => eb.fn.max<number | null>('id').as('id'))
    .where('board_id', '=', boardId)
    .executeTakeFirst();
  return row?.id ?? 0;
}

export function historySince(db: DB, boardId: number, after: number) {
  return db
    .selectFrom('history')
    .selectAll()
    .where('board_id', '=', boardId)
    .where('id', '>', after)
    .orderBy('id')
    .execute();
}

/** One cell's changes in order (served by the index history_circuit_column). */
export function cellHistoryQuery(db: DB, circuitId: number, columnKey: string) {
  return db
    .selectFrom('history')
    .selectAll()
    .where('circuit_id', '=', circuitId)
    .where('column_key', '=', columnKey)
    .orderBy('id');
}

export function cellHistory(db: DB, circuitId: number, columnKey: string) {
  return cellHistoryQuery(db, circuitId, columnKey).execute();
}

/**
 * A board's history, newest first (at most `limit` rows): every cell, detail, circuit and board
 * change, lock and unlock (with its reason). Filtered by person and by column when asked.
 */
export function boardHistory(db: DB, boardId: number, filter: { userId?: number; column?: string; limit: number }) {
  let query = db
    .selectFrom('history')
    .leftJoin('circuits', 'circuits.id', 'history.circuit_id')
    .select(['history.id', 'history.circuit_id', 'circuits.number as circuit_number', 'history.column_key', 'history.action', 'history.old_text', 'history.new_text', 'history.user_id', 'history.at', 'history.how'])
    .where('history.board_id', '=', boardId);
  if (filter.userId !== undefined) query = query.where('history.user_id', '=', filter.userId);
  if (filter.column !== undefined) query = query.where('history.column_key', '=', filter.column);
  return query.orderBy('history.id', 'desc').limit(filter.limit).execute();
}
