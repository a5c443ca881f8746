import type { BrowserContext, Page, Route } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { outboxStorageKey } from '../../src/features/board-console/sync/outbox-storage.ts';
import { demoTester, useDemoServerAndBrowser } from '../helpers/browser.ts';
import { apiGet, cellText, pickPlainBoard, quickEntry, type CircuitInfo } from '../helpers/console-page.ts';

/**
 * The console without a server: readings typed while the API cannot be reached wait in the
 * browser (localStorage), survive a reload of the page, and all land, in order, when the API
 * answers again. Keyboard only; what was saved is checked through the API.
 */


const env = useDemoServerAndBrowser();

const api = <T,>(context: BrowserContext, path: string) => apiGet<T>(context, env.server.url, path);

const pickBoard = (context: BrowserContext) => pickPlainBoard(context, env.server.url);



/** Whether the page says "offline" with this many edits waiting (header and status line both show it). */
function saysOffline(page: Page, waiting: number) {
  return page.getByText(`offline — ${waiting} waiting`).first().isVisible();
}

const abort = (route: Route) => route.abort('internetdisconnected');

describe('offline', () => {
  it('when the API cannot be reached, then typed readings wait, survive a reload, and all land in order when it is back', async () => {
    const context = await env.browser.newContext();
    expect((await context.request.post(`${env.server.url}/api/auth/sign-in`, { data: demoTester, headers: { origin: env.server.url } })).status()).toBe(200);
    const { boardId, circuits } = await pickBoard(context);
    const { user } = await api<{ user: { id: number } }>(context, '/api/auth/me');
    // The outbox is kept per person.
    const outboxKey = outboxStorageKey(boardId, user.id);
    const [first, second, third, fourth] = [circuits[2]!, circuits[3]!, circuits[4]!, circuits[5]!];

    const page = await context.newPage();
    await page.goto(`${env.server.url}/boards/${boardId}`);
    await page.getByRole('grid').waitFor();

    // Every API request fails, as with the network gone.
    await context.route('**/api/**', abort);
    await quickEntry(page, `${first.number} zs 0.81`);
    await quickEntry(page, `${second.number} zs 0.82`);
    await quickEntry(page, `${first.number} zs 0.83`);
    await expect.poll(() => saysOffline(page, 3), { timeout: 5000 }).toBe(true);
    expect(await cellText(page, first.id, 'zs')).toBe('0.83');
    const stored = await page.evaluate((key) => localStorage.getItem(key), outboxKey);
    expect((JSON.parse(stored ?? '{}') as { entries?: unknown[] }).entries).toHaveLength(3);

    // Reload the page with the writes still failing (the page itself and the board load).
    await context.unroute('**/api/**', abort);
    const refuseWrites = (route: Route) => (['PUT', 'PATCH', 'POST', 'DELETE'].includes(route.request().method()) ? abort(route) : route.fallback());
    await context.route('**/api/boards/**', refuseWrites);
    await page.reload();
    await page.getByRole('grid').waitFor();
    // The waiting readings are shown from the stored outbox, and still wait.
    expect(await cellText(page, first.id, 'zs')).toBe('0.83');
    expect(await cellText(page, second.id, 'zs')).toBe('0.82');
    await expect.poll(() => saysOffline(page, 3), { timeout: 5000 }).toBe(true);
    await quickEntry(page, `${third.number} zs 0.84`);
    await quickEntry(page, `${fourth.number} zs 0.85`);
    await expect.poll(() => saysOffline(page, 5), { timeout: 5000 }).toBe(true);

    // The API is back: everything lands (the retry waits at most 10 s), in the order typed.
    await context.unroute('**/api/boards/**', refuseWrites);
    const zsNow = async () => {
      const { circuits: now } = await api<{ circuits: CircuitInfo[] }>(context, `/api/boards/${boardId}`);
      return [first, second, third, fourth].map((c) => now.find((n) => n.id === c.id)?.cells.zs?.text);
    };
    await expect.poll(zsNow, { timeout: 20_000, interval: 250 }).toEqual(['0.83', '0.82', '0.84', '0.85']);
    await expect.poll(() => page.getByText(/^✓\s*saved$/).first().isVisible(), { timeout: 5000 }).toBe(true);
    const { history } = await api<{ history: { newText: string }[] }>(context, `/api/boards/${boardId}/circuits/${first.id}/cells/zs/history`);
    expect(history.slice(-2).map((h) => h.newText)).toEqual(['0.81', '0.83']);
    expect(await page.evaluate((key) => localStorage.getItem(key), outboxKey)).toBeNull();

    await context.close();
  });
});
