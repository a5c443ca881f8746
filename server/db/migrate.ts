import fs from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Migrator, PostgresAdapter, sql, type Migration, type MigrationProvider } from 'kysely';
import type { DB } from './database.ts';

const migrationsDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../migrations');

/**
 * Loads the files in migrations/ with our own `import()`, so it works under tsx and under Vitest
 * alike (Kysely's FileMigrationProvider imports from inside node_modules, which Vitest bypasses).
 */
class MigrationFolderProvider implements MigrationProvider {
  async getMigrations(): Promise<Record<string, Migration>> {
    const files = (await fs.readdir(migrationsDir)).filter((f) => /\.ts$/.test(f) && !f.endsWith('.d.ts')).sort();
    const migrations: Record<string, Migration> = {};
    for (const file of files) {
      const mod = (await import(pathToFileURL(path.join(migrationsDir, file)).href)) as Migration;
      migrations[file.replace(/\.ts$/, '')] = mod;
    }
    return migrations;
  }
}

/** Runs every pending migration; throws with the failing migration's name if one fails. */
export async function migrateToLatest(db: DB): Promise<string[]> {
  // Helpers land migrations with timestamps reserved in advance, so one may arrive after a later-named
  // one has already run on an existing database: run it anyway (each is an independent change).
  // On PostgreSQL the migrator's own tables go in the schema the app works in: left unnamed, it looks
  // for them in every schema of the database and could find another schema's.
  const migrationTableSchema =
    db.getExecutor().adapter instanceof PostgresAdapter ? (await sql<{ schema: string }>`select current_schema() as schema`.execute(db)).rows[0]?.schema : undefined;
  const migrator = new Migrator({ db, provider: new MigrationFolderProvider(), allowUnorderedMigrations: true, migrationTableSchema });
  const { error, results } = await migrator.migrateToLatest();
  const failed = results?.find((r) => r.status === 'Error');
  if (error) {
    const name = failed ? ` (${failed.migrationName})` : '';
    throw new Error(`Database migration failed${name}: ${error instanceof Error ? error.message : String(error)}`);
  }
  return (results ?? []).filter((r) => r.status === 'Success').map((r) => r.migrationName);
}
