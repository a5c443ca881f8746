import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import PDFDocument from 'pdfkit';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { listMailbox } from '../../server/mail/local-mail-server.ts';
import { demoAdmin, demoReviewer, useDemoServerAndBrowser } from '../helpers/browser.ts';

/**
 * Signing and sending in the real app: the demo reviewer draws a signature with the mouse on the
 * job screen and signs; once the job is issued, sends it to the client from the same screen and
 * watches it go; the admin finds it in the local mailbox and opens the attachment, whose SHA-256
 * is the stored PDF's. The job's state and its issued PDF are set up through the database here
 * (other features' tests drive review and issue).
 */

const env = useDemoServerAndBrowser();
const sha256 = (bytes: Buffer) => crypto.createHash('sha256').update(bytes).digest('hex');

async function signIn(page: Page, who: { email: string; password: string }) {
  await page.goto(`${env.server.url}/sign-in`);
  await page.getByLabel('E-mail').fill(who.email);
  await page.getByLabel('Password').fill(who.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/jobs/);
}

function makePdf(): Promise<Buffer> {
  return new Promise((resolve) => {
    const doc = new PDFDocument({ size: 'A4' });
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.text('A stand-in for the issued report.');
    doc.end();
  });
}

describe('signing and sending to the client', () => {
  it('when the reviewer draws a signature and later sends the issued job, then the signature is stored as a PNG and the message with the PDF arrives in the mailbox', async () => {
    const { db } = env.server;
    const job = await db.selectFrom('jobs').select(['id', 'site_id', 'reference']).where('kind', '=', 'EICR').orderBy('id').executeTakeFirstOrThrow();
    // The demo seeds the EICR ready for review (submitted and signed by the inspector).
    expect((await db.selectFrom('jobs').select('state').where('id', '=', job.id).executeTakeFirstOrThrow()).state).toBe('ready');
    await db.updateTable('sites').set({ contact_name: 'Morwenna Tate', contact_email: 'morwenna@tate-lettings.example' }).where('id', '=', job.site_id).execute();

    const context = await env.browser.newContext();
    const page = await context.newPage();
    await signIn(page, demoReviewer);
    await page.goto(`${env.server.url}/jobs/${job.id}`);

    const signing = page.getByRole('form', { name: 'Sign this job' });
    await signing.waitFor();
    await expect.poll(() => signing.getByLabel('Sign as').inputValue()).toBe('reviewer');
    const pad = signing.getByRole('img', { name: /Signature box/ });
    await pad.scrollIntoViewIfNeeded();
    const box = (await pad.boundingBox())!;
    // A looped stroke across the box, with the mouse.
    await page.mouse.move(box.x + box.width * 0.1, box.y + box.height * 0.7);
    await page.mouse.down();
    for (let i = 1; i <= 20; i++) {
      await page.mouse.move(box.x + box.width * (0.1 + 0.04 * i), box.y + box.height * (0.5 + 0.3 * Math.sin(i / 2)));
    }
    await page.mouse.up();
    const typedName = await signing.getByLabel('Name').inputValue();
    await signing.getByRole('button', { name: 'Sign as reviewer' }).click();
    await expect.poll(() => signing.getByRole('status').innerText(), { timeout: 10_000 }).toBe(`Signed as reviewer by ${typedName}.`);

    const stored = await db.selectFrom('signatures').innerJoin('files', 'files.id', 'signatures.file_id').selectAll('files').where('signatures.job_id', '=', job.id).where('signatures.role', '=', 'reviewer').executeTakeFirstOrThrow();
    expect(stored.mime).toBe('image/png');
    const png = fs.readFileSync(path.join(env.server.dataDir, stored.path));
    expect(png.subarray(0, 8)).toEqual(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])); // PNG signature (ISO/IEC 15948)
    expect(sha256(png)).toBe(stored.sha256);
    // The drawn PNG is the pad's size, 600 × 200 (IHDR width and height, big-endian).
    expect([png.readUInt32BE(16), png.readUInt32BE(20)]).toEqual([600, 200]);
    await page.getByRole('list', { name: 'Signatures in use' }).getByRole('img', { name: `Signature of ${typedName}` }).waitFor();
    // The inspector's signature seeded with the demo is shown beside it.
    await page.getByRole('list', { name: 'Signatures in use' }).getByRole('img', { name: 'Signature of Callum Brierley' }).waitFor();

    // Issued (as the issue feature would leave it): a stored PDF, its revision and hash.
    const pdf = await makePdf();
    const relative = `files/issued-test/${job.id}.pdf`;
    fs.mkdirSync(path.join(env.server.dataDir, 'files/issued-test'), { recursive: true });
    fs.writeFileSync(path.join(env.server.dataDir, relative), pdf);
    const reviewerId = (await db.selectFrom('users').select('id').where('email', '=', demoReviewer.email).executeTakeFirstOrThrow()).id;
    const file = await db
      .insertInto('files')
      .values({ kind: 'issued-pdf', path: relative, sha256: sha256(pdf), mime: 'application/pdf', size_bytes: pdf.length, job_id: job.id, uploaded_by: reviewerId })
      .returning('id')
      .executeTakeFirstOrThrow();
    await db.insertInto('job_issues').values({ job_id: job.id, revision: 1, file_id: file.id, sha256: sha256(pdf), issued_by: reviewerId }).execute();
    await db.updateTable('jobs').set({ state: 'issued' }).where('id', '=', job.id).execute();

    await page.reload();
    const send = page.getByRole('form', { name: 'Send the issued document' });
    await send.waitFor();
    expect(await send.getByLabel('To').inputValue()).toBe('morwenna@tate-lettings.example');
    await send.getByLabel('Your message (optional)').fill('The two C3 items are explained on page 3.');
    await send.getByRole('button', { name: 'Send to client' }).click();
    const list = page.getByRole('list', { name: 'E-mails of this job' });
    await expect.poll(() => list.innerText(), { timeout: 15_000 }).toMatch(/^sent/m);

    const received = listMailbox(path.join(env.server.dataDir, 'mailbox'));
    expect(received).toHaveLength(1);
    expect(received[0]!.envelopeTo).toEqual(['morwenna@tate-lettings.example']);
    expect(received[0]!.attachments[0]!.sha256).toBe(sha256(pdf));

    // The admin's mailbox lists it and opens the attachment.
    const adminContext = await env.browser.newContext();
    const admin = await adminContext.newPage();
    await signIn(admin, demoAdmin);
    await admin.goto(`${env.server.url}/admin/mailbox`);
    const row = admin.getByRole('row', { name: new RegExp(job.reference) });
    await row.waitFor();
    const link = row.getByRole('link', { name: /revision-1\.pdf$/ });
    const href = await link.getAttribute('href');
    const attachment = await admin.request.get(`${env.server.url}${href}`);
    expect(attachment.headers()['content-type']).toBe('application/pdf');
    expect(sha256(Buffer.from(await attachment.body()))).toBe(sha256(pdf));
    await adminContext.close();
    await context.close();
  });
});
