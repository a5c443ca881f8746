import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { demoTester, useDemoServerAndBrowser } from '../helpers/browser.ts';

/**
 * Importing an instrument-like readings file (generated here, of our own layout) into the demo's
 * three-phase board, keyboard first: the file carries the board's own values for filled cells,
 * invented values for empty ones, and two values that differ (one kept, one taken). The demo board
 * has every reading the schedule needs, so the new values are a column it does not have yet: the
 * RCD's time at 5 × IΔn (where there is an RCD; N/A where there is none).
 */

const env = useDemoServerAndBrowser();

interface ApiCircuit {
  id: number;
  number: string;
  rcdType: string | null;
  cells: Record<string, { text: string; version: number } | undefined>;
}

const columns = [
  ['R1+R2 (Ω)', 'r1PlusR2', '0.35'],
  ['IR L-E (MΩ)', 'irLiveEarth', '>299'],
  ['IR L-N (MΩ)', 'irLiveLive', '>299'],
  ['Test voltage (V)', 'irTestVoltage', '500'],
  ['Zs (Ω)', 'zs', '0.48'],
  ['RCD time (ms)', 'rcdTimeMs', '21'],
  ['Polarity', 'polarity', '✓'],
  // Invented, under the 40 ms of BS EN 61008-1 / 61009-1 at 5 × IΔn; N/A without an RCD (below).
  ['RCD 5× IΔn (ms)', 'rcdTime5Ms', '11'],
] as const;

/** The file's invented value for an empty cell: an RCD time only where the circuit has an RCD. */
const invent = (c: ApiCircuit, key: string, invented: string) => (key === 'rcdTime5Ms' && c.rcdType === null ? 'N/A' : invented);

async function circuitsOf(page: Page, boardId: number): Promise<ApiCircuit[]> {
  return page.evaluate(async (id) => ((await (await fetch(`/api/boards/${id}`)).json()) as { circuits: ApiCircuit[] }).circuits, boardId);
}

/** "5L2" → "L2-5": the phase-first spelling some files use; three-phase ways ("21TP") as they are. */
const phaseFirst = (n: string) => n.replace(/^(\d+)(L[123])$/, '$2-$1');

describe('importing a readings file', () => {
  it('when a 64-row file is imported into the three-phase board and two conflicts are settled, then every value is saved with how = imported, and one undo takes it back', async () => {
    const context = await env.browser.newContext();
    expect((await context.request.post(`${env.server.url}/api/auth/sign-in`, { data: demoTester, headers: { origin: env.server.url } })).status()).toBe(200);
    const page = await context.newPage();
    const boards = (await (await context.request.get(`${env.server.url}/api/boards`)).json()) as { boards: { id: number; phases: number; state: string }[] };
    const boardId = boards.boards.find((b) => b.phases === 3 && b.state === 'open')!.id;
    await page.goto(`${env.server.url}/boards/${boardId}`);
    await page.getByRole('grid').waitFor();
    const before = await circuitsOf(page, boardId);
    expect(before).toHaveLength(64);

    // The file: the board's value where it has one, an invented one where it has none, and two that differ.
    const filled = before.flatMap((c) => columns.filter(([, key]) => c.cells[key]?.text).map(([, key]) => ({ circuit: c, key })));
    const conflictTake = filled.find((f) => f.key === 'zs')!;
    const conflictKeep = filled.find((f) => f.key === 'rcdTimeMs' && /^\d+$/.test(f.circuit.cells.rcdTimeMs!.text))!;
    const fileValue = (c: ApiCircuit, key: string, invented: string) => {
      if (c === conflictTake.circuit && key === 'zs') return String((Number(c.cells.zs!.text) + 0.05).toFixed(2));
      if (c === conflictKeep.circuit && key === 'rcdTimeMs') return String(Number(c.cells.rcdTimeMs!.text) + 3);
      return c.cells[key]?.text || invent(c, key, invented);
    };
    const lines = [['Circuit', ...columns.map(([h]) => h)].join(',')];
    for (const c of before) lines.push([phaseFirst(c.number), ...columns.map(([, key, invented]) => fileValue(c, key, invented))].map((v) => (v.includes(',') ? `"${v}"` : v)).join(','));
    const csv = Buffer.from(lines.join('\r\n') + '\r\n', 'utf8');
    const expectedNew = before.flatMap((c) => columns.filter(([, key]) => !c.cells[key]?.text).map(([, key, invented]) => ({ id: c.id, key, text: invent(c, key, invented) })));
    // Every circuit gets its 5 × IΔn time (or N/A); nothing else is new on the filled demo board.
    expect(expectedNew.length).toBe(64);

    await page.getByRole('grid').focus();
    await page.keyboard.press('Alt+Shift+KeyI');
    const dialog = page.getByRole('dialog', { name: /Import readings from a file/ });
    await dialog.waitFor();
    await dialog.locator('#import-file').setInputFiles({ name: 'bakery-readings.csv', mimeType: 'text/csv', buffer: csv });

    // The mapping proposed from the header words, each a select the typist could change.
    await dialog.getByText(/64 rows, separated by commas/).waitFor();
    expect(await dialog.getByLabel('Zs (Ω)').inputValue()).toBe('zs');
    expect(await dialog.getByLabel('IR L-N (MΩ)').inputValue()).toBe('irLiveLive');
    expect(await dialog.getByLabel('Circuit').inputValue()).toBe('circuit');
    await dialog.getByRole('button', { name: 'Show the preview' }).press('Enter');

    // The preview: every row matched by number, two conflicts to settle before anything is written.
    await dialog.getByText(/Matched by circuit number/).waitFor();
    expect(await dialog.getByRole('status').first().innerText()).toMatch(new RegExp(`${expectedNew.length} new, 2 differ .* 0 rows? matched no circuit`));
    const confirm = dialog.getByRole('button', { name: /^Import \d+ values?$/ });
    expect(await confirm.isDisabled()).toBe(true);
    await dialog.getByLabel(new RegExp(`^Circuit ${conflictTake.circuit.number} Zs: now`)).selectOption('take');
    await dialog.getByLabel(new RegExp(`^Circuit ${conflictKeep.circuit.number} Time: now`)).selectOption('keep');
    expect(await confirm.innerText()).toBe(`Import ${expectedNew.length + 1} values`);
    await confirm.press('Enter');
    await dialog.waitFor({ state: 'detached' });
    await page.getByText(/Imported \d+ readings from bakery-readings\.csv/).waitFor();

    const after = await circuitsOf(page, boardId);
    const byId = new Map(after.map((c) => [c.id, c]));
    for (const n of expectedNew) expect(byId.get(n.id)!.cells[n.key]?.text).toBe(n.text);
    expect(byId.get(conflictTake.circuit.id)!.cells.zs!.text).toBe(fileValue(conflictTake.circuit, 'zs', ''));
    expect(byId.get(conflictKeep.circuit.id)!.cells.rcdTimeMs!.text).toBe(conflictKeep.circuit.cells.rcdTimeMs!.text);

    // Every written cell's latest history entry says how it came: imported.
    const written = [...expectedNew.map((n) => ({ id: n.id, key: n.key })), { id: conflictTake.circuit.id, key: 'zs' }];
    const hows = await page.evaluate(
      async ({ boardId, written }) =>
        Promise.all(
          written.map(async (w) => {
            const { history } = (await (await fetch(`/api/boards/${boardId}/circuits/${w.id}/cells/${w.key}/history`)).json()) as { history: { how: string }[] };
            return history[history.length - 1]?.how;
          }),
        ),
      { boardId, written },
    );
    expect(hows.every((h) => h === 'imported')).toBe(true);
    expect(hows).toHaveLength(expectedNew.length + 1);

    // One undo takes the whole import back.
    await page.getByRole('grid').focus();
    await page.keyboard.press('Control+z');
    await page.getByText(/Undone: the import of bakery-readings\.csv/).waitFor();
    const undone = new Map((await circuitsOf(page, boardId)).map((c) => [c.id, c]));
    expect(undone.get(conflictTake.circuit.id)!.cells.zs!.text).toBe(conflictTake.circuit.cells.zs!.text);
    for (const n of expectedNew) expect(undone.get(n.id)!.cells[n.key]?.text ?? '').toBe('');
    await context.close();
  }, 60_000);
});
