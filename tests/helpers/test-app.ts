import fs from 'node:fs';
import type { Server } from 'node:http';
import os from 'node:os';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import bcrypt from 'bcryptjs';
import express, { type Express } from 'express';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { openDatabase, type DB } from '../../server/db/database.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { Presence } from '../../server/presence.ts';

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
  close(): void;
}

/**
 * A fresh in-memory database with one person per role, one site, job and open board of three
 * circuits, and the app over it. Small invented fixture, not the demo data.
 */
export async function createTestApp(options: { presence?: Presence; smtpUrl?: string; dataDir?: string } = {}): Promise<TestApp> {
  const { db, sqlite } = openDatabase(':memory:');
  await migrateToLatest(db);
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
    async signIn(role) {
      const agent = request.agent(app);
      const res = await agent.post('/api/auth/sign-in').send({ email: emails[role], password });
      if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
      return agent;
    },
    close: () => {
      sqlite.close();
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
