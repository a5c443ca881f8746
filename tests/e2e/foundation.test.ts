import { describe, expect, it } from 'vitest';
import { demoTester, useDemoServerAndBrowser } from '../helpers/browser.ts';

/**
 * The first slice end to end on the real stack: the demo tester signs in, opens a board, types a
 * reading, reloads, and finds it there; and is shown the lock command disabled, with the reason.
 */

const env = useDemoServerAndBrowser();

describe('foundation', () => {
  it('when the demo tester types a reading and reloads, then the reading is still there; locking is refused with its reason', async () => {
    const context = await env.browser.newContext();
    const page = await context.newPage();

    await page.goto(`${env.server.url}/sign-in`);
    await page.getByLabel('E-mail').fill(demoTester.email);
    await page.getByLabel('Password').fill(demoTester.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/jobs/);

    const boards = await page.evaluate(async () => ((await (await fetch('/api/boards')).json()) as { boards: { id: number; state: string }[] }).boards);
    const board = boards.find((b) => b.state === 'open');
    if (!board) throw new Error('No open demo board');
    await page.goto(`${env.server.url}/boards/${board.id}`);
    const grid = page.getByRole('grid');
    await grid.waitFor();

    // Zs of the second circuit, typed over whatever was there.
    await page.keyboard.press('Control+Shift+g');
    await page.getByRole('dialog', { name: 'Command palette' }).waitFor();
    await page.keyboard.type('Maximum measured earth fault loop impedance');
    await page.keyboard.press('Enter');
    await page.keyboard.press('Control+ArrowUp');
    await page.keyboard.press('ArrowDown');
    const cellId = await grid.getAttribute('aria-activedescendant');
    expect(cellId).toMatch(/^bw-cell-\d+-zs$/);
    await page.keyboard.type('0.37');
    await page.keyboard.press('Enter');
    const status = page.getByRole('region', { name: 'Status line' });
    await expect.poll(() => status.innerText(), { timeout: 10_000 }).toMatch(/✓ saved/);

    await page.reload();
    await grid.waitFor();
    await expect.poll(() => page.locator(`[id="${cellId}"] > span`).first().innerText(), { timeout: 10_000 }).toBe('0.37');

    // A tester may not lock: the palette shows the command disabled, with the reason.
    await page.keyboard.press('Control+k');
    const palette = page.getByRole('dialog', { name: 'Command palette' });
    await palette.waitFor();
    await page.keyboard.type('lock the board');
    const lock = palette.getByRole('option', { name: /^Lock the board/ });
    await expect.poll(() => lock.getAttribute('aria-label')).toMatch(/not available: Only a reviewer or an admin can lock a board/);
    await expect.poll(() => lock.innerText()).toMatch(/Only a reviewer or an admin can lock a board/);
    await page.keyboard.press('Enter');
    await expect.poll(() => palette.getByRole('status').innerText()).toMatch(/Lock the board: Only a reviewer or an admin can lock a board/);
    await page.keyboard.press('Escape');
    const after = await page.evaluate(async (id) => ((await (await fetch(`/api/boards/${id}`)).json()) as { board: { state: string } }).board.state, board.id);
    expect(after).toBe('open');
    await context.close();
  });
});
