import { describe, expect, it } from 'vitest';
import { demoTester, useDemoServerAndBrowser } from '../helpers/browser.ts';
import { apiGet, pickPlainBoard } from '../helpers/console-page.ts';

/**
 * A report started from an earlier job, end to end: the new job's boards are copies whose circuits
 * remember the same circuit last time; on the new board the status line shows last time's Zs of
 * the active cell, and a Zs typed more than a fifth higher is noted (common practice).
 */

const env = useDemoServerAndBrowser();

describe('readings against last time', () => {
  it('when a report starts from an earlier job, then the console shows last time’s Zs and notes a rise of more than a fifth', async () => {
    const context = await env.browser.newContext();
    expect((await context.request.post(`${env.server.url}/api/auth/sign-in`, { data: demoTester, headers: { origin: env.server.url } })).status()).toBe(200);

    // An earlier demo board with a Zs on one of its circuits.
    const earlier = await pickPlainBoard(context, env.server.url);
    const detail = await apiGet<{ board: { reference: string }; job: { id: number; reference: string; visitDate: string }; site: { id: number } }>(
      context,
      env.server.url,
      `/api/boards/${earlier.boardId}`,
    );
    const index = earlier.circuits.findIndex((c) => /^\d+(\.\d+)?$/.test(c.cells.zs?.text ?? '') && Number(c.cells.zs!.text) > 0.1);
    expect(index).toBeGreaterThanOrEqual(0);
    const lastZs = earlier.circuits[index]!.cells.zs!.text;

    // A new report on the same site, started from that job.
    const created = await context.request.post(`${env.server.url}/api/jobs`, {
      data: { siteId: detail.site.id, kind: 'EICR', visitDate: '2031-05-20', startFromJobId: detail.job.id },
      headers: { origin: env.server.url },
    });
    expect(created.status()).toBe(201);
    const { job } = (await created.json()) as { job: { id: number } };
    const { boards } = await apiGet<{ boards: { id: number; reference: string }[] }>(context, env.server.url, `/api/jobs/${job.id}`);
    const copyId = boards.find((b) => b.reference === detail.board.reference)!.id;
    const copy = await apiGet<{ circuits: { id: number; number: string; cells: Record<string, unknown> }[]; previousReadings: { circuitId: number }[] }>(
      context,
      env.server.url,
      `/api/boards/${copyId}`,
    );
    // Circuit details copied, readings left empty, each circuit linked to itself last time.
    expect(copy.previousReadings.map((p) => p.circuitId)).toEqual(copy.circuits.map((c) => c.id));
    expect(copy.circuits.every((c) => Object.keys(c.cells).length === 0)).toBe(true);
    const target = copy.circuits[index]!;

    const page = await context.newPage();
    await page.goto(`${env.server.url}/boards/${copyId}`);
    const grid = page.getByRole('grid');
    await grid.waitFor();
    await grid.focus();
    // Zs of the circuit: jump to the column, to the top, then down to the circuit.
    await page.keyboard.press('Control+Shift+g');
    await page.getByRole('dialog', { name: 'Command palette' }).waitFor();
    await expect.poll(() => page.evaluate(() => document.activeElement?.tagName)).toBe('INPUT');
    await page.keyboard.type('Zs');
    await page.keyboard.press('Enter');
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('role'))).toBe('grid');
    await page.keyboard.press('Control+ArrowUp');
    for (let i = 0; i < index; i++) await page.keyboard.press('ArrowDown');
    expect(await grid.getAttribute('aria-activedescendant')).toBe(`bw-cell-${target.id}-zs`);

    const status = page.getByRole('region', { name: 'Status line' });
    await expect.poll(() => status.innerText()).toContain(`Last time (${detail.job.reference}, ${detail.job.visitDate}): ${lastZs}`);

    // Well over a fifth above last time, and over 0.05 Ω more (common practice; the checker's floor).
    const risen = Math.max(Number(lastZs) * 1.3, Number(lastZs) + 0.08).toFixed(2);
    await page.keyboard.type(risen);
    await page.keyboard.press('Enter');
    const findings = page.getByRole('list', { name: 'Findings' });
    await expect.poll(() => findings.innerText(), { timeout: 10_000 }).toMatch(new RegExp(`Zs ${risen} Ω has risen from [0-9.]+ Ω last time`));
    // Saved, and the server's checker says the same.
    await expect.poll(() => status.innerText(), { timeout: 10_000 }).toMatch(/✓ saved/);
    const after = await apiGet<{ findings: { code: string; circuitId: number | null }[] }>(context, env.server.url, `/api/boards/${copyId}`);
    expect(after.findings.filter((f) => f.code === 'zs-risen-since-last-time').map((f) => f.circuitId)).toEqual([target.id]);
    await context.close();
  });
});
