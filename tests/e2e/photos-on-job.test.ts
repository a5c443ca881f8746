import { describe, expect, it } from 'vitest';
import { demoReviewer, demoTester, useDemoServerAndBrowser } from '../helpers/browser.ts';
import { pngBytes } from '../helpers/images.ts';
import { pickPlainBoard } from '../helpers/console-page.ts';

/** Photos of the notes on the job screen and the review screen, and the choice to send one with the document. */

const env = useDemoServerAndBrowser();

describe('photos of the notes on the job', () => {
  it('when a tester attached a photo, then the reviewer sees it on the job and the review screens, opens it large by keys and chooses to send it', async () => {
    const testerContext = await env.browser.newContext();
    expect((await testerContext.request.post(`${env.server.url}/api/auth/sign-in`, { data: demoTester, headers: { origin: env.server.url } })).status()).toBe(200);
    const { boardId } = await pickPlainBoard(testerContext, env.server.url);
    const board = (await (await testerContext.request.get(`${env.server.url}/api/boards/${boardId}`)).json()) as { board: { jobId: number; reference: string } };
    const attached = await testerContext.request.post(`${env.server.url}/api/boards/${boardId}/photos`, {
      multipart: { photo: { name: 'notes-page-1.png', mimeType: 'image/png', buffer: pngBytes(320, 240) } },
      headers: { origin: env.server.url },
    });
    expect(attached.status()).toBe(201);
    const photoId = ((await attached.json()) as { photo: { id: number } }).photo.id;
    await testerContext.close();

    const context = await env.browser.newContext();
    expect((await context.request.post(`${env.server.url}/api/auth/sign-in`, { data: demoReviewer, headers: { origin: env.server.url } })).status()).toBe(200);
    const page = await context.newPage();
    await page.goto(`${env.server.url}/jobs/${board.board.jobId}`);
    const panel = page.getByRole('region', { name: 'Photos of the notes' });
    const thumbnail = panel.getByRole('button', { name: `Open Board ${board.board.reference}, notes-page-1.png` });
    await thumbnail.focus();
    await page.keyboard.press('Enter');
    const dialog = page.getByRole('dialog', { name: new RegExp(`^Photo \\d+ of \\d+: board ${board.board.reference}$`) });
    await dialog.waitFor();
    const large = dialog.getByRole('img');
    await expect.poll(() => large.evaluate((img) => (img as HTMLImageElement).naturalWidth)).toBe(320);
    await page.keyboard.press('Escape');
    await dialog.waitFor({ state: 'detached' });

    const choice = panel.getByRole('checkbox', { name: `Send with the document: Board ${board.board.reference}, notes-page-1.png` });
    expect(await choice.isChecked()).toBe(false);
    await choice.focus();
    await page.keyboard.press('Space');
    await expect.poll(() => choice.isChecked()).toBe(true);
    const listed = (await (await context.request.get(`${env.server.url}/api/jobs/${board.board.jobId}/photos`)).json()) as { boards: { photos: { id: number; sendToClient: boolean }[] }[] };
    expect(listed.boards.flatMap((b) => b.photos).find((p) => p.id === photoId)?.sendToClient).toBe(true);

    // The review screen shows the same photos with the record.
    await page.goto(`${env.server.url}/review/${board.board.jobId}`);
    await page.getByRole('region', { name: 'Photos of the notes' }).getByRole('button', { name: `Open Board ${board.board.reference}, notes-page-1.png` }).waitFor();
    await context.close();
  }, 60_000);
});
