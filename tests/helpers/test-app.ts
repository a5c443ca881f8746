import crypto from 'node:crypto';
import fs from 'node:fs';
import type { Server } from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { AddressInfo } from 'node:net';
import bcrypt from 'bcryptjs';
import express, { type Express } from 'express';
import pg from 'pg';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { openDatabase, openPostgres, type DB } from '../../server/db/database.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import type { PresenceTracker } from '../../server/presence.ts';

export const password = 'correct horse battery';

export interface TestApp {
  db: DB;
  /**
   * The app as its own pages call it: a change that names no origin gets the app's own origin, and
   * a bodiless change gets `Content-Type: application/json` (as src/lib/api-client.ts sends).
   * Tests of those checks use `rawApp`.
   */
  app: Express;
  /** The app exactly as `createApp` made it. */
  rawApp: Express;
  ids: { admin: number; tester: number; tester2: number; reviewer: number; site: number; job: number; board: number };
  /** The app's data folder (stored files, the mailbox): a fresh temporary folder, removed by `close()`. */
  dataDir: string;
  /** A supertest agent signed in as one of the accounts (cookies kept). */
  signIn(role: 'admin' | 'tester' | 'tester2' | 'reviewer'): Promise<ReturnType<typeof request.agent>>;
  /** On PostgreSQL (BOARDWALK_TEST_DATABASE_URL): the URL of this app's own database. */
  postgres?: { url: string };
  close(): Promise<void>;
}

/**
 * Set (by .ci/run, or by hand) to a PostgreSQL server's URL, the server tests run there instead of
 * in-memory SQLite: each test app gets a fresh database of its own, dropped by `close()`.
 */
export const testPostgresUrl = process.env.BOARDWALK_TEST_DATABASE_URL || undefined;

/** Runs statements on the test server outside any app (creating and dropping databases). */
async function onTestServer<T>(work: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: testPostgresUrl });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

function databaseUrl(name: string): string {
  const url = new URL(testPostgresUrl!);
  url.pathname = `/${name}`;
  return url.toString();
}

const migrationsDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../migrations');

/** Every file under migrations/ (names and contents), so a changed migration makes a new template. */
function migrationsFingerprint(): string {
  const hash = crypto.createHash('sha256');
  const walk = (dir: string) => {
    for (const entry of fs.readdirSync(dir, { withFileTypes: true }).sort((a, b) => a.name.localeCompare(b.name))) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else hash.update(`${path.relative(migrationsDir, full)}\0`).update(fs.readFileSync(full)).update('\0');
    }
  };
  walk(migrationsDir);
  return hash.digest('hex').slice(0, 16);
}

let template: Promise<string> | undefined;

/**
 * A database with every migration applied, made once per set of migrations (the first test worker
 * to need it builds it under an advisory lock; the others wait and reuse it). Each test app is then
 * a copy (`create database … template …`, ≈ 60 ms) rather than a fresh migration (≈ 300 ms).
 */
function migratedTemplate(): Promise<string> {
  return (template ??= onTestServer(async (client) => {
    const name = `boardwalk_template_${migrationsFingerprint()}`;
    await client.query('select pg_advisory_lock(hashtext($1))', [name]);
    const exists = (await client.query('select 1 from pg_database where datname = $1', [name])).rowCount;
    if (!exists) {
      // Built under another name and renamed when complete, so a failed build is never copied.
      const building = `${name}_building`;
      await client.query(`drop database if exists ${building} with (force)`);
      await client.query(`create database ${building}`);
      const { db, pool } = openPostgres(databaseUrl(building), { max: 1 });
      try {
        await migrateToLatest(db);
      } finally {
        await pool.end();
      }
      await client.query(`alter database ${building} rename to ${name}`);
    }
    // Databases left by test processes that have ended (a run cut short): dropped while here.
    const leftovers = await client.query<{ datname: string }>(`select datname from pg_database where datname like 'boardwalk_test_%'`);
    for (const { datname } of leftovers.rows) {
      const pid = Number(/^boardwalk_test_(\d+)_/.exec(datname)?.[1]);
      if (pid && !processIsAlive(pid)) await client.query(`drop database if exists ${datname} with (force)`);
    }
    await client.query('select pg_advisory_unlock(hashtext($1))', [name]);
    return name;
  }));
}

function processIsAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** Test databases of this process that a closed app left empty, ready for the next app. */
const emptiedDatabases: string[] = [];

/**
 * Empties a test database for the next app of this process (cheaper than a new copy): every row
 * deleted and every id sequence restarted, with triggers (the append-only refusals, and the foreign
 * keys, which PostgreSQL checks with triggers) switched off for this transaction only.
 */
async function emptyDatabase(pool: pg.Pool): Promise<void> {
  const client = await pool.connect();
  try {
    const tables = (
      await client.query<{ name: string }>(`select tablename as name from pg_tables where schemaname = current_schema() and tablename not like 'kysely\\_%'`)
    ).rows.map((r) => `"${r.name}"`);
    await client.query('begin');
    await client.query('set local session_replication_role = replica');
    await client.query(tables.map((t) => `delete from ${t};`).join(' '));
    const sequences = await client.query<{ seq: string | null }>(
      `select pg_get_serial_sequence(format('%I', c.table_name), 'id') as seq from information_schema.columns c where c.table_schema = current_schema() and c.column_name = 'id' and c.table_name not like 'kysely\\_%'`,
    );
    for (const { seq } of sequences.rows) if (seq) await client.query('select setval($1, 1, false)', [seq]);
    await client.query('commit');
  } catch (error) {
    await client.query('rollback').catch(() => undefined);
    throw error;
  } finally {
    client.release();
  }
}

/**
 * A fresh, migrated database for a test that builds its own app or seeds its own data: in-memory
 * SQLite, or (BOARDWALK_TEST_DATABASE_URL) a PostgreSQL database of its own. `close()` ends it.
 */
export async function openTestDatabase() {
  if (!testPostgresUrl) {
    const { db, sqlite } = openDatabase(':memory:');
    await migrateToLatest(db);
    return {
      db,
      sqlite,
      pool: undefined,
      postgres: undefined,
      close: async () => {
        sqlite.close();
      },
    };
  }
  const templateName = await migratedTemplate();
  let name = emptiedDatabases.pop();
  if (!name) {
    name = `boardwalk_test_${process.pid}_${crypto.randomBytes(6).toString('hex')}`;
    const created = name;
    await onTestServer((client) => client.query(`create database ${created} template ${templateName}`));
  }
  const url = databaseUrl(name);
  const { db, pool } = openPostgres(url, { max: 4 });
  let closing: Promise<void> | undefined;
  return {
    db,
    sqlite: undefined,
    pool,
    postgres: { url },
    // Some tests close an app twice (a test's own close and afterEach): the second waits for the first.
    close: () =>
      (closing ??= (async () => {
        const emptied = await emptyDatabase(pool).then(
          () => true,
          () => false,
        );
        await pool.end();
        if (emptied) emptiedDatabases.push(name);
        else await onTestServer((client) => client.query(`drop database ${name} with (force)`));
      })()),
  };
}

/**
 * A fresh in-memory database with one person per role, one site, job and open board of three
 * circuits, and the app over it. Small invented fixture, not the demo data.
 */
export async function createTestApp(options: { presence?: PresenceTracker; smtpUrl?: string; dataDir?: string } = {}): Promise<TestApp> {
  const opened = await openTestDatabase();
  const { db, sqlite } = opened;
  const hash = bcrypt.hashSync(password, 4);
  const insertUser = async (email: string, name: string, role: 'admin' | 'tester' | 'reviewer') =>
    (await db.insertInto('users').values({ email, name, role, password_hash: hash }).returning('id').executeTakeFirstOrThrow()).id;
  const admin = await insertUser('admin@test.example', 'Ada Admin', 'admin');
  const tester = await insertUser('tester@test.example', 'Tom Tester', 'tester');
  const tester2 = await insertUser('tester2@test.example', 'Tess Second', 'tester');
  const reviewer = await insertUser('reviewer@test.example', 'Rhea Reviewer', 'reviewer');
  const site = (
    await db.insertInto('sites').values({ client: 'Test client', address: '1 Test Row', earthing: 'TN-C-S', ze_ohm: 0.2, pfc_ka: 1.6 }).returning('id').executeTakeFirstOrThrow()
  ).id;
  const job = (
    await db.insertInto('jobs').values({ site_id: site, kind: 'EICR', reference: 'T-1', visit_date: '2026-12-01' }).returning('id').executeTakeFirstOrThrow()
  ).id;
  const board = (
    await db.insertInto('boards').values({ job_id: job, reference: 'DB1', phases: 1, zdb_ohm: 0.25, ipf_ka: 1.5, locked_by: null, locked_at: null }).returning('id').executeTakeFirstOrThrow()
  ).id;
  const circuit = (position: number, number: string, description: string, kind: 'ring' | 'radial') => ({
    board_id: board, position, number, description, kind, phase: null, points: 6, live_csa_mm2: kind === 'ring' ? 2.5 : 1.5,
    cpc_csa_mm2: 1.5, max_disconnection_s: 0.4, device_standard: '60898', device_type: 'B', rating_a: kind === 'ring' ? 32 : 6,
    breaking_ka: 6, rcd_type: 'A' as const, rcd_rated_residual_ma: 30, afdd: null, spur_ring_id: null, spur_origin_point: null, spur_length_m: null,
  });
  await db.insertInto('circuits').values([circuit(1, '1', 'Sockets', 'ring'), circuit(2, '2', 'Lights', 'radial'), circuit(3, '3', 'Lights upstairs', 'radial')]).execute();

  const dataDir = options.dataDir ?? fs.mkdtempSync(path.join(os.tmpdir(), 'boardwalk-test-'));
  const rawApp = createApp({
    db,
    sqlite,
    postgres: opened.pool,
    sessionSecret: 'test-secret',
    signInAttemptsPerMinute: 1000,
    presence: options.presence,
    dataDir,
    smtpUrl: options.smtpUrl,
  });
  const app = asOwnPage(rawApp);
  const emails = { admin: 'admin@test.example', tester: 'tester@test.example', tester2: 'tester2@test.example', reviewer: 'reviewer@test.example' };
  return {
    db,
    app,
    rawApp,
    ids: { admin, tester, tester2, reviewer, site, job, board },
    dataDir,
    postgres: opened.postgres,
    async signIn(role) {
      const agent = request.agent(app);
      const res = await agent.post('/api/auth/sign-in').send({ email: emails[role], password });
      if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
      return agent;
    },
    close: async () => {
      await opened.close();
      if (!options.dataDir) fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/** Wraps an app so requests look like those of its own pages (see `TestApp.app`). */
export function asOwnPage(inner: Express): Express {
  const outer = express();
  outer.use((req, _res, next) => {
    if (!['GET', 'HEAD', 'OPTIONS'].includes(req.method)) {
      const h = req.headers;
      if (h.origin === undefined && h.referer === undefined && h.host) h.origin = `http://${h.host}`;
      const bodiless = (h['content-length'] === undefined || h['content-length'] === '0') && h['transfer-encoding'] === undefined;
      if (bodiless && h['content-type'] === undefined) h['content-type'] = 'application/json';
    }
    next();
  });
  outer.use(inner);
  // What createApp left for the process (appServices: file store, mail sender) stays reachable.
  Object.assign(outer.locals, inner.locals);
  return outer;
}

/** Starts an app on an ephemeral port (for browser tests). */
export function listen(app: ReturnType<typeof createApp>): Promise<{ server: Server; url: string }> {
  return new Promise((resolve) => {
    const server = app.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as AddressInfo;
      resolve({ server, url: `http://127.0.0.1:${port}` });
    });
  });
}
