import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Server } from 'node:http';
import { chromium, type Browser } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { createApp, sessionSecretFrom } from '../../server/app.ts';
import { openDatabase, type DB } from '../../server/db/database.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { seedDemo } from '../../server/db/seed/seed-demo.ts';
import { startLocalMailServer } from '../../server/mail/local-mail-server.ts';
import { listen } from './test-app.ts';

export const chromiumPath = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/** Flags that keep Debian's chromium quiet on a machine with no outside network. */
export const chromiumArgs = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export function launchBrowser(): Promise<Browser> {
  if (!fs.existsSync(chromiumPath)) {
    throw new Error(`No chromium at ${chromiumPath}. Install it with: apt-get install -y chromium`);
  }
  return chromium.launch({ executablePath: chromiumPath, args: chromiumArgs });
}

export interface DemoServer {
  url: string;
  /** The data folder: stored files under files/, the local mail server's messages under mailbox/. */
  dataDir: string;
  db: DB;
  server: Server;
  close(): Promise<void>;
}

/**
 * The real app with the built client (run `vite build` first) over a fresh SQLite file seeded
 * with the demo data, on an ephemeral port.
 */
export async function startDemoServer(): Promise<DemoServer> {
  const clientDir = path.resolve('dist');
  if (!fs.existsSync(path.join(clientDir, 'index.html'))) throw new Error('Build the client first: npx vite build');
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'boardwalk-e2e-'));
  const { db, sqlite } = openDatabase(path.join(dir, 'test.sqlite'));
  await migrateToLatest(db);
  await seedDemo(db, { dataDir: dir });
  // The project's own mail server, as `npm start` runs it without SMTP_URL, on a free port.
  const mail = await startLocalMailServer({ dir: path.join(dir, 'mailbox'), port: 0 });
  const app = createApp({
    db,
    sqlite,
    sessionSecret: await sessionSecretFrom(db),
    clientDir,
    signInAttemptsPerMinute: 1000,
    dataDir: dir,
    smtpUrl: mail.url,
    localMailPort: mail.port,
  });
  const { server, url } = await listen(app);
  return {
    url,
    dataDir: dir,
    db,
    server,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(async () => {
          await mail.close();
          sqlite.close();
          fs.rmSync(dir, { recursive: true, force: true });
          resolve();
        });
      }),
  };
}

export const demoTester = { email: 'tester@boardwalk.test', password: 'boardwalk-demo' };
export const demoReviewer = { email: 'reviewer@boardwalk.test', password: 'boardwalk-demo' };
export const demoAdmin = { email: 'admin@boardwalk.test', password: 'boardwalk-demo' };

/**
 * Starts the demo server and chromium once for a test file (beforeAll) and stops both after it
 * (afterAll). Read `server` and `browser` inside tests, not at the top of the file.
 */
export function useDemoServerAndBrowser(): { readonly server: DemoServer; readonly browser: Browser } {
  const handles = {} as { server: DemoServer; browser: Browser };
  beforeAll(async () => {
    handles.server = await startDemoServer();
    handles.browser = await launchBrowser();
  });
  afterAll(async () => {
    await handles.browser?.close();
    await handles.server?.close();
  });
  return handles;
}
