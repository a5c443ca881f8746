import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { openDatabase } from '../db/database.ts';
import { migrateToLatest } from '../db/migrate.ts';
import { databaseHasUsers, seedDemo } from '../db/seed/seed-demo.ts';

/** `npm run seed`: migrates and seeds the demo data into an empty database. */
const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const databasePath = process.env.DATABASE_PATH ?? path.join(root, 'data', 'boardwalk.sqlite');
// Where the server keeps stored files (the seeded inspector's signature goes there), as server/index.ts.
const dataDir = path.resolve(process.env.DATA_DIR ?? path.join(root, 'data'));
const { db, sqlite } = openDatabase(databasePath);
await migrateToLatest(db);
if (await databaseHasUsers(db)) {
  console.log(`${databasePath} already has people in it; the demo data goes only into an empty database.`);
} else {
  await seedDemo(db, { dataDir });
  console.log(`Seeded the demo data into ${databasePath}.`);
}
sqlite.close();
