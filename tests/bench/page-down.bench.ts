/**
 * PageDown benchmark (`npm run bench:page-down`, after `vite build`): the real app in headless
 * chromium on a generated 300-way board (the largest demo board's circuits and readings repeated).
 * The grid has the focus; PageDown is pressed 40 times down and PageUp 40 times back, one key per
 * frame pair. For every key the page records keydown → the next animation frame (the frame that
 * shows the key's result). Printed: p50 and p95, and the elements the findings list puts in the
 * page. Target: p95 within two frames (≤ 33 ms at 60 Hz).
 */
import type { Page } from 'playwright-core';
import { demoTester, launchBrowser, startDemoServer } from '../helpers/browser.ts';
import { addRepeatedBoard } from '../helpers/big-board.ts';

const PRESSES = 40;
const TARGET_MS = 33;

function instrument() {
  const w = window as unknown as { __keyLatency: Array<{ key: string; ms: number }> };
  w.__keyLatency = [];
  document.addEventListener(
    'keydown',
    (event) => {
      const start = performance.now();
      requestAnimationFrame(() => w.__keyLatency.push({ key: event.key, ms: performance.now() - start }));
    },
    true,
  );
}

async function frames(page: Page, n: number): Promise<void> {
  // A string, not a function: tsx would add name helpers the page does not have.
  await page.evaluate(`new Promise((resolve) => { let left = ${n}; const step = () => (--left <= 0 ? setTimeout(resolve, 0) : requestAnimationFrame(step)); requestAnimationFrame(step); })`);
}

const pct = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? Number.NaN;

const server = await startDemoServer();
const browser = await launchBrowser();
try {
  const { boardId } = await addRepeatedBoard(server.db, 300);
  const context = await browser.newContext({ viewport: { width: 1600, height: 900 } });
  const signIn = await context.request.post(`${server.url}/api/auth/sign-in`, { data: demoTester, headers: { origin: server.url } });
  if (signIn.status() !== 200) throw new Error(`Sign-in answered ${signIn.status()}`);
  const page = await context.newPage();
  await page.addInitScript(instrument);
  await page.goto(`${server.url}/boards/${boardId}`);
  await page.getByRole('grid').waitFor();
  await page.waitForFunction(() => document.activeElement?.getAttribute('role') === 'grid');
  await frames(page, 30);
  const findingsElements = await page.evaluate(() => document.querySelector('ul[aria-label="Findings"]')?.querySelectorAll('*').length ?? -1);
  await page.evaluate(() => {
    (window as unknown as { __keyLatency: unknown[] }).__keyLatency = [];
  });
  for (const key of ['PageDown', 'PageUp']) {
    for (let i = 0; i < PRESSES; i++) {
      await page.keyboard.press(key);
      await frames(page, 2);
    }
  }
  const samples = await page.evaluate(() => (window as unknown as { __keyLatency: Array<{ key: string; ms: number }> }).__keyLatency);
  const times = samples.filter((s) => s.key === 'PageDown' || s.key === 'PageUp').map((s) => s.ms).sort((a, b) => a - b);
  console.log(`PageDown / PageUp on a 300-way board (${times.length} keys): p50 ${pct(times, 50).toFixed(1)} ms, p95 ${pct(times, 95).toFixed(1)} ms, max ${times[times.length - 1]?.toFixed(1)} ms (target p95 ≤ ${TARGET_MS} ms: ${pct(times, 95) <= TARGET_MS ? 'pass' : 'MISS'})`);
  console.log(`Findings list: ${findingsElements} elements in the page`);
  await context.close();
} finally {
  await browser.close();
  await server.close();
}
process.exit(0);
