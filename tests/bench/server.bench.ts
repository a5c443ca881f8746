/**
 * Server benchmark (`npm run bench:server`, after `vite build`): what the server's cost follows.
 *
 * The app runs in a child process over a temporary SQLite file seeded with the demo data plus a
 * generated 300-way board (the 64-way demo board's circuits and readings repeated); its CPU time is
 * read from /proc/<pid>/stat (10 ms ticks), so the load generator's own work is not counted.
 *
 * 1. Write rate: 8 typists write cells as fast as answers come for a few seconds each on the 64-way
 *    and the 300-way board, beside the trivial `GET /api/auth/me` under the same load. Printed:
 *    requests/s, p50/p99 latency, server CPU per request. Target: writes/s at 300 ways
 *    ≥ 0.4 × the trivial route's.
 * 2. Idle poll: `GET /changes` with the newest cursor, nothing changing. Target: ≤ 1 ms of server
 *    CPU per poll at 300 ways. Also the size of a poll that brings one change.
 * 3. Cell history popup at 2 million history rows, with the index and without it. Target ≤ 5 ms.
 * 4. JavaScript per page as it crosses the wire (brotli/gzip as a browser accepts), from the
 *    build's manifest.
 *
 * Figures are printed with pass/miss; the script never fails on a miss.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { openDatabase } from '../../server/db/database.ts';
import { cellHistory } from '../../server/db/history.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { demoAccounts, demoPassword } from '../../server/db/seed/demo-scenario.ts';
import { seedDemo } from '../../server/db/seed/seed-demo.ts';
import { addRepeatedBoard } from '../helpers/big-board.ts';

const TYPISTS = 8;
const SECONDS = Number(process.env.BENCH_SECONDS ?? 4);
const tick = 1000 / 100; // ms per clock tick on Linux (USER_HZ)

const pct = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? NaN;
const fmt = (n: number, d = 1) => n.toFixed(d);
const mark = (ok: boolean) => (ok ? 'pass' : 'MISS');

// ---------- database ----------

async function prepareDatabase(file: string): Promise<{ demoBoardId: number; bigBoardId: number }> {
  const { db } = openDatabase(file);
  await migrateToLatest(db);
  await seedDemo(db, { dataDir: path.dirname(file) });
  const { boardId, fromBoardId } = await addRepeatedBoard(db, 300);
  await db.destroy();
  return { demoBoardId: fromBoardId, bigBoardId: boardId };
}

// ---------- child server ----------

async function startServer(file: string): Promise<{ child: ChildProcess; base: string }> {
  const profile = process.env.BENCH_CPU_PROFILE ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_CPU_PROFILE}`] : [];
  const child = spawn(process.execPath, [...profile, '--import', 'tsx', 'tests/bench/bench-server.ts', file], { stdio: ['ignore', 'pipe', 'inherit'] });
  const port = await new Promise<number>((resolve, reject) => {
    child.stdout!.on('data', (d: Buffer) => {
      const m = /listening (\d+)/.exec(d.toString());
      if (m) resolve(Number(m[1]));
    });
    child.on('exit', (code) => reject(new Error(`bench server exited (${code})`)));
  });
  return { child, base: `http://127.0.0.1:${port}` };
}

function cpuMs(pid: number): number {
  const fields = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  return (Number(fields[11]) + Number(fields[12])) * tick; // utime + stime
}

// ---------- HTTP ----------

const agent = new http.Agent({ keepAlive: true, maxSockets: 64 });

function call(base: string, method: string, url: string, cookie: string, body?: unknown, extra: Record<string, string> = {}) {
  return new Promise<{ status: number; text: string; bytes: number; headers: http.IncomingHttpHeaders }>((resolve, reject) => {
    const data = method === 'GET' ? undefined : JSON.stringify(body ?? {});
    const req = http.request(`${base}${url}`, {
      method,
      agent,
      headers: {
        cookie,
        origin: base,
        ...(data === undefined ? {} : { 'content-type': 'application/json', 'content-length': Buffer.byteLength(data) }),
        ...extra,
      },
    }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => {
        const buf = Buffer.concat(chunks);
        resolve({ status: res.statusCode ?? 0, text: res.headers['content-encoding'] ? '' : buf.toString(), bytes: buf.length, headers: res.headers });
      });
    });
    req.on('error', reject);
    if (data !== undefined) req.write(data);
    req.end();
  });
}

async function signIn(base: string, email: string): Promise<string> {
  const res = await call(base, 'POST', '/api/auth/sign-in', '', { email, password: demoPassword });
  if (res.status !== 200) throw new Error(`sign-in ${res.status} ${res.text}`);
  return String(res.headers['set-cookie']?.[0] ?? '').split(';')[0]!;
}

interface LoadResult { perSecond: number; p50: number; p99: number; cpuPerRequest: number; errors: number }

async function load(pid: number, seconds: number, typists: number, one: (typist: number) => Promise<number>): Promise<LoadResult> {
  const latencies: number[] = [];
  let errors = 0;
  const end = performance.now() + seconds * 1000;
  const cpu0 = cpuMs(pid);
  const t0 = performance.now();
  await Promise.all(
    Array.from({ length: typists }, async (_, typist) => {
      while (performance.now() < end) {
        const start = performance.now();
        const status = await one(typist);
        if (status >= 400) errors++;
        latencies.push(performance.now() - start);
      }
    }),
  );
  const elapsed = (performance.now() - t0) / 1000;
  const cpu = cpuMs(pid) - cpu0;
  latencies.sort((a, b) => a - b);
  return { perSecond: latencies.length / elapsed, p50: pct(latencies, 50), p99: pct(latencies, 99), cpuPerRequest: cpu / latencies.length, errors };
}

function printLoad(name: string, r: LoadResult) {
  console.log(`  ${name.padEnd(34)} ${fmt(r.perSecond, 0).padStart(6)} req/s   p50 ${fmt(r.p50).padStart(6)} ms   p99 ${fmt(r.p99).padStart(6)} ms   server CPU ${fmt(r.cpuPerRequest, 2).padStart(5)} ms/req${r.errors ? `   (${r.errors} errors)` : ''}`);
}

// ---------- scenarios ----------

async function writeRates(base: string, pid: number, demoBoardId: number, bigBoardId: number) {
  console.log(`\n1. Write rate: ${TYPISTS} typists, ${SECONDS} s each`);
  const cookies = await Promise.all(Array.from({ length: TYPISTS }, () => signIn(base, demoAccounts.find((a) => a.role === 'tester')!.email)));
  const me = await load(pid, SECONDS, TYPISTS, async (t) => (await call(base, 'GET', '/api/auth/me', cookies[t]!)).status);
  printLoad('GET /api/auth/me (trivial)', me);
  const results: Record<number, LoadResult> = {};
  for (const boardId of [demoBoardId, bigBoardId]) {
    const board = JSON.parse((await call(base, 'GET', `/api/boards/${boardId}`, cookies[0]!)).text) as { circuits: { id: number; cells: Record<string, { version: number } | undefined> }[] };
    const targets = Array.from({ length: TYPISTS }, (_, t) => board.circuits[Math.floor(((t + 0.5) * board.circuits.length) / TYPISTS)]!);
    const versions = targets.map((c) => c.cells.zs?.version ?? 0);
    let n = 0;
    results[boardId] = await load(pid, SECONDS, TYPISTS, async (t) => {
      const text = `0.${String(10 + (n++ % 80))}`;
      const res = await call(base, 'PUT', `/api/boards/${boardId}/circuits/${targets[t]!.id}/cells/zs`, cookies[t]!, { text, version: versions[t] });
      if (res.status === 200) versions[t] = (JSON.parse(res.text) as { cell: { version: number } }).cell.version;
      return res.status;
    });
    printLoad(`PUT a cell, ${board.circuits.length}-way board`, results[boardId]!);
  }
  const ratio = results[bigBoardId]!.perSecond / me.perSecond;
  console.log(`  ratio writes/s at 300 ways ÷ trivial route: ${fmt(ratio, 2)} (target ≥ 0.40: ${mark(ratio >= 0.4)})`);
}

async function idlePoll(base: string, pid: number, bigBoardId: number) {
  console.log('\n2. Idle poll of the changes feed, 300-way board');
  const cookie = await signIn(base, demoAccounts.find((a) => a.role === 'reviewer')!.email);
  const first = JSON.parse((await call(base, 'GET', `/api/boards/${bigBoardId}`, cookie)).text) as { cursor: number; circuits: { id: number; cells: Record<string, { version: number } | undefined> }[] };
  const polls = 400;
  const cpu0 = cpuMs(pid);
  const t0 = performance.now();
  for (let i = 0; i < polls; i++) await call(base, 'GET', `/api/boards/${bigBoardId}/changes?after=${first.cursor}`, cookie);
  const wall = (performance.now() - t0) / polls;
  const perPoll = (cpuMs(pid) - cpu0) / polls;
  console.log(`  idle poll: server CPU ${fmt(perPoll, 2)} ms/poll, ${fmt(wall, 2)} ms round trip (target ≤ 1 ms CPU: ${mark(perPoll <= 1)}); one console polling each second costs ${fmt(perPoll / 10, 3)} % of a core`);
  const circuit = first.circuits[10]!;
  await call(base, 'PUT', `/api/boards/${bigBoardId}/circuits/${circuit.id}/cells/zs`, cookie, { text: '0.33', version: circuit.cells.zs?.version ?? 0 });
  const one = await call(base, 'GET', `/api/boards/${bigBoardId}/changes?after=${first.cursor}`, cookie);
  const oneGz = await call(base, 'GET', `/api/boards/${bigBoardId}/changes?after=${first.cursor}`, cookie, undefined, { 'accept-encoding': 'gzip' });
  console.log(`  a poll bringing one change: ${fmt(one.bytes / 1024)} kB (${fmt(oneGz.bytes / 1024)} kB gzipped)`);
}

function historyPopup() {
  console.log('\n3. Cell history popup at 2 million history rows');
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'boardwalk-bench-history-'));
  const file = path.join(dir, 'history.sqlite');
  return (async () => {
    const { db, sqlite } = openDatabase(file);
    await migrateToLatest(db);
    const rows = 2_000_000;
    const t0 = performance.now();
    const insert = sqlite.prepare("insert into history (board_id, circuit_id, column_key, action, old_text, new_text, user_id, at, how, version) values (?, ?, ?, 'cell', null, ?, 1, '2026-12-01T09:00:00Z', 'typed', ?)");
    const keys = ['zs', 'r1PlusR2', 'irLiveEarth', 'irLiveLive', 'rcdTimeMs', 'polarity'];
    sqlite.transaction(() => {
      for (let i = 0; i < rows; i++) insert.run(1 + (i % 400), 1 + (i % 20_000), keys[i % keys.length], '0.44', 1 + Math.floor(i / 20_000));
    })();
    console.log(`  ${rows.toLocaleString('en-GB')} rows written in ${fmt((performance.now() - t0) / 1000)} s`);
    const time = async (n: number) => {
      const times: number[] = [];
      for (let i = 0; i < n; i++) {
        const s = performance.now();
        await cellHistory(db, 1 + ((i * 7919) % 20_000), keys[i % keys.length]!);
        times.push(performance.now() - s);
      }
      times.sort((a, b) => a - b);
      return { p50: pct(times, 50), p95: pct(times, 95) };
    };
    const withIndex = await time(300);
    console.log(`  with the index:    p50 ${fmt(withIndex.p50, 2)} ms, p95 ${fmt(withIndex.p95, 2)} ms (target ≤ 5 ms: ${mark(withIndex.p95 <= 5)})`);
    sqlite.exec('drop index history_circuit_column');
    const without = await time(5);
    console.log(`  without it (before): p50 ${fmt(without.p50, 1)} ms, p95 ${fmt(without.p95, 1)} ms`);
    await db.destroy();
    fs.rmSync(dir, { recursive: true, force: true });
  })();
}

async function bundleBytes(base: string) {
  console.log('\n4. JavaScript per page, as sent to a browser that accepts brotli and gzip');
  const manifest = JSON.parse(fs.readFileSync('dist/.vite/manifest.json', 'utf8')) as Record<string, { file: string; imports?: string[]; isEntry?: boolean }>;
  const closure = (keys: string[]) => {
    const seen = new Set<string>();
    const walk = (k: string) => {
      if (seen.has(k)) return;
      seen.add(k);
      for (const i of manifest[k]?.imports ?? []) walk(i);
    };
    keys.forEach(walk);
    return [...seen].map((k) => manifest[k]!.file).filter((f) => f.endsWith('.js'));
  };
  const entry = Object.keys(manifest).find((k) => manifest[k]!.isEntry)!;
  const find = (part: string) => Object.keys(manifest).find((k) => k.includes(part));
  const pages: [string, string[]][] = [
    ['sign-in', [entry]],
    ['jobs', [entry, find('jobs-page')!]],
    ['board console', [entry, find('board-console-page')!]],
    ['admin', [entry, find('users-page')!]],
  ];
  for (const [name, keys] of pages) {
    let raw = 0;
    let wire = 0;
    for (const file of closure(keys.filter(Boolean))) {
      raw += fs.statSync(path.join('dist', file)).size;
      wire += (await call(base, 'GET', `/${file}`, '', undefined, { 'accept-encoding': 'br, gzip' })).bytes;
    }
    console.log(`  ${name.padEnd(14)} ${fmt(wire / 1024).padStart(6)} kB sent (${fmt(raw / 1024).padStart(6)} kB uncompressed)`);
  }
}

// ---------- main ----------

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'boardwalk-bench-server-'));
const file = path.join(dir, 'bench.sqlite');
const { demoBoardId, bigBoardId } = await prepareDatabase(file);
const { child, base } = await startServer(file);
try {
  console.log(`Server benchmark (${os.cpus().length} cores, Node ${process.version}); server in its own process`);
  await writeRates(base, child.pid!, demoBoardId, bigBoardId);
  await idlePoll(base, child.pid!, bigBoardId);
  await bundleBytes(base);
} finally {
  child.kill('SIGTERM');
  fs.rmSync(dir, { recursive: true, force: true });
}
if (process.env.BENCH_SKIP_HISTORY !== '1') await historyPopup();
agent.destroy();
process.exit(0);
