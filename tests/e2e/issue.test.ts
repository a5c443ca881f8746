import { describe, expect, it } from 'vitest';
import { addSignatures } from '../helpers/issue-fixture.ts';
import { demoReviewer, useDemoServerAndBrowser } from '../helpers/browser.ts';

/**
 * Issuing from the job screen on the real stack: the demo EICR, approved and signed (set up in
 * the database here: the gate and signing have browser tests of their own), is issued by the demo
 * reviewer from the issue panel with the keyboard; the revision is listed, its PDF downloads with
 * the stored SHA-256; reopening with a reason keeps it.
 */

const env = useDemoServerAndBrowser();

describe('issue from the job screen', () => {
  it('when the reviewer issues the approved EICR and reopens it, then revision 1 downloads unchanged with its SHA-256', async () => {
    const { db, dataDir } = env.server;
    const job = await db.selectFrom('jobs').selectAll().where('kind', '=', 'EICR').executeTakeFirstOrThrow();
    const people = await db.selectFrom('users').select(['id', 'role']).execute();
    const tester = people.find((p) => p.role === 'tester')!.id;
    const reviewer = people.find((p) => p.role === 'reviewer')!.id;
    await addSignatures(db, dataDir, job.id, tester, reviewer);
    await db.updateTable('boards').set({ state: 'locked', locked_by: reviewer, locked_at: '2026-12-02T08:00:00.000Z' }).where('job_id', '=', job.id).execute();
    await db.updateTable('jobs').set({ state: 'approved' }).where('id', '=', job.id).execute();

    const context = await env.browser.newContext();
    const page = await context.newPage();
    await page.goto(`${env.server.url}/sign-in`);
    await page.getByLabel('E-mail').fill(demoReviewer.email);
    await page.getByLabel('Password').fill(demoReviewer.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/jobs/);
    await page.goto(`${env.server.url}/jobs/${job.id}`);

    const panel = page.getByRole('region', { name: 'Issued documents' });
    const issue = panel.getByRole('button', { name: 'Issue revision 1' });
    await issue.focus();
    await page.keyboard.press('Enter');
    await expect.poll(() => panel.getByRole('status').innerText(), { timeout: 20_000 }).toMatch(/Revision 1 issued/);

    const link = panel.getByRole('link', { name: /Download KVE-EICR-2026-057 revision 1/ });
    const href = await link.getAttribute('href');
    const stored = await db.selectFrom('job_issues').select('sha256').where('job_id', '=', job.id).where('revision', '=', 1).executeTakeFirstOrThrow();
    // SHA-256 computed in the browser (Web Crypto) over the bytes the link serves.
    const digest = (url: string) =>
      page.evaluate(async (u) => {
        const bytes = await (await fetch(u)).arrayBuffer();
        return [...new Uint8Array(await crypto.subtle.digest('SHA-256', bytes))].map((b) => b.toString(16).padStart(2, '0')).join('');
      }, url);
    expect(await digest(href!)).toBe(stored.sha256);

    const reason = panel.getByLabel('Why the issued report must change');
    await reason.fill('Client asked for the shop’s trading name on the report');
    await reason.press('Enter');
    await expect.poll(() => panel.getByRole('status').innerText(), { timeout: 10_000 }).toMatch(/Reopened: the job is being entered again/);
    const after = await db.selectFrom('jobs').select('state').where('id', '=', job.id).executeTakeFirstOrThrow();
    expect(after.state).toBe('entering');
    expect(await digest(href!)).toBe(stored.sha256);
    await context.close();
  });
});
