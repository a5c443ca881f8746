import zlib from 'node:zlib';
import type { BrowserContext, Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import type { Finding } from '../../shared/schemas/findings.ts';
import { demoAdmin, demoReviewer, demoTester, useDemoServerAndBrowser } from '../helpers/browser.ts';
import { quickEntry } from '../helpers/console-page.ts';

/**
 * Review to e-mail on the real stack, with the demo report (EICR) of the invented bakery, seeded
 * as the tester left it: every reading typed, submitted for review with a note, signed by the
 * inspector. The reviewer finds it in the queue, is refused locking with the gate's reasons,
 * accepts the Zs finding with a reason (the demo record already carries it as a C2 observation)
 * and sends the job back for the other two; the tester corrects them (an insulation reading taken
 * again, a LIM's reason) and submits it again with a note; the reviewer locks and approves, signs,
 * issues and e-mails it, and the message arrives at the project's own mail server with the issued
 * PDF attached.
 */

const env = useDemoServerAndBrowser();

async function signIn(account: { email: string; password: string }): Promise<{ context: BrowserContext; page: Page }> {
  const context = await env.browser.newContext();
  const page = await context.newPage();
  await page.goto(`${env.server.url}/sign-in`);
  await page.getByLabel('E-mail').fill(account.email);
  await page.getByLabel('Password').fill(account.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/jobs/);
  return { context, page };
}

/** A JSON call through the page's own session (same origin, as the app makes them). */
async function api<T>(page: Page, method: string, path: string, body?: unknown): Promise<{ status: number; body: T }> {
  return page.evaluate(
    async ({ method, path, body }) => {
      const res = await fetch(path, {
        method,
        headers: body === undefined ? { accept: 'application/json' } : { 'content-type': 'application/json', accept: 'application/json' },
        body: body === undefined ? undefined : JSON.stringify(body),
      });
      return { status: res.status, body: res.status === 204 ? null : await res.json() };
    },
    { method, path, body },
  ) as Promise<{ status: number; body: T }>;
}

/** A small PNG (8 × 8, one dark stroke) made here, so no file is shipped with the test. */
function signaturePng(): Buffer {
  const width = 8;
  const height = 8;
  const raw = Buffer.alloc((width * 3 + 1) * height, 255);
  for (let y = 0; y < height; y++) {
    raw[y * (width * 3 + 1)] = 0; // filter: none
    const x = y; // a diagonal stroke
    raw.fill(20, y * (width * 3 + 1) + 1 + x * 3, y * (width * 3 + 1) + 1 + x * 3 + 3);
  }
  const chunk = (type: string, data: Buffer) => {
    const length = Buffer.alloc(4);
    length.writeUInt32BE(data.length);
    const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
    const crc = Buffer.alloc(4);
    crc.writeUInt32BE(zlib.crc32(body));
    return Buffer.concat([length, body, crc]);
  };
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header[8] = 8; // bit depth
  header[9] = 2; // colour type: RGB
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', header), chunk('IDAT', zlib.deflateSync(raw)), chunk('IEND', Buffer.alloc(0))]);
}

interface BoardDetailAnswer {
  board: { id: number; reference: string; zdbOhm: number | null; state: string };
  circuits: Array<{ id: number; number: string; kind: string; cells: Record<string, { text: string; version: number } | undefined> }>;
  findings: Finding[];
}

describe('review, lock and issue', () => {
  it('when the demo EICR goes through review, then it is sent back, corrected, submitted, locked, approved, signed, issued and e-mailed, and the message arrives', async () => {
    const tester = await signIn(demoTester);
    const { jobs } = (await api<{ jobs: Array<{ id: number; kind: string; reference: string; state: string }> }>(tester.page, 'GET', '/api/jobs')).body;
    const job = jobs.find((j) => j.kind === 'EICR')!;
    expect(job.state).toBe('ready');
    const { boards } = (await api<{ boards: Array<{ id: number; job: { id: number } }> }>(tester.page, 'GET', '/api/boards')).body;
    const boardId = boards.find((b) => b.job.id === job.id)!.id;
    const detail = (await api<BoardDetailAnswer>(tester.page, 'GET', `/api/boards/${boardId}`)).body;
    // Nothing left to type: the seed recorded every reading of the board.
    expect(detail.findings.filter((f) => (f.severity as string) === 'todo')).toEqual([]);

    // The reviewer finds it in the queue and opens it from the keyboard; the tester's note is there.
    const reviewer = await signIn(demoReviewer);
    await reviewer.page.getByRole('link', { name: 'Review' }).click();
    const queued = reviewer.page.getByRole('link', { name: `EICR ${job.reference}` });
    await expect.poll(() => queued.evaluate((el) => el === document.activeElement), { timeout: 15_000 }).toBe(true);
    await reviewer.page.keyboard.press('Enter');
    await reviewer.page.waitForURL(new RegExp(`/review/${job.id}$`));
    await expect.poll(() => reviewer.page.getByText(/Submitted by Callum Brierley/).innerText(), { timeout: 10_000 }).toMatch(/9L3/);

    // Locking is refused with the gate's reasons: the three planted errors.
    await reviewer.page.getByRole('button', { name: 'Lock board MDB-1' }).click();
    const refusal = reviewer.page.getByRole('alert');
    await expect.poll(() => refusal.innerText()).toMatch(/Board MDB-1 was not locked/);
    const reasons = await refusal.getByRole('listitem').allInnerTexts();
    expect(reasons).toEqual([
      'Circuit 9L3: LIM in L-L has no reason recorded.',
      expect.stringMatching(/^Circuit 5L1: IR L-E 0\.6 MΩ is below the minimum 1\.0 MΩ/),
      expect.stringMatching(/^Circuit 6L1: Zs 1\.52 Ω is over the maximum 1\.37 Ω/),
    ]);

    // The reviewer accepts the Zs finding with a reason: j to it, a, the reason, Enter.
    const selected = () => reviewer.page.evaluate(() => document.activeElement?.id ?? '');
    const selectedText = () => reviewer.page.evaluate(() => document.activeElement?.textContent ?? '');
    for (let i = 0; i < 10 && !/Circuit 6L1 · Zs/.test(await selectedText()); i++) {
      const before = await selected();
      await reviewer.page.keyboard.press('j');
      // The selection moves on the next frame: wait for it before reading it.
      await expect.poll(selected).not.toBe(before);
    }
    expect(await selectedText()).toMatch(/Circuit 6L1 · Zs/);
    await reviewer.page.keyboard.press('a');
    const reason = reviewer.page.getByRole('textbox', { name: 'Why is it accepted?' });
    await expect.poll(() => reason.evaluate((el) => el === document.activeElement)).toBe(true);
    await reviewer.page.keyboard.type('Recorded as an observation coded C2; the client was told on site.');
    await reviewer.page.keyboard.press('Enter');
    await expect
      .poll(() => reviewer.page.getByRole('option', { name: /Circuit 6L1 · Zs/ }).innerText(), { timeout: 10_000 })
      .toMatch(/Accepted by Ruth Okafor-Lane, .*: “Recorded as an observation coded C2; the client was told on site\.”/);

    // The other two are the tester's to put right: the reviewer sends the job back with the reason.
    const sendBack = reviewer.page.getByRole('form', { name: 'Send the job back' });
    await sendBack.getByLabel('Send back to the tester, because…').fill('5L1: take L-E again once the cabinet is dry; 9L3: write the LIM reason against the cell.');
    await reviewer.page.keyboard.press('Enter');
    await expect.poll(async () => (await api<{ state: string }>(reviewer.page, 'GET', `/api/jobs/${job.id}/gate`)).body.state, { timeout: 10_000 }).toBe('entering');

    // The tester puts the other two right in the console: 5L1 measured again, 9L3's LIM given its reason.
    await tester.page.goto(`${env.server.url}/boards/${boardId}`);
    await tester.page.getByRole('grid').waitFor();
    await quickEntry(tester.page, '5L1 le 45');
    const status = tester.page.getByRole('region', { name: 'Status line' });
    await expect.poll(() => status.innerText(), { timeout: 10_000 }).toMatch(/✓ saved/);
    await tester.page.getByRole('grid').focus();
    await tester.page.keyboard.press('Control+g');
    await tester.page.getByRole('dialog', { name: 'Command palette' }).waitFor();
    await tester.page.keyboard.type('9L3');
    await tester.page.keyboard.press('Enter');
    await tester.page.keyboard.press('Control+Shift+g');
    await tester.page.getByRole('dialog', { name: 'Command palette' }).waitFor();
    await tester.page.keyboard.type('Insulation resistance between live conductors');
    await tester.page.keyboard.press('Enter');
    await tester.page.keyboard.press('Control+k');
    await tester.page.getByRole('dialog', { name: 'Command palette' }).waitFor();
    await tester.page.keyboard.type('mark a limitation');
    await tester.page.keyboard.press('Enter');
    await tester.page.keyboard.type('Fire alarm panel on its own supply, not isolated during trading');
    await tester.page.keyboard.press('Enter');
    await expect
      .poll(async () => {
        const now = (await api<BoardDetailAnswer>(tester.page, 'GET', `/api/boards/${boardId}`)).body;
        const c = (n: string) => now.circuits.find((x) => x.number === n)!;
        return [c('5L1').cells.irLiveEarth?.text, (c('9L3').cells.irLiveLive as { reason?: string } | undefined)?.reason];
      }, { timeout: 10_000 })
      .toEqual(['45', 'Fire alarm panel on its own supply, not isolated during trading']);

    // The tester submits again from the job screen, with a note; the gate's list is there before anyone tries.
    await tester.page.goto(`${env.server.url}/jobs/${job.id}`);
    const statePanel = tester.page.getByRole('region', { name: /^State:/ });
    await expect.poll(() => statePanel.innerText(), { timeout: 15_000 }).toMatch(/Board MDB-1 is not locked\./);
    await statePanel.getByLabel('Note for the reviewer (optional)').fill('5L1 taken again at 45 MΩ; 9L3 LIM reason written in.');
    await tester.page.keyboard.press('Enter');
    await expect.poll(() => statePanel.innerText()).toMatch(/Submitted: the job is waiting for a reviewer/);

    // The reviewer locks the board and approves the job (Alt+Shift+A).
    await reviewer.page.reload();
    await reviewer.page.getByRole('button', { name: 'Lock board MDB-1' }).click();
    await expect.poll(() => reviewer.page.getByRole('status').first().innerText(), { timeout: 10_000 }).toMatch(/Board MDB-1 locked\./);
    await expect.poll(() => reviewer.page.getByText('Every board is locked and the record passes the gate').count(), { timeout: 10_000 }).toBe(1);
    await reviewer.page.locator('body').focus();
    await reviewer.page.keyboard.press('Alt+Shift+KeyA');
    await expect.poll(() => reviewer.page.getByRole('status').first().innerText(), { timeout: 10_000 }).toMatch(/approved/);
    expect((await api<{ state: string }>(reviewer.page, 'GET', `/api/jobs/${job.id}/gate`)).body.state).toBe('approved');

    // An approved job refuses writes to its boards.
    const first = detail.circuits[0]!;
    const refused = await api<{ error: { message: string } }>(tester.page, 'PUT', `/api/boards/${boardId}/circuits/${first.id}/cells/zs`, { text: '0.99', version: first.cells.zs?.version ?? 1 });
    expect(refused.status).toBe(423);
    expect(refused.body.error.message).toMatch(/is approved/);

    // The inspector signed before submitting (seeded); the reviewer signs now.
    await reviewer.page.goto(`${env.server.url}/jobs/${job.id}`);
    const reviewerSign = reviewer.page.getByRole('form', { name: 'Sign this job' });
    await reviewerSign.waitFor({ timeout: 15_000 });
    await reviewerSign.getByLabel('Sign as').selectOption('reviewer');
    // The reviewer uploads an image of their signature instead (a PNG, checked by content on the server).
    await reviewerSign.getByLabel('Choose an image file').check();
    await reviewerSign.getByLabel(/^Signature image/).setInputFiles({ name: 'ruth-signature.png', mimeType: 'image/png', buffer: signaturePng() });
    await reviewerSign.getByRole('button', { name: /^Sign as reviewer/ }).click();
    await expect.poll(() => reviewerSign.getByRole('status').innerText(), { timeout: 10_000 }).not.toBe('');

    // The reviewer issues revision 1 and sends it to the site's contact.
    await reviewer.page.getByRole('button', { name: 'Issue revision 1' }).click();
    const issued = reviewer.page.getByRole('list', { name: 'Revisions' });
    await expect.poll(() => issued.innerText(), { timeout: 30_000 }).toMatch(/1/);
    const { issues } = (await api<{ issues: Array<{ revision: number; sha256: string }> }>(reviewer.page, 'GET', `/api/jobs/${job.id}/issues`)).body;
    expect(issues).toHaveLength(1);

    const sendForm = reviewer.page.getByRole('form', { name: 'Send the issued document' });
    await sendForm.waitFor({ timeout: 15_000 });
    await sendForm.getByRole('button', { name: 'Send to client' }).click();
    const mailList = reviewer.page.getByRole('list', { name: 'E-mails of this job' });
    await expect.poll(() => mailList.innerText(), { timeout: 30_000 }).toMatch(/sent/);

    // The message arrives at the project's own mail server, with the issued PDF attached unchanged.
    const admin = await signIn(demoAdmin);
    await expect
      .poll(async () => (await api<{ messages: unknown[] }>(admin.page, 'GET', '/api/admin/mailbox')).body.messages.length, { timeout: 30_000 })
      .toBe(1);
    const { messages } = (await api<{ messages: Array<{ to: string; attachments: Array<{ contentType: string; sha256: string }> }> }>(admin.page, 'GET', '/api/admin/mailbox')).body;
    expect(messages[0]!.to).toMatch(/facilities@corbel-bakehouse\.example\.test/);
    expect(messages[0]!.attachments.map((a) => [a.contentType, a.sha256])).toEqual([['application/pdf', issues[0]!.sha256]]);

    await tester.context.close();
    await reviewer.context.close();
    await admin.context.close();
  });
});
