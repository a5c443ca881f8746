import type { Kysely } from 'kysely';

/**
 * A ring final circuit's socket-by-socket readings (steps 2 and 3 of the ring test): one row per
 * ring circuit holding the sockets in ring order as JSON (label, position along the ring when
 * known, L-N and L-cpc readings as typed), with a version for the usual stale-write refusal. Every
 * change also appends a `ring-sockets` row to `history`.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('ring_sockets')
    .addColumn('circuit_id', 'integer', (c) => c.primaryKey().references('circuits.id').onDelete('cascade'))
    .addColumn('data', 'text', (c) => c.notNull())
    .addColumn('version', 'integer', (c) => c.notNull())
    .addColumn('updated_by', 'integer')
    .addColumn('updated_at', 'text', (c) => c.notNull())
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('ring_sockets').execute();
}
