import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import PDFDocument from 'pdfkit';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { appServices } from '../../server/app.ts';
import { listMailbox, startLocalMailServer, type LocalMailServer } from '../../server/mail/local-mail-server.ts';
import { parseMessage } from '../../server/mail/mime.ts';
import type { OutgoingMail } from '../../shared/schemas/mail.ts';
import { pngBytes } from '../helpers/images.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';

const sha256 = (bytes: Buffer) => crypto.createHash('sha256').update(bytes).digest('hex');

/** A small real PDF made with pdfkit (a general-purpose library from the registry). */
function makePdf(text: string): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const doc = new PDFDocument({ size: 'A4' });
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
    doc.text(text);
    doc.end();
  });
}

let dir: string;
let mailServer: LocalMailServer | null;
let t: TestApp;

beforeEach(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'boardwalk-photo-send-'));
  mailServer = await startLocalMailServer({ dir: path.join(dir, 'mailbox'), port: 0 });
  t = await createTestApp({ dataDir: dir, smtpUrl: mailServer.url });
  await t.db.updateTable('sites').set({ contact_name: 'Priya Okafor', contact_email: 'priya@client.example' }).where('id', '=', t.ids.site).execute();
});
afterEach(async () => {
  await appServices(t.app).mailSender.idle();
  await mailServer?.close();
  t.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

/** Two photos of the paper notes on board DB1, attached by the tester while the job is entered. */
async function attachTwoPhotos() {
  const tester = await t.signIn('tester');
  const first = pngBytes(40, 20);
  const second = pngBytes(60, 30);
  const a = await tester.post(`/api/boards/${t.ids.board}/photos`).attach('photo', first, 'page-1.png');
  const b = await tester.post(`/api/boards/${t.ids.board}/photos`).attach('photo', second, 'page-2.png');
  expect([a.status, b.status]).toEqual([201, 201]);
  return { first: { id: a.body.photo.id as number, sha256: sha256(first) }, second: { id: b.body.photo.id as number, sha256: sha256(second) } };
}

async function issueJob() {
  const pdf = await makePdf('Condition report T-1, revision 1');
  const file = await appServices(t.app).files.save(t.db, { kind: 'issued-pdf', bytes: pdf, mime: 'application/pdf', jobId: t.ids.job, uploadedBy: t.ids.reviewer });
  await t.db.insertInto('job_issues').values({ job_id: t.ids.job, revision: 1, file_id: file.id, sha256: file.sha256, issued_by: t.ids.reviewer }).execute();
  await t.db.updateTable('jobs').set({ state: 'issued' }).where('id', '=', t.ids.job).execute();
  return { pdfSha256: sha256(pdf) };
}

async function sendAndWait(agent: Awaited<ReturnType<TestApp['signIn']>>): Promise<OutgoingMail> {
  expect((await agent.post(`/api/jobs/${t.ids.job}/send`).send({})).status).toBe(202);
  const deadline = Date.now() + 10_000;
  for (;;) {
    const res = await agent.get(`/api/jobs/${t.ids.job}/mail`);
    const mail = res.body.mail[0] as OutgoingMail | undefined;
    if (mail && (mail.state === 'sent' || mail.state === 'failed')) return mail;
    if (Date.now() > deadline) throw new Error(`mail never settled: ${JSON.stringify(res.body.mail)}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** The attachments of the one message the local mail server received, re-read from its raw bytes. */
function receivedAttachments() {
  const box = path.join(dir, 'mailbox');
  const [message] = listMailbox(box);
  expect(message).toBeDefined();
  const raw = fs.readFileSync(path.join(box, `${message!.id}.eml`));
  return parseMessage(raw).attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, sha256: sha256(a.content) }));
}

describe('GET /api/jobs/:jobId/photos', () => {
  it('when photos are attached to a board, then the job lists them by board, none chosen to send', async () => {
    const { first, second } = await attachTwoPhotos();
    const res = await (await t.signIn('reviewer')).get(`/api/jobs/${t.ids.job}/photos`);
    expect(res.status).toBe(200);
    expect(res.body.boards).toHaveLength(1);
    expect(res.body.boards[0]).toMatchObject({ boardId: t.ids.board, reference: 'DB1' });
    expect(res.body.boards[0].photos.map((p: { id: number; sendToClient: boolean }) => [p.id, p.sendToClient])).toEqual([
      [first.id, false],
      [second.id, false],
    ]);
  });

  it('when the job does not exist, then 404', async () => {
    expect((await (await t.signIn('tester')).get('/api/jobs/9999/photos')).status).toBe(404);
  });
});

describe('PUT /api/photos/:fileId/send-choice', () => {
  it('when a reviewer chooses a photo, then it is stored with a history row; choosing the same again adds none', async () => {
    const { first } = await attachTwoPhotos();
    const reviewer = await t.signIn('reviewer');
    const res = await reviewer.put(`/api/photos/${first.id}/send-choice`).send({ sendToClient: true });
    expect(res.status).toBe(200);
    expect(res.body.photo).toMatchObject({ id: first.id, sendToClient: true });
    expect((await reviewer.put(`/api/photos/${first.id}/send-choice`).send({ sendToClient: true })).status).toBe(200);
    const history = await t.db.selectFrom('job_history').select(['action', 'old_text', 'new_text', 'user_id']).where('action', '=', 'photo-send-choice').execute();
    expect(history).toHaveLength(1);
    expect(history[0]!.user_id).toBe(t.ids.reviewer);
    expect(JSON.parse(history[0]!.old_text!)).toMatchObject({ fileId: first.id, sendToClient: false });
    expect(JSON.parse(history[0]!.new_text!)).toMatchObject({ fileId: first.id, sendToClient: true });
  });

  it('when a tester tries to choose, then 403 and nothing changes', async () => {
    const { first } = await attachTwoPhotos();
    const res = await (await t.signIn('tester')).put(`/api/photos/${first.id}/send-choice`).send({ sendToClient: true });
    expect(res.status).toBe(403);
    const row = await t.db.selectFrom('files').select('send_to_client').where('id', '=', first.id).executeTakeFirstOrThrow();
    expect(row.send_to_client).toBe(0);
  });

  it('when the body is not a yes or no, then 400 at the field and nothing changes', async () => {
    const { first } = await attachTwoPhotos();
    const res = await (await t.signIn('reviewer')).put(`/api/photos/${first.id}/send-choice`).send({ sendToClient: 'yes' });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('sendToClient');
    expect((await t.db.selectFrom('job_history').selectAll().execute()).length).toBe(0);
  });

  it('when the file is not a photo (the issued PDF), then 404', async () => {
    await issueJob();
    const pdf = await t.db.selectFrom('files').select('id').where('kind', '=', 'issued-pdf').executeTakeFirstOrThrow();
    expect((await (await t.signIn('reviewer')).put(`/api/photos/${pdf.id}/send-choice`).send({ sendToClient: true })).status).toBe(404);
  });

  it('when the job is issued, then the choice may still change (it only says what the next e-mail carries)', async () => {
    const { second } = await attachTwoPhotos();
    await issueJob();
    expect((await (await t.signIn('reviewer')).put(`/api/photos/${second.id}/send-choice`).send({ sendToClient: true })).status).toBe(200);
  });
});

describe('sending the issued document with photos', () => {
  it('when no photo is chosen, then only the PDF leaves', async () => {
    await attachTwoPhotos();
    const { pdfSha256 } = await issueJob();
    const sent = await sendAndWait(await t.signIn('reviewer'));
    expect(sent.state).toBe('sent');
    const attachments = receivedAttachments();
    expect(attachments).toEqual([{ filename: 'T-1-revision-1.pdf', contentType: 'application/pdf', sha256: pdfSha256 }]);
  });

  it('when one of two photos is chosen, then the chosen one leaves beside the PDF, byte for byte, and the unchosen one never does', async () => {
    const { first, second } = await attachTwoPhotos();
    const { pdfSha256 } = await issueJob();
    const reviewer = await t.signIn('reviewer');
    expect((await reviewer.put(`/api/photos/${second.id}/send-choice`).send({ sendToClient: true })).status).toBe(200);
    expect((await reviewer.get(`/api/jobs/${t.ids.job}/mail`)).body.photosChosen).toBe(1);
    const sent = await sendAndWait(reviewer);
    expect(sent.state).toBe('sent');
    const attachments = receivedAttachments();
    expect(attachments).toEqual([
      { filename: 'T-1-revision-1.pdf', contentType: 'application/pdf', sha256: pdfSha256 },
      { filename: 'board-DB1-photo-1.png', contentType: 'image/png', sha256: second.sha256 },
    ]);
    expect(attachments.map((a) => a.sha256)).not.toContain(first.sha256);
    const queued = await t.db.selectFrom('job_history').select('new_text').where('action', '=', 'mail-queued').executeTakeFirstOrThrow();
    expect(JSON.parse(queued.new_text!).photoFileIds).toEqual([second.id]);
  });

  it('when a photo chosen at queueing is unchosen before a retry, then the retry leaves without it', async () => {
    const { first } = await attachTwoPhotos();
    await issueJob();
    const reviewer = await t.signIn('reviewer');
    await reviewer.put(`/api/photos/${first.id}/send-choice`).send({ sendToClient: true });
    // The mail server goes away, so the first attempt fails and is kept.
    const port = mailServer!.port;
    await mailServer!.close();
    mailServer = null;
    const failed = await sendAndWait(reviewer);
    expect(failed.state).toBe('failed');
    await reviewer.put(`/api/photos/${first.id}/send-choice`).send({ sendToClient: false });
    mailServer = await startLocalMailServer({ dir: path.join(dir, 'mailbox'), port });
    expect((await reviewer.post(`/api/mail/${failed.id}/retry`)).status).toBe(202);
    const deadline = Date.now() + 10_000;
    while ((await reviewer.get(`/api/jobs/${t.ids.job}/mail`)).body.mail[0].state !== 'sent') {
      if (Date.now() > deadline) throw new Error('retry never sent');
      await new Promise((r) => setTimeout(r, 50));
    }
    const attachments = receivedAttachments();
    expect(attachments.map((a) => a.contentType)).toEqual(['application/pdf']);
    expect(attachments.map((a) => a.sha256)).not.toContain(first.sha256);
  });
});
