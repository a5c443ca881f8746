import { PostgresAdapter, sql, type ColumnDefinitionBuilder, type Kysely, type RawBuilder } from 'kysely';

/**
 * The few places where one schema, written once with Kysely's schema builder, needs different SQL
 * on SQLite (the embedded default) and on PostgreSQL (DATABASE_URL). Migrations read the dialect
 * from the Kysely instance they are given, so they import nothing from server/ or shared/. This
 * folder holds no migrations (the provider reads only the .ts files directly in migrations/).
 * On SQLite every helper gives exactly the SQL the migrations were first written with.
 */

/** True when the migration runs on PostgreSQL. */
export function onPostgres(db: Kysely<any>): boolean {
  return db.getExecutor().adapter instanceof PostgresAdapter;
}

/**
 * A surrogate key. SQLite: `integer primary key autoincrement` (ids are never reused). PostgreSQL
 * has no `autoincrement` keyword: an identity column, whose sequence never reuses ids either.
 */
export function idKey(db: Kysely<any>) {
  const postgres = onPostgres(db);
  return (c: ColumnDefinitionBuilder) => (postgres ? c.primaryKey().generatedByDefaultAsIdentity() : c.primaryKey().autoIncrement());
}

/**
 * A decimal reading or rating. SQLite's `real` is an 8-byte float; PostgreSQL's `real` is 4 bytes
 * (0.2 would come back as 0.200000003), so there it is `double precision`.
 */
export function realType(db: Kysely<any>): 'real' | 'double precision' {
  return onPostgres(db) ? 'double precision' : 'real';
}

/**
 * "Now" as ISO 8601 text in UTC with milliseconds (`2026-12-02T08:15:00.123Z`, as
 * `Date.toISOString()` writes it), for a column default. SQLite has strftime; PostgreSQL has
 * to_char (`now()` there is the transaction's start).
 */
export function nowText(db: Kysely<any>): RawBuilder<string> {
  return onPostgres(db)
    ? sql<string>`(to_char(now() at time zone 'utc', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"'))`
    : sql<string>`(strftime('%Y-%m-%dT%H:%M:%fZ', 'now'))`;
}

/**
 * Makes a table append-only: updates and deletes are refused by the database itself. SQLite: two
 * triggers that raise. PostgreSQL triggers call a function, so one small function (made here, once
 * per schema) raises the message given; a statement trigger also refuses TRUNCATE, which row
 * triggers do not see.
 */
export async function appendOnly(db: Kysely<any>, table: string, message: string): Promise<void> {
  if (!onPostgres(db)) {
    await sql`create trigger ${sql.raw(`${table}_no_update`)} before update on ${sql.table(table)}
    begin select raise(abort, ${sql.lit(message)}); end`.execute(db);
    await sql`create trigger ${sql.raw(`${table}_no_delete`)} before delete on ${sql.table(table)}
    begin select raise(abort, ${sql.lit(message)}); end`.execute(db);
    return;
  }
  await sql`create or replace function refuse_change() returns trigger language plpgsql as $$
    begin raise exception '%', tg_argv[0] using errcode = 'restrict_violation'; end $$`.execute(db);
  await sql`create trigger ${sql.raw(`${table}_no_update`)} before update or delete on ${sql.table(table)}
    for each row execute function refuse_change(${sql.lit(message)})`.execute(db);
  await sql`create trigger ${sql.raw(`${table}_no_truncate`)} before truncate on ${sql.table(table)}
    for each statement execute function refuse_change(${sql.lit(message)})`.execute(db);
}
