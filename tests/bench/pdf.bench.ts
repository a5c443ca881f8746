/**
 * PDF benchmark (`npm run bench:pdf`): the whole issued document of an EICR whose board has 64
 * ways (every reading filled), with the full record, two signatures and a logo, rendered with
 * pdfkit. Timed, each as wall-clock and as this process's CPU time (the machine is shared, so
 * wall-clock alone says as much about the neighbours as about the code):
 * - the warm-up the server does once after it starts (fonts parsed, a small made-up document
 *   rendered and thrown away);
 * - the first load + render after that (the first issue after a start: nothing warmed up yet);
 * - the median of further load + renders.
 * Target: the PDF of a 64-way board job in ≤ 1 s, judged on the first issue after a start.
 * Printed with the ratio to the target; the script never fails the build.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { warmUpFonts } from '../../server/pdf/fonts.ts';
import { loadJobDocument } from '../../server/pdf/load-job-document.ts';
import { renderJobPdf, warmUpPdfRenderer } from '../../server/pdf/render-job-pdf.ts';
import { addBoard, addCompany, addEicrRecord, addSignatures } from '../helpers/issue-fixture.ts';
import { createTestApp } from '../helpers/test-app.ts';

const WAYS = 64;
const RUNS = 15;
const TARGET_MS = 1000;

const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'boardwalk-bench-pdf-'));
const t = await createTestApp({ dataDir });
await addCompany(t.db, dataDir, t.ids.admin);
await addEicrRecord(t.db, t.ids.job, t.ids.tester);
await addSignatures(t.db, dataDir, t.ids.job, t.ids.tester, t.ids.reviewer);
// The bench job is the 64-way board alone: remove the fixture's three-circuit board.
await t.db.deleteFrom('circuits').where('board_id', '=', t.ids.board).execute();
await t.db.deleteFrom('boards').where('id', '=', t.ids.board).execute();
await addBoard(t.db, t.ids.job, t.ids.reviewer, { reference: 'DB-64', ways: WAYS, phases: 1, locked: true });

const stamp = { revision: 1, issuedAt: new Date('2026-12-02T09:00:00Z'), issuedBy: 'Bench Reviewer' };
const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;

/** Wall-clock and CPU milliseconds of one awaited call. */
async function measure<T>(run: () => Promise<T> | T): Promise<{ value: T; wall: number; cpu: number }> {
  const cpuBefore = process.cpuUsage();
  const started = performance.now();
  const value = await run();
  const wall = performance.now() - started;
  const cpu = process.cpuUsage(cpuBefore);
  return { value, wall, cpu: (cpu.user + cpu.system) / 1000 };
}
const issueOnce = async () => renderJobPdf((await loadJobDocument(t.db, t.ids.job, dataDir))!, stamp);

const fonts = await measure(async () => {
  warmUpFonts();
  await warmUpPdfRenderer();
});
const first = await measure(issueOnce);
const walls: number[] = [];
const cpus: number[] = [];
for (let i = 0; i < RUNS; i++) {
  const run = await measure(issueOnce);
  walls.push(run.wall);
  cpus.push(run.cpu);
}
const document = (await loadJobDocument(t.db, t.ids.job, dataDir))!;
const verdict = (ok: boolean) => (ok ? 'pass' : 'miss');
const ms = (value: number) => `${value.toFixed(0).padStart(5)} ms`;

console.log(`PDF benchmark: EICR with one ${WAYS}-way board (${document.boards[0]!.circuits.length} circuits), full record, 2 signatures, logo; ${(first.value.length / 1024).toFixed(0)} kB, ${os.cpus().length} cores, load average ${os.loadavg()[0]!.toFixed(1)}`);
console.log(`  Node ${process.version}; wall-clock / CPU time of this process`);
console.log(`  warm-up (once, after the server starts)   ${ms(fonts.wall)} / ${ms(fonts.cpu)}`);
console.log(`  first load + render after start           ${ms(first.wall)} / ${ms(first.cpu)}   target ≤ ${TARGET_MS} ms: ${verdict(first.wall <= TARGET_MS)}   ratio to target ${(first.wall / TARGET_MS).toFixed(2)} (CPU ${(first.cpu / TARGET_MS).toFixed(2)})`);
console.log(`  median of ${RUNS} further load + renders       ${ms(median(walls))} / ${ms(median(cpus))}   ratio to target ${(median(walls) / TARGET_MS).toFixed(2)}`);

t.close();
fs.rmSync(dataDir, { recursive: true, force: true });
