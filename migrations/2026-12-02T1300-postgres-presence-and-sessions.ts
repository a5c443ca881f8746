import { sql, type Kysely } from 'kysely';
import { onPostgres } from './lib/dialect.ts';

/**
 * PostgreSQL only (several instances on one database): who has a board open (`presence`, so people
 * on different instances see each other) and the sign-in sessions (`sessions`, in the shape the
 * PostgreSQL session store reads). On SQLite there is one process: presence stays in its memory and
 * sessions in the SQLite session store's own table, so this migration changes nothing there.
 */
export async function up(db: Kysely<any>): Promise<void> {
  if (!onPostgres(db)) return;
  await db.schema
    .createTable('presence')
    .addColumn('board_id', 'integer', (c) => c.notNull().references('boards.id').onDelete('cascade'))
    .addColumn('user_id', 'integer', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('seen_at', 'timestamptz', (c) => c.notNull())
    .addPrimaryKeyConstraint('presence_pk', ['board_id', 'user_id'])
    .execute();
  await db.schema
    .createTable('sessions')
    .addColumn('sid', 'text', (c) => c.primaryKey())
    .addColumn('sess', 'json', (c) => c.notNull())
    .addColumn('expire', sql`timestamp(6)`, (c) => c.notNull())
    .execute();
  await db.schema.createIndex('sessions_expire').on('sessions').column('expire').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  if (!onPostgres(db)) return;
  await db.schema.dropTable('sessions').ifExists().execute();
  await db.schema.dropTable('presence').ifExists().execute();
}
