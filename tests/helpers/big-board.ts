import type { DB } from '../../server/db/database.ts';

/**
 * Adds a board of `ways` circuits to the job of the seeded board with the most circuits, its
 * circuits and readings repeated from that board (numbers 1..ways), for benchmarks. Returns the
 * new board's id and the id of the board it copied.
 */
export async function addRepeatedBoard(db: DB, ways: number): Promise<{ boardId: number; fromBoardId: number }> {
  const counts = await db
    .selectFrom('circuits')
    .select(['board_id', (eb) => eb.fn.countAll<number>().as('n')])
    .groupBy('board_id')
    .orderBy('n', 'desc')
    .execute();
  const fromBoardId = counts[0]!.board_id;
  const from = await db.selectFrom('boards').selectAll().where('id', '=', fromBoardId).executeTakeFirstOrThrow();
  const { id: _id, ...boardFields } = from;
  const { id: boardId } = await db
    .insertInto('boards')
    .values({ ...boardFields, reference: `DB-${ways}`, state: 'open', locked_by: null, locked_at: null })
    .returning('id')
    .executeTakeFirstOrThrow();
  const source = await db.selectFrom('circuits').selectAll().where('board_id', '=', fromBoardId).orderBy('position').execute();
  const cells = await db
    .selectFrom('cells')
    .innerJoin('circuits', 'circuits.id', 'cells.circuit_id')
    .selectAll('cells')
    .where('circuits.board_id', '=', fromBoardId)
    .execute();
  await db.transaction().execute(async (trx) => {
    for (let i = 0; i < ways; i++) {
      const circuit = source[i % source.length]!;
      const { id: _cid, ...rest } = circuit;
      const { id } = await trx
        .insertInto('circuits')
        .values({ ...rest, board_id: boardId, position: i + 1, number: String(i + 1), spur_ring_id: null, previous_circuit_id: null })
        .returning('id')
        .executeTakeFirstOrThrow();
      const own = cells.filter((c) => c.circuit_id === circuit.id).map((c) => ({ ...c, circuit_id: id }));
      if (own.length > 0) await trx.insertInto('cells').values(own).execute();
    }
  });
  return { boardId, fromBoardId };
}
