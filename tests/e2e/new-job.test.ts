import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { demoTester, useDemoServerAndBrowser } from '../helpers/browser.ts';
import { quickEntry } from '../helpers/console-page.ts';

/**
 * A new client's condition report from nothing, keyboard only: the demo tester adds a site, starts
 * an EICR on it and adds a 10-way board, types a reading in the console, then fills the supply
 * characteristics, two inspection items and observations, and sees the overall assessment turn
 * unsatisfactory when a C2 is added (any C1, C2 or FI makes a condition report unsatisfactory, C3
 * alone does not: BS 7671:2018 Appendix 6 notes on the condition report — common practice).
 * The client, address and readings are invented.
 */

const env = useDemoServerAndBrowser();

async function focused(page: Page) {
  return page.evaluate(() => {
    const el = document.activeElement;
    const label = el?.id ? document.querySelector(`label[for="${CSS.escape(el.id)}"]`)?.textContent : null;
    return label ?? el?.getAttribute('aria-label') ?? el?.tagName ?? '';
  });
}

async function jobRecord(page: Page, jobId: number) {
  return page.evaluate(async (id) => {
    const res = await fetch(`/api/jobs/${id}`);
    return (await res.json()) as {
      job: { reference: string };
      boards: { id: number; reference: string; circuitCount: number }[];
      record: Record<string, { data: Record<string, unknown>; version: number }>;
    };
  }, jobId);
}

describe('a new job from the keyboard', () => {
  it('when a tester creates a site, an EICR and a 10-way board and fills the report, then a C2 turns the assessment unsatisfactory', async () => {
    const context = await env.browser.newContext();
    const page = await context.newPage();
    await page.goto(`${env.server.url}/sign-in`);
    await page.getByLabel('E-mail').fill(demoTester.email);
    await page.getByLabel('Password').fill(demoTester.password);
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/jobs$/);
    await page.getByRole('searchbox', { name: 'Search' }).waitFor();

    // A new site; once added, the new job form opens on it.
    await page.keyboard.press('Alt+Shift+KeyS');
    await page.getByRole('dialog', { name: 'New site' }).waitFor();
    expect(await focused(page)).toBe('Client');
    await page.keyboard.type('Weaver’s Yard Studios');
    await page.keyboard.press('Tab');
    await page.keyboard.type('2 Weaver’s Yard, Kettleby');
    await page.keyboard.press('Enter');

    const newJob = page.getByRole('dialog', { name: 'New job' });
    await newJob.waitFor();
    expect(await newJob.getByLabel('Site').evaluate((el: HTMLSelectElement) => el.selectedOptions[0]?.textContent)).toMatch(/Weaver’s Yard Studios/);
    expect(await newJob.getByLabel('Kind of job').inputValue()).toBe('EICR');
    // Reference left blank: the app makes it from the company's pattern.
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/jobs\/\d+$/);
    const jobId = Number(new URL(page.url()).pathname.split('/').pop());
    const heading = page.getByRole('heading', { level: 1 });
    await expect.poll(() => heading.innerText()).toMatch(/^EICR \S+/);
    const reference = (await jobRecord(page, jobId)).job.reference;
    expect(reference).not.toBe('');
    expect(await heading.innerText()).toContain(reference);
    expect(await page.getByText(`Job EICR ${reference} started.`).count()).toBe(1);

    // A 10-way single-phase board; its console opens.
    await page.keyboard.press('Alt+Shift+KeyB');
    await page.getByRole('dialog', { name: 'New board' }).waitFor();
    expect(await focused(page)).toBe('Board reference');
    await page.keyboard.type('DB1');
    await page.keyboard.press('Tab');
    await page.keyboard.type('Ground floor lobby');
    for (let i = 0; i < 4; i += 1) await page.keyboard.press('Tab');
    expect(await focused(page)).toBe('Number of ways');
    await page.keyboard.type('10');
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/boards\/\d+$/);
    const grid = page.getByRole('grid');
    await grid.waitFor();
    const detail = await jobRecord(page, jobId);
    expect(detail.boards).toEqual([expect.objectContaining({ reference: 'DB1', circuitCount: 10 })]);

    // A reading typed in the console, and saved.
    await quickEntry(page, '1 zs 0.44');
    const status = page.getByRole('region', { name: 'Status line' });
    await expect.poll(() => status.innerText(), { timeout: 10_000 }).toMatch(/✓ saved/);

    // Back to the job screen (the browser's back).
    await page.goBack();
    await page.waitForURL(new RegExp(`/jobs/${jobId}$`));
    await heading.waitFor();

    // Supply characteristics: go to the section, choose from the keyboard, Enter moves on.
    await page.keyboard.press('Alt+Shift+KeyG');
    const palette = page.getByRole('dialog', { name: 'Command palette' });
    await palette.waitFor();
    await page.keyboard.type('supply');
    await page.keyboard.press('Enter');
    await expect.poll(() => focused(page)).toBe('Earthing system');
    await page.keyboard.press('ArrowDown'); // TN-S
    await page.keyboard.press('ArrowDown'); // TN-C-S
    await page.keyboard.press('Enter');
    expect(await focused(page)).toBe('Number and type of live conductors');
    await page.keyboard.press('ArrowDown'); // 1-phase 2-wire
    await page.keyboard.press('Enter');
    for (const value of ['230', '230', '50', '0.35', '1.6']) {
      await page.keyboard.type(value);
      await page.keyboard.press('Enter');
    }
    await expect
      .poll(async () => (await jobRecord(page, jobId)).record.supply!.data, { timeout: 10_000 })
      .toMatchObject({ earthing: 'TN-C-S', liveConductors: '1-phase 2-wire', u0V: 230, uV: 230, frequencyHz: 50, zeOhm: 0.35, ipfKa: 1.6 });

    // Two inspection items, one key each.
    await page.keyboard.press('Alt+Shift+KeyI');
    const schedule = page.getByRole('grid', { name: 'Schedule of inspections' });
    await expect.poll(() => schedule.evaluate((el) => el === document.activeElement)).toBe(true);
    await page.keyboard.press('v');
    await page.keyboard.press('n');
    await expect.poll(async () => (await jobRecord(page, jobId)).record.inspections!.data, { timeout: 10_000 }).toEqual({ '1.1': 'ok', '1.2': 'N/A' });

    // A C3 observation alone: still satisfactory.
    const assessment = page.getByTestId('overall-assessment');
    await page.keyboard.press('Alt+Shift+KeyO');
    const observation = page.getByRole('dialog', { name: 'New observation' });
    await observation.waitFor();
    await page.keyboard.type('Socket in the lobby has a cracked faceplate');
    await page.keyboard.press('Shift+Tab');
    expect(await focused(page)).toBe('Code');
    for (let i = 0; i < 3; i += 1) await page.keyboard.press('ArrowDown'); // C1, C2, C3
    await page.keyboard.press('Enter');
    await observation.waitFor({ state: 'detached' });
    await expect.poll(() => assessment.innerText()).toBe('satisfactory');

    // Item 3.3 (main bonding to services) coded C2 asks for its observation, tied to the item.
    await page.keyboard.press('Alt+Shift+KeyI');
    await page.keyboard.press('PageDown');
    await page.keyboard.press('PageDown');
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('2');
    const tied = page.getByRole('dialog', { name: 'New observation' });
    await tied.waitFor();
    expect(await tied.getByLabel('Inspection item').inputValue()).toBe('3.3');
    expect(await tied.getByLabel('Code').inputValue()).toBe('C2');
    await page.keyboard.type('No main protective bonding to the incoming gas pipe');
    await page.keyboard.press('Control+Enter');
    await tied.waitFor({ state: 'detached' });

    await expect.poll(() => assessment.innerText()).toBe('unsatisfactory');
    expect(await page.getByText(/Unsatisfactory because of observation 2 \(C2\)/).count()).toBe(1);
    const saved = (await jobRecord(page, jobId)).record;
    expect(Object.values(saved.observations!.data)).toEqual(
      expect.arrayContaining([expect.objectContaining({ number: 2, code: 'C2', inspectionItem: '3.3' }), expect.objectContaining({ number: 1, code: 'C3' })]),
    );
    expect(saved.inspections!.data).toEqual({ '1.1': 'ok', '1.2': 'N/A', '3.3': 'C2' });

    // After a reload everything is still there.
    await page.reload();
    await expect.poll(() => page.getByTestId('overall-assessment').innerText()).toBe('unsatisfactory');
    expect(await page.getByLabel('External loop impedance Ze (Ω)').inputValue()).toBe('0.35');
    await context.close();
  });
});
