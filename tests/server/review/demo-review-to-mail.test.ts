import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import { PDFParse } from 'pdf-parse';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appServices, createApp } from '../../../server/app.ts';
import { openDatabase } from '../../../server/db/database.ts';
import { migrateToLatest } from '../../../server/db/migrate.ts';
import { demoPassword } from '../../../server/db/seed/demo-scenario.ts';
import { seedDemo } from '../../../server/db/seed/seed-demo.ts';
import { demoSignaturePng } from '../../../server/db/seed/signature-image.ts';
import { listMailbox, startLocalMailServer, type LocalMailServer } from '../../../server/mail/local-mail-server.ts';
import type { OutgoingMail } from '../../../shared/schemas/mail.ts';
import type { ReviewFinding, ReviewJob, ReviewQueue } from '../../../shared/schemas/review.ts';
import { asOwnPage } from '../../helpers/test-app.ts';

/**
 * The demo's promise, over HTTP on a freshly seeded database: the demo reviewer takes the demo
 * EICR from "ready for review" to a PDF e-mailed to the client, through the API only (this test
 * writes nothing to the database itself). The seed leaves the report submitted by the tester, with
 * every reading of its board recorded and the inspector's signature; its three planted errors are
 * the reviewer's to deal with: two are accepted with a reason (both are already observations of the
 * report), and the LIM without a reason — which the gate never lets a reviewer accept — is given
 * the reason the tester wrote in the submission note.
 */

const sha256 = (bytes: Buffer) => crypto.createHash('sha256').update(bytes).digest('hex');

let dataDir: string;
let mail: LocalMailServer;
let app: Express;
let rawApp: Express;
let closeDb: () => void;

beforeAll(async () => {
  dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'boardwalk-demo-review-'));
  const { db, sqlite } = openDatabase(':memory:');
  closeDb = () => sqlite.close();
  await migrateToLatest(db);
  await seedDemo(db, { dataDir });
  // The project's own mail server, as `npm start` runs it without SMTP_URL.
  mail = await startLocalMailServer({ dir: path.join(dataDir, 'mailbox'), port: 0 });
  rawApp = createApp({ db, sqlite, sessionSecret: 'demo-review-test', signInAttemptsPerMinute: 1000, dataDir, smtpUrl: mail.url, localMailPort: mail.port });
  app = asOwnPage(rawApp);
});

afterAll(async () => {
  await appServices(rawApp).mailSender.idle();
  await mail.close();
  closeDb();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

async function until<T>(read: () => Promise<T>, done: (value: T) => boolean, what: string): Promise<T> {
  const deadline = Date.now() + 15_000;
  for (;;) {
    const value = await read();
    if (done(value)) return value;
    if (Date.now() > deadline) throw new Error(`${what} never happened: ${JSON.stringify(value)}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

describe('the demo EICR, from review to the client', () => {
  it('when the demo reviewer deals with the planted errors, locks, approves, signs, issues and sends, then the client receives the issued PDF unchanged', async () => {
    const reviewer = request.agent(app);
    expect((await reviewer.post('/api/auth/sign-in').send({ email: 'reviewer@boardwalk.test', password: demoPassword })).status).toBe(200);

    // The queue: the demo EICR, submitted by the tester with a note, nothing left to type.
    const queue = (await reviewer.get('/api/review/queue')).body as ReviewQueue;
    expect(queue.jobs).toHaveLength(1);
    const [entry] = queue.jobs;
    expect(entry!.job).toMatchObject({ kind: 'EICR', reference: 'KVE-EICR-2026-057', state: 'ready' });
    expect(entry!.submitted?.by?.name).toBe('Callum Brierley');
    expect(entry!.submitted?.note).toMatch(/9L3/);
    expect(entry!.counts).toMatchObject({ errors: 3, accepted: 0, missingReadings: 0 });
    const jobId = entry!.job.id;

    const review = (await reviewer.get(`/api/review/jobs/${jobId}`)).body as ReviewJob;
    expect(review.boards).toHaveLength(1);
    const board = review.boards[0]!.board;
    const errors = review.boards[0]!.findings.filter((f) => f.severity === 'error');
    expect(errors.map((f) => `${f.circuitNumber} ${f.code}`).sort()).toEqual(['5L1 ir-below-minimum', '6L1 zs-over-max', '9L3 lim-without-reason']);

    // Locking is refused with the gate's reasons, one per planted error.
    const refused = await reviewer.post(`/api/boards/${board.id}/lock`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.details.reasons).toHaveLength(3);

    // Each error accepted with a reason where the gate allows it; the LIM gets the reason the tester gave.
    const reasons: Record<string, string> = {
      'zs-over-max': 'Recorded as observation 3 (C2): canopy heaters, Zs over the limit for the B32.',
      'ir-below-minimum': 'Recorded as observation 10 (FI): proving cabinet insulation to be investigated.',
    };
    const byCode = (code: string) => errors.find((f) => f.code === code) as ReviewFinding;
    for (const [code, reason] of Object.entries(reasons)) {
      const res = await reviewer.post(`/api/jobs/${jobId}/acceptances`).send({ boardId: board.id, findingKey: byCode(code).key, reason });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
    }
    const lim = byCode('lim-without-reason');
    expect(lim.acceptable).toMatch(/cannot be accepted/);
    const notAccepted = await reviewer.post(`/api/jobs/${jobId}/acceptances`).send({ boardId: board.id, findingKey: lim.key, reason: 'The tester explained it in the note.' });
    expect(notAccepted.status).toBe(400);
    const detail = (await reviewer.get(`/api/boards/${board.id}`)).body as { circuits: Array<{ id: number; number: string; cells: Record<string, { text: string; version: number }> }> };
    const fireAlarm = detail.circuits.find((c) => c.number === '9L3')!;
    const limCell = await reviewer
      .put(`/api/boards/${board.id}/circuits/${fireAlarm.id}/cells/irLiveLive`)
      .send({ text: 'LIM', version: fireAlarm.cells.irLiveLive!.version, reason: 'Fire alarm panel could not be isolated during trading; L–N not tested (tester’s note).' });
    expect(limCell.status, JSON.stringify(limCell.body)).toBe(200);

    // Lock, then approve: the gate passes.
    const locked = await reviewer.post(`/api/boards/${board.id}/lock`);
    expect(locked.status, JSON.stringify(locked.body)).toBe(200);
    const approved = await reviewer.post(`/api/jobs/${jobId}/approve`).send({ note: 'Checked against the site sheets.' });
    expect(approved.status, JSON.stringify(approved.body)).toBe(200);
    expect(approved.body.job.state).toBe('approved');

    // The inspector signed before submitting (seeded); the reviewer signs with an uploaded PNG.
    const signed = await reviewer
      .post(`/api/jobs/${jobId}/signatures`)
      .field('role', 'reviewer')
      .field('name', 'Ruth Okafor-Lane')
      .attach('image', demoSignaturePng(99), { filename: 'ruth-signature.png', contentType: 'image/png' });
    expect(signed.status, JSON.stringify(signed.body)).toBe(201);
    const signatures = (await reviewer.get(`/api/jobs/${jobId}/signatures`)).body.signatures as Array<{ role: string; name: string; current: boolean }>;
    expect(signatures.filter((s) => s.current).map((s) => [s.role, s.name]).sort()).toEqual([['inspector', 'Callum Brierley'], ['reviewer', 'Ruth Okafor-Lane']]);

    // Issue revision 1; the download is the stored PDF with both names and the report's reference.
    const issued = await reviewer.post(`/api/jobs/${jobId}/issue`);
    expect(issued.status, JSON.stringify(issued.body)).toBe(201);
    const storedSha = issued.body.issue.sha256 as string;
    const download = await reviewer
      .get(`/api/jobs/${jobId}/issues/1/pdf`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(download.status).toBe(200);
    const pdf = download.body as Buffer;
    expect(sha256(pdf)).toBe(storedSha);
    // Read back by pdf-parse (a general-purpose PDF reader from the registry).
    const parser = new PDFParse({ data: new Uint8Array(pdf) });
    const { text } = await parser.getText();
    await parser.destroy();
    for (const words of ['KVE-EICR-2026-057', 'Callum Brierley', 'Ruth Okafor-Lane', '6L1', '24TP']) expect(text).toContain(words);

    // Send to the site's contact (seeded) and wait for the sender.
    const sent = await reviewer.post(`/api/jobs/${jobId}/send`).send({});
    expect(sent.status, JSON.stringify(sent.body)).toBe(202);
    const [outgoing] = await until(
      async () => (await reviewer.get(`/api/jobs/${jobId}/mail`)).body.mail as OutgoingMail[],
      (m) => m[0]?.state === 'sent' || m[0]?.state === 'failed',
      'sending',
    );
    expect(outgoing).toMatchObject({ state: 'sent', to: 'facilities@corbel-bakehouse.example.test' });

    // The message arrived at the project's own SMTP server with the PDF whose SHA-256 is the stored one.
    const received = listMailbox(path.join(dataDir, 'mailbox'));
    expect(received).toHaveLength(1);
    expect(received[0]!.envelopeTo).toEqual(['facilities@corbel-bakehouse.example.test']);
    expect(received[0]!.attachments.map((a) => [a.contentType, a.sha256])).toEqual([['application/pdf', storedSha]]);

    // Every step is in the job's history, by the reviewer (apart from the seeded submission and the sender's own entry).
    const history = JSON.stringify((await reviewer.get(`/api/jobs/${jobId}/history`)).body);
    for (const action of ['"finding-accepted"', '"signed"', '"issued"', '"mail-queued"', 'Checked against the site sheets.']) expect(history).toContain(action);
  }, 60_000);
});
