import { sql, type Kysely } from 'kysely';

/**
 * Mappings of an instrument file's columns to a board's reading columns, saved under a name by a
 * person for themself (`owner_id` set) or for the whole company (`owner_id` null), so the next
 * file from the same instrument is mapped at once.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('import_mappings')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('name', 'text', (c) => c.notNull())
    // null: shared with everyone in the company.
    .addColumn('owner_id', 'integer', (c) => c.references('users.id').onDelete('cascade'))
    // JSON: [{ "header": "...", "target": "zs" | "circuit" | "ignore" | ... }]
    .addColumn('columns', 'text', (c) => c.notNull())
    .addColumn('created_by', 'integer', (c) => c.references('users.id'))
    .addColumn('updated_at', 'text', (c) => c.notNull().defaultTo(sql`(strftime('%Y-%m-%dT%H:%M:%fZ', 'now'))`))
    .execute();
  // One name per owner; company mappings (owner null) are kept unique by the route.
  await db.schema.createIndex('import_mappings_owner_name').on('import_mappings').columns(['owner_id', 'name']).unique().execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('import_mappings').ifExists().execute();
}
