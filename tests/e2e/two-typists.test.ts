import type { BrowserContext, Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { demoReviewer, demoTester, useDemoServerAndBrowser } from '../helpers/browser.ts';
import { apiGet, cellText, pickPlainBoard, quickEntry, type CircuitInfo } from '../helpers/console-page.ts';

/**
 * Two typists on one board, each in their own browser context (own session, own storage). Driven
 * by the keyboard only: the quick-entry line (Ctrl+J) writes a reading, and a conflict's choice is
 * a focused button pressed with Enter. What was saved is checked through the API.
 */


const env = useDemoServerAndBrowser();

async function signedInContext(account: { email: string; password: string }): Promise<BrowserContext> {
  const context = await env.browser.newContext();
  const res = await context.request.post(`${env.server.url}/api/auth/sign-in`, { data: account, headers: { origin: env.server.url } });
  expect(res.status()).toBe(200);
  return context;
}

const api = <T,>(context: BrowserContext, path: string) => apiGet<T>(context, env.server.url, path);

const pickBoard = (context: BrowserContext) => pickPlainBoard(context, env.server.url);

async function openBoard(context: BrowserContext, boardId: number): Promise<Page> {
  const page = await context.newPage();
  await page.goto(`${env.server.url}/boards/${boardId}`);
  await page.getByRole('grid').waitFor();
  return page;
}



async function serverCell(context: BrowserContext, boardId: number, circuitId: number, column: string) {
  const { circuits } = await api<{ circuits: CircuitInfo[] }>(context, `/api/boards/${boardId}`);
  return circuits.find((c) => c.id === circuitId)?.cells[column];
}

describe('two typists on one board', () => {
  it('when both type into the same cell, then each sees the other within 2 s, the stale write is a conflict the typist settles, and no update is lost', async () => {
    const contextA = await signedInContext(demoTester);
    const contextB = await signedInContext(demoReviewer);
    const { boardId, circuits } = await pickBoard(contextA);
    const target = circuits[5]!;
    const column = 'zs';

    const pageA = await openBoard(contextA, boardId);
    const pageB = await openBoard(contextB, boardId);
    await expect.poll(() => pageA.getByText(/also on this board: .*Ruth Okafor-Lane/).count(), { timeout: 5000 }).toBeGreaterThan(0);

    // A types; B sees it without a reload, within two seconds.
    await quickEntry(pageA, `${target.number} zs 0.52`);
    const typedAt = Date.now();
    await expect.poll(() => cellText(pageB, target.id, column), { timeout: 2000, interval: 50 }).toBe('0.52');
    expect(Date.now() - typedAt).toBeLessThan(2000);

    // B stops hearing about changes (its feed is cut), so it keeps the version it saw.
    let feedAttempts = 0;
    await pageB.route('**/api/boards/*/changes**', (route) => {
      feedAttempts += 1;
      return route.abort();
    });
    await expect.poll(() => feedAttempts, { timeout: 5000 }).toBeGreaterThan(0);

    // A writes again; B, still seeing 0.52, writes over it.
    await quickEntry(pageA, `${target.number} zs 0.61`);
    await expect.poll(async () => (await serverCell(contextA, boardId, target.id, column))?.text, { timeout: 5000 }).toBe('0.61');
    expect(await cellText(pageB, target.id, column)).toBe('0.52');
    await quickEntry(pageB, `${target.number} zs 0.70`);

    // B is told, with both values and who wrote theirs; nothing was overwritten.
    const conflicts = pageB.getByRole('region', { name: 'Conflicts to settle' });
    await conflicts.waitFor({ timeout: 5000 });
    await expect.poll(() => conflicts.innerText()).toMatch(/Callum Brierley wrote “0\.61”; you wrote “0\.70”/);
    expect((await serverCell(contextA, boardId, target.id, column))?.text).toBe('0.61');
    await expect.poll(() => cellText(pageB, target.id, column)).toBe('0.61');

    // B chooses to write theirs over it, from the keyboard.
    await conflicts.getByRole('button', { name: /write my value 0\.70/ }).focus();
    await pageB.keyboard.press('Enter');
    await expect.poll(async () => (await serverCell(contextA, boardId, target.id, column))?.text, { timeout: 5000 }).toBe('0.70');
    await expect.poll(() => conflicts.count()).toBe(0);
    await pageB.unroute('**/api/boards/*/changes**');

    // A sees B's choice live.
    await expect.poll(() => cellText(pageA, target.id, column), { timeout: 2000, interval: 50 }).toBe('0.70');

    // Every saved write is in the cell's history, in order: no update was lost.
    const { history } = await api<{ history: { newText: string; by: { name: string } | null }[] }>(
      contextA,
      `/api/boards/${boardId}/circuits/${target.id}/cells/${column}/history`,
    );
    expect(history.slice(-3).map((h) => [h.newText, h.by?.name])).toEqual([
      ['0.52', 'Callum Brierley'],
      ['0.61', 'Callum Brierley'],
      ['0.70', 'Ruth Okafor-Lane'],
    ]);

    await contextA.close();
    await contextB.close();
  });

  it('when the second typist keeps theirs, then the first typist’s value stays and the second one’s is not written', async () => {
    const contextA = await signedInContext(demoTester);
    const contextB = await signedInContext(demoReviewer);
    const { boardId, circuits } = await pickBoard(contextA);
    const target = circuits[6]!;
    const column = 'zs';
    const pageA = await openBoard(contextA, boardId);
    const pageB = await openBoard(contextB, boardId);

    await pageB.route('**/api/boards/*/changes**', (route) => route.abort());
    await quickEntry(pageA, `${target.number} zs 0.33`);
    await expect.poll(async () => (await serverCell(contextA, boardId, target.id, column))?.text, { timeout: 5000 }).toBe('0.33');
    await quickEntry(pageB, `${target.number} zs 0.44`);

    const conflicts = pageB.getByRole('region', { name: 'Conflicts to settle' });
    await conflicts.waitFor({ timeout: 5000 });
    await conflicts.getByRole('button', { name: /keep their value 0\.33/ }).focus();
    await pageB.keyboard.press('Enter');
    await expect.poll(() => conflicts.count()).toBe(0);
    await pageB.unroute('**/api/boards/*/changes**');

    await expect.poll(() => cellText(pageB, target.id, column)).toBe('0.33');
    const cell = await serverCell(contextA, boardId, target.id, column);
    expect(cell?.text).toBe('0.33');
    const { history } = await api<{ history: { newText: string }[] }>(contextA, `/api/boards/${boardId}/circuits/${target.id}/cells/${column}/history`);
    expect(history.map((h) => h.newText)).not.toContain('0.44');

    await contextA.close();
    await contextB.close();
  });
});
