import { describe, expect, it } from 'vitest';
import { demoTester, useDemoServerAndBrowser } from '../helpers/browser.ts';
import { apiGet, cellText, pickPlainBoard, quickEntry, type CircuitInfo } from '../helpers/console-page.ts';

/**
 * The console as testers use it, on the real stack: a fast typist in the jobs search, a reading
 * typed with its unit, a lone dash refused, a row pass with a tick.
 */

const env = useDemoServerAndBrowser();

async function signIn() {
  const context = await env.browser.newContext({ viewport: { width: 1366, height: 768 } });
  const page = await context.newPage();
  await page.goto(`${env.server.url}/sign-in`);
  await page.getByLabel('E-mail').fill(demoTester.email);
  await page.getByLabel('Password').fill(demoTester.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/jobs/);
  return { context, page };
}

describe('the console as testers use it', () => {
  it('when 30 characters are typed into the jobs search at one key every 5 ms, then none is lost and the address follows', async () => {
    const { context, page } = await signIn();
    const search = page.getByLabel('Search');
    await search.waitFor();
    await search.focus();
    const typed = 'unit 7 kitchen sockets ring 32A';
    expect(typed).toHaveLength(31);
    const thirty = typed.slice(0, 30);
    await page.keyboard.type(thirty, { delay: 5 });
    await expect.poll(() => search.inputValue()).toBe(thirty);
    await expect.poll(() => new URL(page.url()).searchParams.get('q')).toBe(thirty);
    await context.close();
  });

  it('when a reading is typed with its unit, then the unit is taken off; a lone dash is refused; a tick in a row pass moves along the row', async () => {
    const { context, page } = await signIn();
    const { boardId, circuits } = await pickPlainBoard(context, env.server.url);
    await page.goto(`${env.server.url}/boards/${boardId}`);
    const grid = page.getByRole('grid');
    await grid.waitFor();
    const status = page.getByRole('region', { name: 'Status line' });
    const third = circuits[2]!;

    await quickEntry(page, `${third.number} zs 0.41Ω, ir >299`);
    await expect.poll(() => cellText(page, third.id, 'zs')).toBe('0.41');
    await expect.poll(() => cellText(page, third.id, 'irLiveEarth')).toBe('>299');
    await expect.poll(() => status.innerText(), { timeout: 10_000 }).toMatch(/✓ saved/);

    // The cursor is on the third circuit's L-E (where the line landed): a dash there is refused.
    await page.keyboard.press('Escape');
    await page.keyboard.type('-');
    await page.keyboard.press('Enter');
    await expect.poll(() => status.innerText()).toMatch(/A dash is not a reading/);
    await page.keyboard.press('Escape');
    await expect.poll(() => cellText(page, third.id, 'irLiveEarth')).toBe('>299');

    // Along the row: Tab to Polarity, then v ticks and moves on to Zs of the same circuit.
    await page.keyboard.press('Tab');
    expect(await grid.getAttribute('aria-activedescendant')).toBe(`bw-cell-${third.id}-polarity`);
    await page.keyboard.type('v');
    await expect.poll(() => grid.getAttribute('aria-activedescendant')).toBe(`bw-cell-${third.id}-zs`);

    await expect.poll(async () => {
      const detail = await apiGet<{ circuits: CircuitInfo[] }>(context, env.server.url, `/api/boards/${boardId}`);
      const c = detail.circuits.find((x) => x.id === third.id)!;
      return [c.cells.zs?.text, c.cells.irLiveEarth?.text, c.cells.polarity?.text];
    }, { timeout: 10_000 }).toEqual(['0.41', '>299', '✓']);
    await context.close();
  });
});
