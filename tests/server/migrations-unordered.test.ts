import { sql } from 'kysely';
import { describe, expect, it } from 'vitest';
import { openDatabase } from '../../server/db/database.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';

describe('migrations that land out of order', () => {
  it('when a database already ran a later-named migration, then an earlier-named one that arrives later still runs', async () => {
    const { db, sqlite } = openDatabase(':memory:');
    try {
      await migrateToLatest(db);
      // As a database migrated before the cable length migration landed (it ran 0300 already).
      await db.schema.alterTable('circuits').dropColumn('cable_length_m').execute();
      await sql`delete from kysely_migration where name = '2026-12-02T0220-circuit-cable-length'`.execute(db);
      expect(await migrateToLatest(db)).toEqual(['2026-12-02T0220-circuit-cable-length']);
      const columns = await sql<{ name: string }>`select name from pragma_table_info('circuits')`.execute(db);
      expect(columns.rows.map((r) => r.name)).toContain('cable_length_m');
    } finally {
      sqlite.close();
    }
  });
});
