import { describe, expect, it } from 'vitest';
import { demoTester, useDemoServerAndBrowser } from '../helpers/browser.ts';
import { pngBytes } from '../helpers/images.ts';
import { pickPlainBoard, quickEntry } from '../helpers/console-page.ts';

/** A photo of the paper notes beside the grid: attached, zoomed and moved by keys, kept in view while a reading is typed. */

const env = useDemoServerAndBrowser();

describe('photos of the paper notes', () => {
  it('when a photo is attached, zoomed and moved by keys, then a reading can be typed with the photo still shown as it was', async () => {
    const context = await env.browser.newContext();
    expect((await context.request.post(`${env.server.url}/api/auth/sign-in`, { data: demoTester, headers: { origin: env.server.url } })).status()).toBe(200);
    const { boardId, circuits } = await pickPlainBoard(context, env.server.url);
    const page = await context.newPage();
    await page.goto(`${env.server.url}/boards/${boardId}`);
    await page.getByRole('grid').waitFor();
    await page.getByRole('grid').focus();

    await page.keyboard.press('Alt+Shift+KeyP');
    const panel = page.getByRole('complementary', { name: 'Photos of the paper notes' });
    await panel.waitFor();
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('aria-roledescription'))).toBe('photo viewer');
    await panel.locator('[data-photo-input]').setInputFiles({ name: 'notes-page-1.png', mimeType: 'image/png', buffer: pngBytes(400, 300) });
    const image = panel.locator('img[data-photo-view]');
    await image.waitFor();
    await expect.poll(() => image.evaluate((img) => (img as HTMLImageElement).naturalWidth)).toBe(400);
    await panel.getByText(/Attached\./).waitFor();

    // Zoom in twice (× 1.25 each) and move the photo left by one step, from the keyboard.
    await page.keyboard.press('+');
    await page.keyboard.press('+');
    await page.keyboard.press('ArrowLeft');
    await page.keyboard.press('r');
    expect(await image.getAttribute('data-zoom')).toBe('1.5625');
    expect(await image.getAttribute('data-x')).toBe('40');
    expect(await image.getAttribute('data-rotation')).toBe('90');

    // Esc gives the grid the focus; the photo stays as it was while a reading is typed.
    await page.keyboard.press('Escape');
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('role'))).toBe('grid');
    const target = circuits.find((c) => !c.cells.zs?.text) ?? circuits[0]!;
    await quickEntry(page, `${target.number} zs .47`);
    await expect
      .poll(async () => (await (await context.request.get(`${env.server.url}/api/boards/${boardId}`)).json()).circuits.find((c: { id: number }) => c.id === target.id).cells.zs?.text, { timeout: 5000 })
      .toBe('0.47');
    expect(await image.isVisible()).toBe(true);
    expect(await image.getAttribute('data-zoom')).toBe('1.5625');

    // The photo is the board's: listed for anyone signed in (the reviewer too).
    const photos = (await (await context.request.get(`${env.server.url}/api/boards/${boardId}/photos`)).json()) as { photos: unknown[] };
    expect(photos.photos).toHaveLength(1);
    await context.close();
  }, 60_000);
});
