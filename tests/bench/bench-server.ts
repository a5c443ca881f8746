/**
 * The app alone in its own process for `server.bench.ts`, so the server's CPU time can be read
 * apart from the load generator's: `tsx tests/bench/bench-server.ts <sqlite file>` prints
 * "listening <port>" and serves until killed.
 */
import path from 'node:path';
import { createApp, sessionSecretFrom } from '../../server/app.ts';
import { openDatabase } from '../../server/db/database.ts';
import { listen } from '../helpers/test-app.ts';

const file = process.argv[2];
if (!file) throw new Error('usage: bench-server.ts <sqlite file>');
const { db, sqlite } = openDatabase(file);
const app = createApp({ db, sqlite, sessionSecret: await sessionSecretFrom(db), clientDir: path.resolve('dist'), signInAttemptsPerMinute: 100_000 });
const { url } = await listen(app);
console.log(`listening ${new URL(url).port}`);
process.on('SIGTERM', () => process.exit(0));
