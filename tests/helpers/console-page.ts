import type { BrowserContext, Page } from 'playwright-core';
import { expect } from 'vitest';

/** What the browser tests read of a circuit from the API. */
export interface CircuitInfo {
  id: number;
  number: string;
  cells: Record<string, { text: string; version: number } | undefined>;
}

/** GET through the context's session; the answer must be 200. */
export async function apiGet<T>(context: BrowserContext, baseUrl: string, path: string): Promise<T> {
  const res = await context.request.get(`${baseUrl}${path}`);
  expect(res.status()).toBe(200);
  return (await res.json()) as T;
}

/** The first open board whose circuits are numbered plainly (the house board of the demo). */
export async function pickPlainBoard(context: BrowserContext, baseUrl: string): Promise<{ boardId: number; circuits: CircuitInfo[] }> {
  const { boards } = await apiGet<{ boards: { id: number; state: string }[] }>(context, baseUrl, '/api/boards');
  for (const board of boards.filter((b) => b.state === 'open')) {
    const detail = await apiGet<{ circuits: CircuitInfo[] }>(context, baseUrl, `/api/boards/${board.id}`);
    if (detail.circuits.length >= 8 && detail.circuits.every((c) => /^\d+[a-z]?$/.test(c.number))) return { boardId: board.id, circuits: detail.circuits };
  }
  throw new Error('No open demo board with plainly numbered circuits');
}

/** Types one line on the quick-entry line (Ctrl+J from the grid), keyboard only. */
export async function quickEntry(page: Page, line: string): Promise<void> {
  await page.getByRole('grid').focus();
  await page.keyboard.press('Control+j');
  const input = page.getByLabel('Quick entry');
  await expect.poll(() => input.evaluate((el) => el === document.activeElement)).toBe(true);
  await page.keyboard.type(line);
  await page.keyboard.press('Enter');
}

/** The value shown in a grid cell (its first span; finding marks and their texts follow it). */
export function cellText(page: Page, circuitId: number, column: string): Promise<string> {
  return page.locator(`[id="bw-cell-${circuitId}-${column}"] > span`).first().innerText();
}
