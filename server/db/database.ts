import fs from 'node:fs';
import path from 'node:path';
import SQLite from 'better-sqlite3';
import { Kysely, SqliteDialect } from 'kysely';
import type { Database } from './types.ts';

export type DB = Kysely<Database>;

export interface OpenedDatabase {
  db: DB;
  /** The raw handle, shared with the session store so sessions live in the same file. */
  sqlite: SQLite.Database;
}

/**
 * Opens the SQLite file (":memory:" for tests) with WAL and foreign keys on.
 */
export function openDatabase(file: string): OpenedDatabase {
  if (file !== ':memory:') fs.mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  const sqlite = new SQLite(file);
  if (file !== ':memory:') sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  const db = new Kysely<Database>({ dialect: new SqliteDialect({ database: sqlite }) });
  return { db, sqlite };
}
