import type { Kysely } from 'kysely';

/**
 * Photos of the paper notes go to the client only when someone chooses so: `files.send_to_client`
 * (0 or 1, default 0) is that choice per photo, and `outgoing_mail.photo_file_ids` (JSON array of
 * file ids, null for e-mails queued before this) records which photos were chosen when an e-mail
 * was queued, so a retry sends the same set (less any photo unchosen since).
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('files').addColumn('send_to_client', 'integer', (c) => c.notNull().defaultTo(0)).execute();
  await db.schema.alterTable('outgoing_mail').addColumn('photo_file_ids', 'text').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('outgoing_mail').dropColumn('photo_file_ids').execute();
  await db.schema.alterTable('files').dropColumn('send_to_client').execute();
}
