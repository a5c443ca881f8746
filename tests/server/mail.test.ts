import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import PDFDocument from 'pdfkit';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { appServices } from '../../server/app.ts';
import { listMailbox, startLocalMailServer, type LocalMailServer } from '../../server/mail/local-mail-server.ts';
import type { OutgoingMail } from '../../shared/schemas/mail.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';

const sha256 = (bytes: Buffer) => crypto.createHash('sha256').update(bytes).digest('hex');

/** A small real PDF made with pdfkit (a general-purpose library from the registry), not by us. */
function makePdf(text: string): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const doc = new PDFDocument({ size: 'A4', info: { CreationDate: new Date('2026-11-30T09:00:00Z') } });
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

/** Issues the test job as the pdf feature would: the PDF stored as a file, a job_issues row with its SHA-256. */
async function issueJob(revision = 1) {
  const pdf = await makePdf(`Condition report T-1, revision ${revision}, for 1 Test Row`);
  const file = await appServices(t.app).files.save(t.db, { kind: 'issued-pdf', bytes: pdf, mime: 'application/pdf', jobId: t.ids.job, uploadedBy: t.ids.reviewer });
  const issue = await t.db
    .insertInto('job_issues')
    .values({ job_id: t.ids.job, revision, file_id: file.id, sha256: file.sha256, issued_by: t.ids.reviewer })
    .returningAll()
    .executeTakeFirstOrThrow();
  await t.db.updateTable('jobs').set({ state: 'issued' }).where('id', '=', t.ids.job).execute();
  return { pdf, file, issue };
}

/** Polls the job's mail until `done` holds (the sender works in the background). */
async function waitForMail(agent: Awaited<ReturnType<TestApp['signIn']>>, done: (mail: OutgoingMail[]) => boolean): Promise<OutgoingMail[]> {
  const deadline = Date.now() + 10_000;
  for (;;) {
    const res = await agent.get(`/api/jobs/${t.ids.job}/mail`);
    expect(res.status).toBe(200);
    if (done(res.body.mail)) return res.body.mail;
    if (Date.now() > deadline) throw new Error(`mail never settled: ${JSON.stringify(res.body.mail)}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

beforeEach(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'boardwalk-mail-'));
  mailServer = null;
});
afterEach(async () => {
  await appServices(t.app).mailSender.idle();
  await mailServer?.close();
  t.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

describe('sending an issued job to the client', () => {
  beforeEach(async () => {
    mailServer = await startLocalMailServer({ dir: path.join(dir, 'mailbox'), port: 0 });
    t = await createTestApp({ dataDir: dir, smtpUrl: mailServer.url });
    await t.db.updateTable('sites').set({ contact_name: 'Priya Okafor', contact_email: 'priya@client.example' }).where('id', '=', t.ids.site).execute();
  });

  it("when a reviewer sends it, then 202 at once and the project's own mail server receives the PDF with the stored SHA-256", async () => {
    const { pdf, file, issue } = await issueJob();
    const reviewer = await t.signIn('reviewer');
    const res = await reviewer.post(`/api/jobs/${t.ids.job}/send`).send({ message: 'The kitchen circuit is noted as observation 2.' });
    expect(res.status).toBe(202);
    expect(res.body.mail).toMatchObject({ to: 'priya@client.example', revision: 1 });
    expect(['waiting', 'sending', 'sent']).toContain(res.body.mail.state);

    const [sent] = await waitForMail(reviewer, (mail) => mail[0]?.state === 'sent' || mail[0]?.state === 'failed');
    expect(sent).toMatchObject({ state: 'sent', attempts: 1, lastError: null });
    expect(sent!.subject).toContain('T-1');
    expect(sent!.body).toContain('The kitchen circuit is noted as observation 2.');

    const received = listMailbox(path.join(dir, 'mailbox'));
    expect(received).toHaveLength(1);
    const message = received[0]!;
    expect(message.envelopeTo).toEqual(['priya@client.example']);
    expect(message.subject).toBe(sent!.subject);
    expect(message.attachments).toHaveLength(1);
    // The stored row's SHA-256, the issue's and the SHA-256 computed here over the PDF bytes all
    // match what arrived.
    expect(message.attachments[0]).toMatchObject({ contentType: 'application/pdf', filename: 'T-1-revision-1.pdf', sizeBytes: pdf.length });
    expect(message.attachments[0]!.sha256).toBe(sha256(pdf));
    expect(message.attachments[0]!.sha256).toBe(file.sha256);
    expect(message.attachments[0]!.sha256).toBe(issue.sha256);

    // The admin's mailbox lists it and opens the attachment: the same bytes.
    const admin = await t.signIn('admin');
    const box = await admin.get('/api/admin/mailbox');
    expect(box.status).toBe(200);
    expect(box.body.messages[0].id).toBe(message.id);
    const attachment = await admin
      .get(`/api/admin/mailbox/${message.id}/attachments/0`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(attachment.status).toBe(200);
    expect(attachment.headers['content-type']).toBe('application/pdf');
    expect(sha256(attachment.body as Buffer)).toBe(file.sha256);

    const history = await t.db.selectFrom('job_history').select(['action', 'user_id']).where('job_id', '=', t.ids.job).orderBy('id').execute();
    expect(history).toEqual([
      { action: 'mail-queued', user_id: t.ids.reviewer },
      { action: 'mail-sent', user_id: null },
    ]);
  });

  it("when an address is given, then it goes there instead of the site contact, from and signed by the company", async () => {
    await issueJob();
    const admin = await t.signIn('admin');
    await admin.put('/api/company').send({
      name: 'Kestrel Lane Electrical Ltd',
      address: '4 Kestrel Lane, Harwick',
      phone: '01632 960 418',
      email: 'office@kestrel-lane.example',
      registration: '',
      referencePattern: 'KL-{yyyy}-{seq:4}',
    });
    const res = await admin.post(`/api/jobs/${t.ids.job}/send`).send({ to: 'agent@letting.example' });
    expect(res.status).toBe(202);
    // Not the site contact, so not greeted by the contact's name.
    expect(res.body.mail.body).toMatch(/^Hello,\n/);
    expect(res.body.mail.body).toMatch(/\n\nKestrel Lane Electrical Ltd\n01632 960 418 · office@kestrel-lane.example\n$/);
    await waitForMail(admin, (mail) => mail[0]?.state === 'sent');
    const received = listMailbox(path.join(dir, 'mailbox'))[0]!;
    expect(received.envelopeTo).toEqual(['agent@letting.example']);
    expect(received.from).toBe('Kestrel Lane Electrical Ltd <office@kestrel-lane.example>');
  });

  it('when the job is not issued, then 409 in words and nothing is queued', async () => {
    const reviewer = await t.signIn('reviewer');
    const res = await reviewer.post(`/api/jobs/${t.ids.job}/send`).send({});
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/Only an issued job can be sent.*being entered/);
    expect(await t.db.selectFrom('outgoing_mail').selectAll().execute()).toEqual([]);
  });

  it('when the site has no contact e-mail and none is given, then 400 asking for one', async () => {
    await issueJob();
    await t.db.updateTable('sites').set({ contact_email: '' }).where('id', '=', t.ids.site).execute();
    const res = await (await t.signIn('reviewer')).post(`/api/jobs/${t.ids.job}/send`).send({});
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/no contact e-mail/);
  });

  it('when the address is not an e-mail address, then 400 at the field', async () => {
    await issueJob();
    const res = await (await t.signIn('reviewer')).post(`/api/jobs/${t.ids.job}/send`).send({ to: 'not an address' });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('to');
  });

  it('when a tester tries to send, then 403 and nothing is queued', async () => {
    await issueJob();
    const res = await (await t.signIn('tester')).post(`/api/jobs/${t.ids.job}/send`).send({});
    expect(res.status).toBe(403);
    expect(await t.db.selectFrom('outgoing_mail').selectAll().execute()).toEqual([]);
  });

  it('when a later revision supersedes the first, then the later one is attached', async () => {
    await issueJob(1);
    await t.db.updateTable('job_issues').set({ superseded_at: new Date().toISOString() }).where('revision', '=', 1).execute();
    const { file } = await issueJob(2);
    const reviewer = await t.signIn('reviewer');
    expect((await reviewer.post(`/api/jobs/${t.ids.job}/send`).send({})).status).toBe(202);
    const [sent] = await waitForMail(reviewer, (mail) => mail[0]?.state === 'sent');
    expect(sent!.revision).toBe(2);
    expect(listMailbox(path.join(dir, 'mailbox'))[0]!.attachments[0]!.sha256).toBe(file.sha256);
  });

  it('when the stored PDF was changed on disk after issue, then the mail fails saying so and nothing leaves', async () => {
    const { file } = await issueJob();
    fs.appendFileSync(path.join(dir, file.path), 'tampered');
    const reviewer = await t.signIn('reviewer');
    await reviewer.post(`/api/jobs/${t.ids.job}/send`).send({});
    const [failed] = await waitForMail(reviewer, (mail) => mail[0]?.state === 'failed' || mail[0]?.state === 'sent');
    expect(failed!.state).toBe('failed');
    expect(failed!.lastError).toMatch(/SHA-256/);
    expect(listMailbox(path.join(dir, 'mailbox'))).toEqual([]);
  });

  it('when something other than a PDF or an image arrives, then the mailbox hands it over as bytes to download, never as a page', async () => {
    // Anyone on the machine can post to the local server; nodemailer sends straight to it here.
    const transport = (await import('nodemailer')).default.createTransport({ url: mailServer!.url } as never);
    await transport.sendMail({
      from: 'someone@elsewhere.example',
      to: 'admin@test.example',
      subject: 'Not a report',
      text: 'see attached',
      attachments: [{ filename: 'page.html', content: '<script>alert(1)</script>', contentType: 'text/html' }],
    });
    const admin = await t.signIn('admin');
    const [message] = (await admin.get('/api/admin/mailbox')).body.messages;
    expect(message.attachments[0]).toMatchObject({ filename: 'page.html', contentType: 'text/html' });
    const res = await admin.get(`/api/admin/mailbox/${message.id}/attachments/0`);
    expect(res.headers['content-type']).toBe('application/octet-stream');
    expect(res.headers['content-disposition']).toMatch(/^attachment;/);
  });

  it('when a message id is not one the mailbox made, then 404 (no path is read from it)', async () => {
    const admin = await t.signIn('admin');
    expect((await admin.get('/api/admin/mailbox/..%2F..%2Fetc%2Fpasswd/raw')).status).toBe(404);
    expect((await admin.get('/api/admin/mailbox/20261202-070000000-deadbeef/attachments/0')).status).toBe(404);
    expect((await admin.get('/api/admin/mailbox/20261202-070000000-deadbeef/attachments/x')).status).toBe(400);
  });

  it('when a reviewer opens the mailbox, then 403: it is for admins', async () => {
    expect((await (await t.signIn('reviewer')).get('/api/admin/mailbox')).status).toBe(403);
  });
});

describe('a send that fails', () => {
  it('when the mail server is not running, then the e-mail is kept as failed with the reason, and a retry once it runs sends it', async () => {
    // Find a free port, then leave it closed: nothing listens there.
    const probe = await startLocalMailServer({ dir: path.join(dir, 'probe'), port: 0 });
    const port = probe.port;
    await probe.close();
    t = await createTestApp({ dataDir: dir, smtpUrl: `smtp://127.0.0.1:${port}` });
    await t.db.updateTable('sites').set({ contact_email: 'priya@client.example' }).where('id', '=', t.ids.site).execute();
    const { file } = await issueJob();
    const reviewer = await t.signIn('reviewer');

    expect((await reviewer.post(`/api/jobs/${t.ids.job}/send`).send({})).status).toBe(202);
    const [failed] = await waitForMail(reviewer, (mail) => mail[0]?.state === 'failed' || mail[0]?.state === 'sent');
    expect(failed).toMatchObject({ state: 'failed', attempts: 1 });
    expect(failed!.lastError).toMatch(/refused the connection/);

    // Retrying a mail that is not failed is refused; a tester cannot retry.
    expect((await (await t.signIn('tester')).post(`/api/mail/${failed!.id}/retry`)).status).toBe(403);

    mailServer = await startLocalMailServer({ dir: path.join(dir, 'mailbox'), port });
    const retry = await reviewer.post(`/api/mail/${failed!.id}/retry`);
    expect(retry.status).toBe(202);
    const [sent] = await waitForMail(reviewer, (mail) => mail[0]?.state === 'sent' || (mail[0]?.state === 'failed' && mail[0].attempts > 1));
    expect(sent).toMatchObject({ id: failed!.id, state: 'sent', attempts: 2, lastError: null });
    expect(listMailbox(path.join(dir, 'mailbox'))[0]!.attachments[0]!.sha256).toBe(file.sha256);

    const again = await reviewer.post(`/api/mail/${failed!.id}/retry`);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already sent/);

    const actions = (await t.db.selectFrom('job_history').select('action').where('job_id', '=', t.ids.job).orderBy('id').execute()).map((r) => r.action);
    expect(actions).toEqual(['mail-queued', 'mail-failed', 'mail-retried', 'mail-sent']);
  });

  it('when no mail server is set up at all, then the e-mail fails saying so', async () => {
    t = await createTestApp({ dataDir: dir });
    await t.db.updateTable('sites').set({ contact_email: 'priya@client.example' }).where('id', '=', t.ids.site).execute();
    await issueJob();
    const reviewer = await t.signIn('reviewer');
    await reviewer.post(`/api/jobs/${t.ids.job}/send`).send({});
    const [failed] = await waitForMail(reviewer, (mail) => mail[0]?.state === 'failed');
    expect(failed!.lastError).toMatch(/SMTP_URL/);
  });

  it('when the server restarts while a mail is being sent, then it is marked failed with a warning that it may have arrived', async () => {
    t = await createTestApp({ dataDir: dir });
    await issueJob();
    const row = await t.db
      .insertInto('outgoing_mail')
      .values({ job_id: t.ids.job, to_address: 'priya@client.example', subject: 's', body: 'b', state: 'sending', attempts: 1 })
      .returning('id')
      .executeTakeFirstOrThrow();
    await appServices(t.app).mailSender.resume();
    const after = await t.db.selectFrom('outgoing_mail').selectAll().where('id', '=', row.id).executeTakeFirstOrThrow();
    expect(after.state).toBe('failed');
    expect(after.last_error).toMatch(/may or may not have arrived/);
  });
});
