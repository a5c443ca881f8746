import fs from 'node:fs';
import path from 'node:path';
import SQLite from 'better-sqlite3';
import { Kysely, SqliteDialect, type SqliteDatabase } from 'kysely';
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
  const db = new Kysely<Database>({ dialect: new SqliteDialect({ database: withStatementCache(sqlite) }) });
  return { db, sqlite };
}

/**
 * Kysely prepares every query's SQL anew; preparing cost as much as running for the small queries
 * of a cell write. The same SQL text reuses its prepared statement (least recently used dropped
 * beyond `size`). Safe because Kysely's SQLite driver runs one query at a time and reads each
 * statement's rows at once (`all`).
 */
export function withStatementCache(sqlite: SQLite.Database, size = 500): SqliteDatabase {
  const statements = new Map<string, SQLite.Statement>();
  return {
    close: () => sqlite.close(),
    prepare(sql: string) {
      let statement = statements.get(sql);
      if (statement) {
        statements.delete(sql);
      } else {
        statement = sqlite.prepare(sql);
        if (statements.size >= size) statements.delete(statements.keys().next().value!);
      }
      statements.set(sql, statement);
      return statement;
    },
  };
}
