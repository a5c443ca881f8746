import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { appServices, createApp, sessionSecretFrom } from './app.ts';
import { openDatabase } from './db/database.ts';
import { migrateToLatest } from './db/migrate.ts';
import { demoAccounts, demoPassword } from './db/seed/demo-scenario.ts';
import { databaseHasUsers, seedDemo } from './db/seed/seed-demo.ts';
import { findUserByEmail } from './db/users.ts';
import { startLocalMailServer, type LocalMailServer } from './mail/local-mail-server.ts';
import { warmUpFonts } from './pdf/fonts.ts';
import { warmUpPdfRenderer } from './pdf/render-job-pdf.ts';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const port = Number(process.env.PORT ?? 3000);
const databasePath = process.env.DATABASE_PATH ?? path.join(root, 'data', 'boardwalk.sqlite');
const dataDir = path.resolve(process.env.DATA_DIR ?? path.join(root, 'data'));

const { db, sqlite } = openDatabase(databasePath);
const applied = await migrateToLatest(db);
if (applied.length > 0) console.log(`Applied migrations: ${applied.join(', ')}`);

if (!(await databaseHasUsers(db))) {
  await seedDemo(db, { dataDir });
  console.log('Seeded the demo data into an empty database.');
}
// The demo sign-ins are printed while the demo accounts exist (they are demo data only).
const demoPresent = await Promise.all(demoAccounts.map((a) => findUserByEmail(db, a.email)));
if (demoPresent.some(Boolean)) {
  console.log(`Demo sign-ins (password for all: ${demoPassword}):`);
  for (const account of demoAccounts) console.log(`  ${account.role.padEnd(8)} ${account.email}`);
}

// `npm start` builds the client first; under `npm run dev` Vite serves it, so dist/ may not exist.
const clientDir = path.join(root, 'dist');
const serveClient = !process.env.BOARDWALK_API_ONLY && fs.existsSync(path.join(clientDir, 'index.html'));
if (!serveClient) console.log('Serving the API only (no built client in dist/; `npm run dev` serves it through Vite).');

// Mail: SMTP_URL in production; otherwise the project's own local mail server, which keeps every
// message under data/mailbox for the admin's mailbox page and delivers nothing onwards.
let localMail: LocalMailServer | null = null;
if (!process.env.SMTP_URL) {
  const wanted = Number(process.env.LOCAL_SMTP_PORT ?? 2525);
  try {
    localMail = await startLocalMailServer({ dir: path.join(dataDir, 'mailbox'), port: wanted });
  } catch (error) {
    // Another Boardwalk (or anything) has the port: take a free one rather than not starting.
    if ((error as NodeJS.ErrnoException).code !== 'EADDRINUSE') throw error;
    localMail = await startLocalMailServer({ dir: path.join(dataDir, 'mailbox'), port: 0 });
  }
  console.log(`No SMTP_URL: e-mail goes to the local mail server on ${localMail.url} (kept in ${path.join(dataDir, 'mailbox')}, delivered nowhere).`);
}

const app = createApp({
  db,
  sqlite,
  sessionSecret: process.env.SESSION_SECRET ?? (await sessionSecretFrom(db)),
  clientDir: serveClient ? clientDir : undefined,
  dataDir,
  smtpUrl: process.env.SMTP_URL ?? localMail?.url,
  mailFrom: process.env.MAIL_FROM,
  localMailPort: localMail?.port ?? null,
});
// E-mail left waiting (or cut off mid-send) by the last run.
await appServices(app).mailSender.resume();

const server = app.listen(port, () => {
  console.log(`Boardwalk is running at http://localhost:${port} (database: ${databasePath})`);
  // Parse the PDF fonts and run the renderer once now, rather than in the first issue's request.
  setImmediate(() => {
    warmUpFonts();
    warmUpPdfRenderer().catch((error: unknown) => console.error('PDF warm-up failed', error));
  });
});

function shutdown() {
  server.close(async () => {
    await localMail?.close();
    await appServices(app).mailSender.idle();
    sqlite.close();
    process.exit(0);
  });
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
