import type { ReadingKey } from '../../shared/schemas/columns.ts';
import type { DB } from './database.ts';
import { appendHistory } from './history.ts';
import type { CellRow } from './types.ts';

export function findCellRow(db: DB, circuitId: number, column: ReadingKey): Promise<CellRow | undefined> {
  return db
    .selectFrom('cells')
    .selectAll()
    .where('circuit_id', '=', circuitId)
    .where('column_key', '=', column)
    .executeTakeFirst();
}

export type CellWriteResult =
  | { ok: true; cell: CellRow; cursor: number }
  | { ok: false; current: CellRow | undefined };

/**
 * Writes one reading cell if nobody changed it since `baseVersion` (0 = never written).
 * Writing the text and reason the cell already holds succeeds without a new version, so a
 * request retried after a lost answer (the offline queue) is harmless.
 * A cleared cell keeps its row with empty text, so its version never goes back to 0.
 */
export async function writeCell(
  db: DB,
  input: {
    boardId: number;
    circuitId: number;
    column: ReadingKey;
    text: string;
    reason: string | null;
    baseVersion: number;
    userId: number;
    how: string;
    /**
     * The cell as it is now, when the caller has already read it in the same transaction (a batch
     * reads a board's cells in one query); `null` for a cell never written. Omitted: read here.
     */
    current?: CellRow | null;
  },
): Promise<CellWriteResult> {
  const current = input.current !== undefined ? (input.current ?? undefined) : await findCellRow(db, input.circuitId, input.column);
  const currentVersion = current?.version ?? 0;
  if (current && current.text === input.text && (current.reason ?? null) === input.reason) {
    return { ok: true, cell: current, cursor: 0 };
  }
  if (input.baseVersion !== currentVersion) return { ok: false, current };

  const now = new Date().toISOString();
  const row: CellRow = {
    circuit_id: input.circuitId,
    column_key: input.column,
    text: input.text,
    reason: input.reason,
    version: currentVersion + 1,
    updated_by: input.userId,
    updated_at: now,
  };
  await db
    .insertInto('cells')
    .values(row)
    .onConflict((oc) =>
      oc.columns(['circuit_id', 'column_key']).doUpdateSet({
        text: row.text,
        reason: row.reason,
        version: row.version,
        updated_by: row.updated_by,
        updated_at: row.updated_at,
      }),
    )
    .execute();
  const cursor = await appendHistory(db, {
    board_id: input.boardId,
    circuit_id: input.circuitId,
    column_key: input.column,
    action: 'cell',
    old_text: current?.text ?? null,
    new_text: input.reason ? `${input.text} (${input.reason})` : input.text,
    user_id: input.userId,
    how: input.how,
    version: row.version,
    at: now,
  });
  return { ok: true, cell: row, cursor };
}
