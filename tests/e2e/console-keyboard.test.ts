import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { columns } from '../../shared/schemas/columns.ts';
import { demoTester, launchBrowser, startDemoServer, type DemoServer } from '../helpers/browser.ts';

/**
 * A whole single-phase board typed with the keyboard alone: sign-in, every reading of every circuit
 * column by column, a spur linked and a limitation marked from the command palette. Afterwards the
 * API must hold every value. A listener in the page counts pointer events; it must stay at 0.
 */

interface ApiCircuit {
  id: number;
  number: string;
  kind: string;
  afdd: 'yes' | 'no' | null;
  rcdType: string | null;
  spurRingId: number | null;
  spurOriginPoint: string | null;
  spurLengthM: number | null;
  cells: Record<string, { text: string; reason: string | null } | undefined>;
}

let server: DemoServer;
let browser: Browser;

beforeAll(async () => {
  server = await startDemoServer();
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await server?.close();
});

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
    const context = await browser.newContext();
    const page = await context.newPage();
    await page.addInitScript(countPointerEvents);

    // Sign in by keyboard: the e-mail field has the focus.
    await page.goto(`${server.url}/sign-in`);
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
    await page.goto(`${server.url}/boards/${board.id}`);
    await page.getByRole('grid').waitFor();
    await expect.poll(() => gridHasFocus(page)).toBe(true);

    const circuits = await boardFromPage(page, board.id);
    expect(circuits.length).toBeGreaterThanOrEqual(12);

    // What to type in each reading column, circuit by circuit, and what the cell must then hold.
    const ring = (c: ApiCircuit) => c.kind === 'ring';
    const typed: Array<{ column: string; values: string[]; stored: string[]; ditto?: boolean }> = [
      { column: 'ringR1', values: circuits.map((c, i) => (ring(c) ? `.${41 + i}` : 'na')), stored: [] },
      { column: 'ringRn', values: circuits.map((c, i) => (ring(c) ? `.${42 + i}` : 'na')), stored: [] },
      { column: 'ringR2', values: circuits.map((c, i) => (ring(c) ? `.${68 + i}` : 'na')), stored: [] },
      { column: 'r1PlusR2', values: circuits.map((_, i) => `.${21 + i}`), stored: [] },
      { column: 'irTestVoltage', values: circuits.map(() => '500'), stored: [], ditto: true },
      { column: 'irLiveLive', values: circuits.map((_, i) => (i % 3 === 0 ? '>299' : '>200')), stored: [] },
      { column: 'irLiveEarth', values: circuits.map((_, i) => (i === 2 ? '180' : '>200')), stored: [] },
      { column: 'polarity', values: circuits.map(() => 'v'), stored: [] },
      { column: 'zs', values: circuits.map((_, i) => `.${45 + i}`), stored: [] },
      { column: 'rcdTimeMs', values: circuits.map((c, i) => (c.rcdType ? String(17 + i) : 'na')), stored: [] },
      { column: 'rcdButton', values: circuits.map((c) => (c.rcdType ? 'v' : 'na')), stored: [] },
      { column: 'afddButton', values: circuits.map((c) => (c.afdd === 'yes' ? 'v' : 'na')), stored: [] },
    ];
    for (const set of typed) {
      set.stored = set.values.map((v) => (v === 'na' ? 'N/A' : v === 'v' ? '✓' : v.startsWith('.') ? `0${v}` : v));
    }
    // Columns between one typed column and the next (details, the unused R2): → steps over them.
    const order = columns.map((c) => c.key as string);
    const stepOver = (column: string, next: string | undefined) => (next ? order.indexOf(next) - order.indexOf(column) - 1 : 0);

    // The cursor starts on r1 of the first circuit; Enter goes down, and from the last circuit to
    // the top of the next column.
    for (const [t, set] of typed.entries()) {
      for (let i = 0; i < circuits.length; i++) {
        if (set.ditto && i > 0) {
          await page.keyboard.press("Control+'");
        } else if (set.values[i] === 'v') {
          // A tick in a ✓/✗ column is one key: saved, and on down the column.
          await page.keyboard.press('v');
        } else {
          await page.keyboard.type(set.values[i]!);
          await page.keyboard.press('Enter');
        }
      }
      for (let n = 0; n < stepOver(set.column, typed[t + 1]?.column); n++) await page.keyboard.press('ArrowRight');
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

    // Everything reached the server.
    await expect.poll(() => page.getByRole('region', { name: 'Status line' }).innerText(), { timeout: 10_000 }).toMatch(/✓ saved/);
    const saved = await boardFromPage(page, board.id);
    const mismatches: string[] = [];
    for (const set of typed) {
      saved.forEach((c, i) => {
        let want = set.stored[i];
        if (c.id === last.id && set.column === 'irLiveLive') want = 'LIM';
        const got = c.cells[set.column]?.text;
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
