import { sql, type Kysely } from 'kysely';

/**
 * Append-only history of a site's details (client, address, contact, earthing…), like `history`
 * for boards and `job_history` for jobs: one row per changed field with its old and new value as
 * JSON text, who and when, and the site's version after the change (which lets a stale edit of one
 * field go through when only other fields changed meanwhile). Frozen once landed.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('site_history')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('site_id', 'integer', (c) => c.notNull())
    // The field that changed (camelCase, as over HTTP); null for `created`.
    .addColumn('field', 'text')
    // `created` or `details`.
    .addColumn('action', 'text', (c) => c.notNull())
    .addColumn('old_text', 'text')
    .addColumn('new_text', 'text')
    .addColumn('user_id', 'integer')
    .addColumn('at', 'text', (c) => c.notNull())
    .addColumn('version', 'integer')
    .execute();
  await db.schema.createIndex('site_history_site_id').on('site_history').columns(['site_id', 'id']).execute();
  await sql`create trigger site_history_no_update before update on site_history
    begin select raise(abort, 'site history is append-only'); end`.execute(db);
  await sql`create trigger site_history_no_delete before delete on site_history
    begin select raise(abort, 'site history is append-only'); end`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('site_history').ifExists().execute();
}
