import fs from 'node:fs';
import path from 'node:path';
import SQLite from 'better-sqlite3';
import {
  CompiledQuery,
  Kysely,
  PostgresDialect,
  PostgresDriver,
  SqliteDialect,
  type DatabaseConnection,
  type Driver,
  type PostgresDialectConfig,
  type SqliteDatabase,
  type TransactionSettings,
} from 'kysely';
import pg from 'pg';
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

/** True when DATABASE_URL names a PostgreSQL server (`postgres://…` or `postgresql://…`). */
export function isPostgresUrl(url: string | undefined): url is string {
  return !!url && /^postgres(ql)?:\/\//i.test(url);
}

export interface OpenedPostgres {
  db: DB;
  /** The pool, shared with the session store so sessions live in the same database. */
  pool: pg.Pool;
}

// Counts (`count(*)`) come back as int8 and averages as numeric, which pg hands over as strings to
// keep their full precision; Boardwalk's counts and sums stay far below 2^53, so read them as
// numbers, as better-sqlite3 does.
pg.types.setTypeParser(pg.types.builtins.INT8, (text) => Number(text));
pg.types.setTypeParser(pg.types.builtins.NUMERIC, (text) => Number(text));

/**
 * Write transactions take one lock per database schema at their start, so they run one at a time,
 * as on SQLite (one writer at a time; Kysely's SQLite driver runs everything on one connection):
 * - the routes read a version and then write inside a transaction (the 409 on a stale edit); at
 *   PostgreSQL's default isolation two such transactions could both pass the check;
 * - the live feed's cursor is the last history id seen: ids come from a sequence before commit, so
 *   without the lock a later id could commit first and a poller would step over the earlier one.
 * Reads outside transactions are not held up. The lock is transaction-scoped (released at commit or
 * rollback) and shared by every instance on the same database: that is what makes several
 * instances behave like one.
 */
class OneWriterAtATimeDriver extends PostgresDriver {
  override async beginTransaction(connection: DatabaseConnection, settings: TransactionSettings): Promise<void> {
    await super.beginTransaction(connection, settings);
    await connection.executeQuery(CompiledQuery.raw(`select pg_advisory_xact_lock(hashtext('boardwalk writes ' || current_schema()))`));
  }
}

class BoardwalkPostgresDialect extends PostgresDialect {
  constructor(private readonly pgConfig: PostgresDialectConfig) {
    super(pgConfig);
  }
  override createDriver(): Driver {
    return new OneWriterAtATimeDriver(this.pgConfig);
  }
}

/**
 * Opens a PostgreSQL database (DATABASE_URL). The tables live in the connection's current schema
 * (`public` unless the URL or the role says otherwise).
 */
export function openPostgres(url: string, options: { max?: number } = {}): OpenedPostgres {
  const pool = new pg.Pool({ connectionString: url, max: options.max ?? 10 });
  // An idle client losing its connection (the server restarted) must not end the process.
  pool.on('error', (error) => console.error('PostgreSQL pool:', error.message));
  const db = new Kysely<Database>({ dialect: new BoardwalkPostgresDialect({ pool }) });
  return { db, pool };
}
