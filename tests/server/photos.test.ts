import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import exifr from 'exifr';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { pngBytes } from '../helpers/images.ts';
import { invented, jpegWithLocation } from '../helpers/photo-with-location.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => t.close());

const fileCount = async () => Number((await t.db.selectFrom('files').select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow()).n);

function storedFiles(): string[] {
  const root = path.join(t.dataDir, 'files');
  if (!fs.existsSync(root)) return [];
  return (fs.readdirSync(root, { recursive: true }) as string[]).filter((p) => fs.statSync(path.join(root, p)).isFile());
}

async function attach(photo: Buffer, filename = 'notes.jpg', role: 'tester' | 'reviewer' = 'tester') {
  const agent = await t.signIn(role);
  return agent.post(`/api/boards/${t.ids.board}/photos`).attach('photo', photo, filename);
}

describe('POST /api/boards/:boardId/photos', () => {
  it('when a JPEG with a GPS position is attached, then it is stored without the position (read back with exifr), keeping its orientation, with its SHA-256 and a files row', async () => {
    const original = jpegWithLocation();
    // The oracle (exifr, a general EXIF reader) sees the invented position in the original…
    const before = await exifr.gps(original);
    expect(before?.latitude).toBeCloseTo(52 + 12 / 60 + 34.56 / 3600, 6);
    expect(before?.longitude).toBeCloseTo(-(1 + 41 / 60 + 23.45 / 3600), 6);

    const res = await attach(original);
    expect(res.status).toBe(201);
    expect(res.body.photo.locationNote).toMatch(/GPS position/);
    expect(res.body.photo.locationNote).toMatch(/XMP/);
    const row = await t.db.selectFrom('files').selectAll().where('id', '=', res.body.photo.id).executeTakeFirstOrThrow();
    expect(row).toMatchObject({ kind: 'photo', board_id: t.ids.board, job_id: t.ids.job, mime: 'image/jpeg', uploaded_by: t.ids.tester });
    const stored = fs.readFileSync(path.join(t.dataDir, row.path));
    expect(crypto.createHash('sha256').update(stored).digest('hex')).toBe(row.sha256);

    // …and none in what was stored; the orientation (not a location) is kept.
    expect(await exifr.gps(stored)).toBeUndefined();
    const tags = await exifr.parse(stored, { gps: true, xmp: true });
    expect(tags?.latitude).toBeUndefined();
    expect(tags?.GPSLatitude).toBeUndefined();
    expect(await exifr.orientation(stored)).toBe(6);
    // Not even the raw rationals are left in the bytes (51/1 … 3456/100 as written).
    const seconds = Buffer.alloc(8);
    seconds.writeUInt32LE(invented.latitude[2], 0);
    seconds.writeUInt32LE(invented.latitude[3], 4);
    expect(stored.includes(seconds)).toBe(false);
    expect(stored.includes(Buffer.from('GPSLatitude'))).toBe(false);
  });

  it('when a PNG is attached, then it is stored, listed for the reviewer and served back', async () => {
    const res = await attach(pngBytes(), 'page-1.png');
    expect(res.status).toBe(201);
    const list = await (await t.signIn('reviewer')).get(`/api/boards/${t.ids.board}/photos`);
    expect(list.status).toBe(200);
    expect(list.body.photos).toHaveLength(1);
    expect(list.body.photos[0]).toMatchObject({ mime: 'image/png', originalName: 'page-1.png', uploadedBy: { name: 'Tom Tester' } });
    const served = await (await t.signIn('reviewer')).get(`/api/files/${list.body.photos[0].id}`);
    expect(served.status).toBe(200);
    expect(served.headers['content-type']).toBe('image/png');
  });

  it('when a text file is named .jpg, then 415 in words and nothing is stored', async () => {
    const res = await attach(Buffer.from('these are my notes, typed\n'), 'notes.jpg');
    expect(res.status).toBe(415);
    expect(res.body.error.message).toMatch(/JPEG or PNG|not a recognised/);
    expect(await fileCount()).toBe(0);
    expect(storedFiles()).toEqual([]);
  });

  it('when a HEIC photo is attached, then 415 saying why (its location cannot be removed yet) and nothing is stored', async () => {
    // ISO/IEC 23008-12 brand: an ftyp box with major brand "heic".
    const heic = Buffer.concat([Buffer.from([0, 0, 0, 0x18]), Buffer.from('ftypheic', 'latin1'), Buffer.from([0, 0, 0, 0]), Buffer.from('mif1heic', 'latin1'), Buffer.alloc(64)]);
    const res = await attach(heic, 'IMG_0001.HEIC');
    expect(res.status).toBe(415);
    expect(res.body.error.message).toMatch(/HEIC/);
    expect(res.body.error.message).toMatch(/location/);
    expect(await fileCount()).toBe(0);
  });

  it('when a JPEG is cut short inside a segment, then 415 saying its location could not be removed, and nothing is stored', async () => {
    const whole = jpegWithLocation();
    const res = await attach(whole.subarray(0, 60), 'cut.jpg');
    expect(res.status).toBe(415);
    expect(res.body.error.message).toMatch(/location data could not be removed/);
    expect(await fileCount()).toBe(0);
  });

  it('when the photo is larger than the limit, then 413 in words and nothing is stored', async () => {
    const res = await attach(pngBytes(40, 20, 15 * 1024 * 1024 + 10), 'huge.png');
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/at most 15 MB/);
    expect(await fileCount()).toBe(0);
  });

  it('when the board is locked, then 423 and nothing is stored', async () => {
    await t.db.updateTable('boards').set({ state: 'locked' }).where('id', '=', t.ids.board).execute();
    const res = await attach(pngBytes());
    expect(res.status).toBe(423);
    expect(await fileCount()).toBe(0);
  });

  it('when the job is approved, then 423 and nothing is stored', async () => {
    await t.db.updateTable('jobs').set({ state: 'approved' }).where('id', '=', t.ids.job).execute();
    const res = await attach(pngBytes());
    expect(res.status).toBe(423);
    expect(await fileCount()).toBe(0);
  });

  it('when the upload is sent as JSON, then it is refused and nothing is stored', async () => {
    const agent = await t.signIn('tester');
    const res = await agent.post(`/api/boards/${t.ids.board}/photos`).send({ photo: 'x' });
    expect(res.status).toBe(400);
    expect(await fileCount()).toBe(0);
  });
});
