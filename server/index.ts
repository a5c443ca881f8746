import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { createApp, sessionSecretFrom } from './app.ts';
import { openDatabase } from './db/database.ts';
import { migrateToLatest } from './db/migrate.ts';
import { demoAccounts, demoPassword } from './db/seed/demo-scenario.ts';
import { databaseHasUsers, seedDemo } from './db/seed/seed-demo.ts';
import { findUserByEmail } from './db/users.ts';
import { warmUpFonts } from './pdf/fonts.ts';
import { warmUpPdfRenderer } from './pdf/render-job-pdf.ts';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const port = Number(process.env.PORT ?? 3000);
const databasePath = process.env.DATABASE_PATH ?? path.join(root, 'data', 'boardwalk.sqlite');

const { db, sqlite } = openDatabase(databasePath);
const applied = await migrateToLatest(db);
if (applied.length > 0) console.log(`Applied migrations: ${applied.join(', ')}`);

if (!(await databaseHasUsers(db))) {
  await seedDemo(db);
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

const app = createApp({
  db,
  sqlite,
  sessionSecret: process.env.SESSION_SECRET ?? (await sessionSecretFrom(db)),
  clientDir: serveClient ? clientDir : undefined,
  dataDir: process.env.DATA_DIR ?? path.join(root, 'data'),
});

const server = app.listen(port, () => {
  console.log(`Boardwalk is running at http://localhost:${port} (database: ${databasePath})`);
  // Parse the PDF fonts and run the renderer once now, rather than in the first issue's request.
  setImmediate(() => {
    warmUpFonts();
    warmUpPdfRenderer().catch((error: unknown) => console.error('PDF warm-up failed', error));
  });
});

function shutdown() {
  server.close(() => {
    sqlite.close();
    process.exit(0);
  });
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
