import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import type { ReadingKey } from '../../shared/schemas/columns.ts';
import { demoTester, useDemoServerAndBrowser } from '../helpers/browser.ts';
import { gridColumnKeys, planTyping } from '../helpers/keystroke-plan.ts';

/**
 * A whole single-phase board typed with the keyboard alone: sign-in, every reading each circuit
 * needs, column by column (Enter passing the cells a circuit does not need), a spur linked and a
 * limitation marked from the command palette. Afterwards the API must hold every value in its cell.
 * A listener in the page counts pointer events; it must stay at 0.
 */

interface ApiCircuit {
  id: number;
  number: string;
  kind: 'ring' | 'radial' | 'spur' | 'distribution';
  afdd: 'yes' | 'no' | null;
  rcdType: 'AC' | 'A' | 'F' | 'B' | 'S-AC' | 'S-A' | null;
  spurRingId: number | null;
  spurOriginPoint: string | null;
  spurLengthM: number | null;
  cells: Record<string, { text: string; reason: string | null } | undefined>;
}

const env = useDemoServerAndBrowser();

/** Counts events a pointing device makes. A click the keyboard causes (Enter on a button) has detail 0 and is not counted. */
function countPointerEvents() {
  const w = window as unknown as { __pointerEvents: string[] };
  w.__pointerEvents = [];
  const always = ['mousedown', 'mouseup', 'pointerdown', 'pointerup', 'touchstart', 'wheel'];
  for (const type of always) window.addEventListener(type, () => w.__pointerEvents.push(type), true);
  for (const type of ['click', 'dblclick', 'auxclick', 'contextmenu']) {
    window.addEventListener(type, (event) => {
      const pointer = event as PointerEvent;
      if (pointer.detail !== 0 || (pointer.pointerType !== undefined && pointer.pointerType !== '')) w.__pointerEvents.push(type);
    }, true);
  }
}

async function pointerEvents(page: Page): Promise<string[]> {
  return page.evaluate(() => (window as unknown as { __pointerEvents: string[] }).__pointerEvents);
}

async function boardFromPage(page: Page, boardId: number): Promise<ApiCircuit[]> {
  return page.evaluate(async (id) => {
    const res = await fetch(`/api/boards/${id}`);
    return ((await res.json()) as { circuits: ApiCircuit[] }).circuits;
  }, boardId);
}

/** Waits until the palette's field has the focus (each step mounts a new one). */
async function paletteField(page: Page): Promise<void> {
  await page.getByRole('dialog', { name: 'Command palette' }).waitFor();
  await expect.poll(() => page.evaluate(() => document.activeElement?.tagName)).toBe('INPUT');
}

async function paletteCommand(page: Page, words: string): Promise<void> {
  await page.keyboard.press('Control+k');
  await paletteField(page);
  await page.keyboard.type(words);
  await page.keyboard.press('Enter');
}

async function answer(page: Page, text: string): Promise<void> {
  await paletteField(page);
  if (text) await page.keyboard.type(text);
  await page.keyboard.press('Enter');
}

async function gridHasFocus(page: Page): Promise<boolean> {
  return page.evaluate(() => document.activeElement?.getAttribute('role') === 'grid');
}

describe('typing a whole board with the keyboard only', () => {
  it('when a tester types every reading of the house board and uses the palette, then the API holds every value and no pointer was used', async () => {
    const context = await env.browser.newContext();
    const page = await context.newPage();
    await page.addInitScript(countPointerEvents);

    // Sign in by keyboard: the e-mail field has the focus.
    await page.goto(`${env.server.url}/sign-in`);
    await page.getByLabel('E-mail').waitFor();
    await page.keyboard.type(demoTester.email);
    await page.keyboard.press('Tab');
    await page.keyboard.type(demoTester.password);
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/jobs/);

    // The single-phase demo board, found through the API in the page.
    const boards = await page.evaluate(async () => ((await (await fetch('/api/boards')).json()) as { boards: { id: number; phases: number; state: string }[] }).boards);
    const board = boards.find((b) => b.phases === 1 && b.state === 'open');
    if (!board) throw new Error('No open single-phase demo board');
    await page.goto(`${env.server.url}/boards/${board.id}`);
    await page.getByRole('grid').waitFor();
    await expect.poll(() => gridHasFocus(page)).toBe(true);

    const circuits = await boardFromPage(page, board.id);
    expect(circuits.length).toBeGreaterThanOrEqual(12);

    // What to type in each reading column, circuit by circuit, as the cell must then hold it ('' for
    // nothing: a reading the circuit does not need is left as it is, and Enter passes it when empty).
    const ring = (c: ApiCircuit) => c.kind === 'ring';
    const typed: Array<{ column: ReadingKey; stored: string[] }> = [
      { column: 'ringR1', stored: circuits.map((c, i) => (ring(c) ? `0.${41 + i}` : '')) },
      { column: 'ringRn', stored: circuits.map((c, i) => (ring(c) ? `0.${42 + i}` : '')) },
      { column: 'ringR2', stored: circuits.map((c, i) => (ring(c) ? `0.${68 + i}` : '')) },
      { column: 'r1PlusR2', stored: circuits.map((_, i) => `0.${21 + i}`) },
      { column: 'irTestVoltage', stored: circuits.map(() => '500') },
      { column: 'irLiveLive', stored: circuits.map((_, i) => (i % 3 === 0 ? '>299' : '>200')) },
      { column: 'irLiveEarth', stored: circuits.map((_, i) => (i === 2 ? '180' : '>200')) },
      { column: 'polarity', stored: circuits.map(() => '✓') },
      { column: 'zs', stored: circuits.map((_, i) => `0.${45 + i}`) },
      { column: 'rcdTimeMs', stored: circuits.map((c, i) => (c.rcdType ? String(17 + i) : '')) },
      { column: 'rcdButton', stored: circuits.map((c) => (c.rcdType ? '✓' : '')) },
      { column: 'afddButton', stored: circuits.map((c) => (c.afdd === 'yes' ? '✓' : '')) },
    ];
    const script = new Map(typed.map((t) => [t.column, t.stored]));

    // The keys, planned with the console's own navigation from the board as it stands: the cursor
    // starts on r1 of the first circuit; Enter goes down to the next cell that applies (or holds a
    // value), from the last to the next column; → steps over the detail columns between.
    const plan = planTyping({
      circuits,
      script: (row, column) => script.get(column)?.[row] ?? '',
      columns: typed.map((t) => t.column),
      rule: 'skip',
      start: { row: 0, col: gridColumnKeys.indexOf('ringR1') },
    });
    for (const value of plan.values) {
      for (const press of [...value.navigation, ...value.presses]) await page.keyboard.press(press.key);
    }
    expect(await gridHasFocus(page)).toBe(true);

    // The palette: circuit 4a is a spur of ring 4 from socket 7, 6 m of cable.
    const spur = circuits.find((c) => c.number === '4a');
    const ring4 = circuits.find((c) => c.number === '4');
    if (!spur || !ring4) throw new Error('The house board has circuits 4 and 4a');
    await page.keyboard.press('Control+g');
    await answer(page, '4a');
    await expect.poll(() => gridHasFocus(page)).toBe(true);
    await paletteCommand(page, 'link a spur');
    await answer(page, 'Ground-floor sockets');
    await answer(page, 'socket 7');
    await answer(page, '6');
    await answer(page, '');
    // Fused or unfused: an unfused spur (one twin socket).
    await answer(page, 'unfused');
    await expect.poll(() => gridHasFocus(page)).toBe(true);

    // A limitation with its reason on L-L of the last circuit.
    const last = circuits[circuits.length - 1]!;
    await page.keyboard.press('Control+g');
    await answer(page, last.number);
    await expect.poll(() => gridHasFocus(page)).toBe(true);
    await page.keyboard.press('Control+Shift+g');
    await answer(page, 'Insulation resistance between live conductors');
    await expect.poll(() => gridHasFocus(page)).toBe(true);
    await paletteCommand(page, 'mark a limitation');
    await answer(page, 'Supply to the garden office could not be isolated');
    await expect.poll(() => gridHasFocus(page)).toBe(true);

    // Everything reached the env.server.
    await expect.poll(() => page.getByRole('region', { name: 'Status line' }).innerText(), { timeout: 10_000 }).toMatch(/✓ saved/);
    const saved = await boardFromPage(page, board.id);
    const mismatches: string[] = [];
    for (const set of typed) {
      saved.forEach((c, i) => {
        let want = set.stored[i] || (circuits[i]?.cells[set.column]?.text ?? '');
        if (c.id === last.id && set.column === 'irLiveLive') want = 'LIM';
        const got = c.cells[set.column]?.text ?? '';
        if (got !== want) mismatches.push(`${c.number} ${set.column}: ${got} ≠ ${want}`);
      });
    }
    expect(mismatches).toEqual([]);
    const savedSpur = saved.find((c) => c.id === spur.id)!;
    expect(savedSpur).toMatchObject({ kind: 'spur', spurRingId: ring4.id, spurOriginPoint: 'socket 7', spurLengthM: 6 });
    expect(saved.find((c) => c.id === last.id)?.cells.irLiveLive).toMatchObject({ text: 'LIM', reason: 'Supply to the garden office could not be isolated' });

    expect(await pointerEvents(page)).toEqual([]);
    await context.close();
  });
});
