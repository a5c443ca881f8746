import type { Kysely } from 'kysely';

/**
 * People can be deactivated (their account stays, with their name on everything they did, but
 * they can no longer sign in), and every person's sign-ins carry a generation: changing the
 * password or deactivating raises it, which ends every session made under the old one.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('users').addColumn('deactivated_at', 'text').execute();
  await db.schema.alterTable('users').addColumn('deactivated_by', 'integer', (c) => c.references('users.id')).execute();
  await db.schema.alterTable('users').addColumn('session_generation', 'integer', (c) => c.notNull().defaultTo(0)).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const column of ['session_generation', 'deactivated_by', 'deactivated_at']) {
    await db.schema.alterTable('users').dropColumn(column).execute();
  }
}
