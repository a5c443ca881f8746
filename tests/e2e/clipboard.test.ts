import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { demoTester, useDemoServerAndBrowser } from '../helpers/browser.ts';

/**
 * Copy and paste of ranges as tab-separated text, in a real browser: what a spreadsheet puts on
 * the clipboard lands in the grid, and a range copied from the grid reads back as the same text.
 */

const env = useDemoServerAndBrowser();

interface ApiCircuit {
  id: number;
  number: string;
  cells: Record<string, { text: string } | undefined>;
}

async function circuitsOf(page: Page, boardId: number): Promise<ApiCircuit[]> {
  return page.evaluate(async (id) => ((await (await fetch(`/api/boards/${id}`)).json()) as { circuits: ApiCircuit[] }).circuits, boardId);
}

async function jumpToColumn(page: Page, label: string): Promise<void> {
  await page.keyboard.press('Control+Shift+g');
  await page.getByRole('dialog', { name: 'Command palette' }).waitFor();
  await expect.poll(() => page.evaluate(() => document.activeElement?.tagName)).toBe('INPUT');
  await page.keyboard.type(label);
  await page.keyboard.press('Enter');
  await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('role'))).toBe('grid');
}

describe('clipboard', () => {
  it('when blocks are pasted from a spreadsheet and ranges copied, then the cells and the clipboard hold tab-separated text', async () => {
    const context = await env.browser.newContext({ permissions: ['clipboard-read', 'clipboard-write'] });
    expect((await context.request.post(`${env.server.url}/api/auth/sign-in`, { data: demoTester, headers: { origin: env.server.url } })).status()).toBe(200);
    const page = await context.newPage();
    const boards = (await (await context.request.get(`${env.server.url}/api/boards`)).json()) as { boards: { id: number; phases: number }[] };
    const boardId = boards.boards.find((b) => b.phases === 3)!.id;
    await page.goto(`${env.server.url}/boards/${boardId}`);
    await page.getByRole('grid').waitFor();
    await page.getByRole('grid').focus();

    // A 2×2 block (insulation L-L and L-E, side by side in the grid) pasted at L-L of circuit 1.
    await jumpToColumn(page, 'L-L');
    await page.keyboard.press('Control+ArrowUp');
    await page.evaluate(() => navigator.clipboard.writeText('>299\t>200\r\n150\t180\r\n'));
    await page.keyboard.press('Control+v');
    await expect
      .poll(async () => (await circuitsOf(page, boardId)).slice(0, 2).map((c) => [c.cells.irLiveLive?.text, c.cells.irLiveEarth?.text]), { timeout: 5000 })
      .toEqual([['>299', '>200'], ['150', '180']]);
    // Copied back as the same block: select it afresh from L-L of circuit 1.
    await page.keyboard.press('Escape');
    await jumpToColumn(page, 'L-L');
    await page.keyboard.press('Control+ArrowUp');
    await page.keyboard.press('Shift+ArrowDown');
    await page.keyboard.press('Shift+ArrowRight');
    await page.keyboard.press('Control+c');
    await expect.poll(() => page.evaluate(() => navigator.clipboard.readText()), { timeout: 5000 }).toMatch(/^>299\t>200\r?\n150\t180\r?\n?$/);

    // A column of three values at Zs of circuit 1.
    await page.keyboard.press('Escape');
    await jumpToColumn(page, 'Zs');
    await page.keyboard.press('Control+ArrowUp');
    await page.evaluate(() => navigator.clipboard.writeText('0.71\n0.72\n0.73\n'));
    await page.keyboard.press('Control+v');
    await expect
      .poll(async () => (await circuitsOf(page, boardId)).slice(0, 3).map((c) => c.cells.zs?.text ?? ''), { timeout: 5000 })
      .toEqual(['0.71', '0.72', '0.73']);

    // Select the same three cells and copy them.
    await page.keyboard.press('Control+ArrowUp');
    await page.keyboard.press('Shift+ArrowDown');
    await page.keyboard.press('Shift+ArrowDown');
    await page.evaluate(() => navigator.clipboard.writeText('untouched'));
    await page.keyboard.press('Control+c');
    await expect.poll(() => page.evaluate(() => navigator.clipboard.readText()), { timeout: 5000 }).toMatch(/^0\.71\r?\n0\.72\r?\n0\.73\r?\n?$/);
    await context.close();
  });
});
