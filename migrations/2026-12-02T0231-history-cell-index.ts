import type { Kysely } from 'kysely';

/**
 * A cell's history (and the check for a circuit detail changed meanwhile) looks history up by
 * circuit and column, in order of id: without this index every popup read the whole table, which
 * grows with every save of every board.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.createIndex('history_circuit_column').on('history').columns(['circuit_id', 'column_key', 'id']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex('history_circuit_column').ifExists().execute();
}
