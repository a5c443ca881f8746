import { describe, expect, it } from 'vitest';
import { demoTester, useDemoServerAndBrowser } from '../helpers/browser.ts';

/**
 * The sign-in page and the jobs list do not load the board console's code (grid, palette, checker,
 * sync engine); opening a board does. Scripts are recorded as the browser asks for them.
 */

const env = useDemoServerAndBrowser();

describe('code loaded per page', () => {
  it('when a person signs in and reaches the jobs list, then no console code is loaded; when a board opens, then it is', async () => {
    const context = await env.browser.newContext();
    const page = await context.newPage();
    const scripts: string[] = [];
    const bodies: Promise<string>[] = [];
    page.on('response', (r) => {
      if (r.request().resourceType() !== 'script') return;
      scripts.push(new URL(r.url()).pathname);
      bodies.push(r.text());
    });
    /** Whether any script loaded so far holds the console's sync engine (its outbox key). */
    const syncEngineLoaded = async () => (await Promise.all(bodies)).some((text) => text.includes('boardwalk.outbox.'));

    await page.goto(`${env.server.url}/sign-in`);
    await page.getByLabel('E-mail').waitFor();
    expect(scripts.filter((s) => /board-console/.test(s))).toEqual([]);
    expect(scripts.filter((s) => /jobs-page/.test(s))).toEqual([]);
    expect(await syncEngineLoaded()).toBe(false);

    await page.getByLabel('E-mail').fill(demoTester.email);
    await page.getByLabel('Password').fill(demoTester.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/jobs/);
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    expect(scripts.some((s) => /jobs-page/.test(s))).toBe(true);
    expect(scripts.filter((s) => /board-console/.test(s))).toEqual([]);
    expect(await syncEngineLoaded()).toBe(false);

    const boards = await page.evaluate(async () => ((await (await fetch('/api/boards')).json()) as { boards: { id: number }[] }).boards);
    await page.goto(`${env.server.url}/boards/${boards[0]!.id}`);
    await page.getByRole('grid').waitFor();
    expect(scripts.some((s) => /board-console/.test(s))).toBe(true);
    expect(await syncEngineLoaded()).toBe(true);
    await context.close();
  });
});
