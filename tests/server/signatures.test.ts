import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { maxSignatureBytes } from '../../shared/schemas/signatures.ts';
import { jpegHeaderBytes, pngBytes } from '../helpers/images.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => t.close());

const setJob = (values: { state?: 'entering' | 'ready' | 'approved' | 'issued'; kind?: 'EIC' | 'EICR' }) =>
  t.db.updateTable('jobs').set(values).where('id', '=', t.ids.job).execute();

/** Every file under the data folder (stored bytes), to prove a refusal wrote nothing. */
function storedFiles(): string[] {
  const root = path.join(t.dataDir, 'files');
  if (!fs.existsSync(root)) return [];
  return (fs.readdirSync(root, { recursive: true }) as string[]).filter((p) => fs.statSync(path.join(root, p)).isFile());
}

const countRows = async (table: 'files' | 'signatures' | 'job_history') =>
  Number((await t.db.selectFrom(table).select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow()).n);

async function sign(role: 'admin' | 'tester' | 'reviewer', fields: { role: string; name: string }, image: Buffer = pngBytes(), filename = 'signature.png') {
  const agent = await t.signIn(role);
  return agent.post(`/api/jobs/${t.ids.job}/signatures`).field('role', fields.role).field('name', fields.name).attach('image', image, filename);
}

describe('POST /api/jobs/:jobId/signatures', () => {
  it('when the inspector signs with a drawn PNG, then the signature, its file and a history entry are stored and the image is served back', async () => {
    const image = pngBytes();
    const res = await sign('tester', { role: 'inspector', name: 'Tom Tester' }, image);
    expect(res.status).toBe(201);
    expect(res.body.signature).toMatchObject({ role: 'inspector', name: 'Tom Tester', current: true, signedBy: { id: t.ids.tester, name: 'Tom Tester' } });

    const file = await t.db.selectFrom('files').selectAll().where('id', '=', res.body.signature.fileId).executeTakeFirstOrThrow();
    expect(file).toMatchObject({ kind: 'signature', mime: 'image/png', size_bytes: image.length, job_id: t.ids.job, uploaded_by: t.ids.tester });
    // SHA-256 by node:crypto over the bytes sent, against the row and the bytes on disk.
    const expected = crypto.createHash('sha256').update(image).digest('hex');
    expect(file.sha256).toBe(expected);
    expect(crypto.createHash('sha256').update(fs.readFileSync(path.join(t.dataDir, file.path))).digest('hex')).toBe(expected);

    const history = await t.db.selectFrom('job_history').selectAll().where('job_id', '=', t.ids.job).where('action', '=', 'signed').execute();
    expect(history).toHaveLength(1);
    expect(history[0]).toMatchObject({ section: 'declaration', field: 'inspector', user_id: t.ids.tester });

    const served = await (await t.signIn('reviewer')).get(`/api/files/${file.id}`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(served.status).toBe(200);
    expect(served.headers['content-type']).toBe('image/png');
    expect(Buffer.compare(served.body as Buffer, image)).toBe(0);
  });

  it('when the same role signs again, then the new signature is current and the earlier one is kept', async () => {
    await sign('tester', { role: 'inspector', name: 'Tom Tester' });
    const second = await sign('tester', { role: 'inspector', name: 'Thomas Tester' });
    expect(second.status).toBe(201);
    const list = await (await t.signIn('tester')).get(`/api/jobs/${t.ids.job}/signatures`);
    expect(list.status).toBe(200);
    expect(list.body.roles).toEqual(['inspector', 'reviewer']);
    expect(list.body.signatures.map((s: { name: string; current: boolean }) => [s.name, s.current])).toEqual([
      ['Thomas Tester', true],
      ['Tom Tester', false],
    ]);
    expect(await countRows('signatures')).toBe(2);
  });

  it('when an uploaded JPEG is sent, then it is accepted as image/jpeg whatever its name', async () => {
    const res = await sign('tester', { role: 'inspector', name: 'Tom Tester' }, jpegHeaderBytes(), 'scan.bin');
    expect(res.status).toBe(201);
    const file = await t.db.selectFrom('files').selectAll().where('id', '=', res.body.signature.fileId).executeTakeFirstOrThrow();
    expect(file.mime).toBe('image/jpeg');
  });

  describe('who may sign what', () => {
    // Rules of the product (common practice: the qualified supervisor who reviews signs as the
    // reviewer; the people who did the work sign the declaration whatever their account's role).
    it.each([
      { who: 'tester', role: 'inspector', state: 'entering', kind: 'EICR', status: 201 },
      { who: 'reviewer', role: 'inspector', state: 'entering', kind: 'EICR', status: 201 },
      { who: 'tester', role: 'reviewer', state: 'ready', kind: 'EICR', status: 403 },
      { who: 'reviewer', role: 'reviewer', state: 'ready', kind: 'EICR', status: 201 },
      { who: 'admin', role: 'reviewer', state: 'approved', kind: 'EICR', status: 201 },
      { who: 'reviewer', role: 'reviewer', state: 'entering', kind: 'EICR', status: 409 },
      { who: 'reviewer', role: 'inspector', state: 'issued', kind: 'EICR', status: 423 },
      { who: 'tester', role: 'designer', state: 'entering', kind: 'EICR', status: 400 },
      { who: 'tester', role: 'designer', state: 'entering', kind: 'EIC', status: 201 },
      { who: 'tester', role: 'constructor', state: 'ready', kind: 'EIC', status: 201 },
      { who: 'tester', role: 'reviewer', state: 'approved', kind: 'EIC', status: 403 },
    ] as const)('when a $who signs as $role on an $kind that is $state, then the answer is $status', async ({ who, role, state, kind, status }) => {
      await setJob({ state, kind });
      const res = await sign(who, { role, name: 'Someone Signing' });
      expect(res.status, JSON.stringify(res.body)).toBe(status);
      if (status !== 201) {
        expect(res.body.error.message).toMatch(/\w+ \w+/);
        expect(await countRows('signatures')).toBe(0);
        expect(await countRows('files')).toBe(0);
        expect(storedFiles()).toEqual([]);
      }
    });
  });

  describe('uploads checked by content', () => {
    it('when a text file is named .png and declared image/png, then 415 in words and nothing is written', async () => {
      const agent = await t.signIn('tester');
      const res = await agent
        .post(`/api/jobs/${t.ids.job}/signatures`)
        .field('role', 'inspector')
        .field('name', 'Tom Tester')
        .attach('image', Buffer.from('this is not a picture, just words\n'), { filename: 'signature.png', contentType: 'image/png' });
      expect(res.status).toBe(415);
      expect(res.body.error.code).toBe('unsupported_type');
      expect(res.body.error.message).toMatch(/PNG or JPEG/);
      expect(await countRows('files')).toBe(0);
      expect(await countRows('signatures')).toBe(0);
      expect(storedFiles()).toEqual([]);
    });

    it('when the image is larger than the limit, then 413 in words and nothing is written', async () => {
      const big = pngBytes(40, 20, maxSignatureBytes + 100);
      expect(big.length).toBeGreaterThan(maxSignatureBytes);
      const res = await sign('tester', { role: 'inspector', name: 'Tom Tester' }, big);
      expect(res.status).toBe(413);
      expect(res.body.error.code).toBe('too_large');
      expect(res.body.error.message).toMatch(/at most 512 kB/);
      expect(await countRows('files')).toBe(0);
      expect(storedFiles()).toEqual([]);
    });

    it('when no image is attached, then 400 naming the field', async () => {
      const agent = await t.signIn('tester');
      const res = await agent.post(`/api/jobs/${t.ids.job}/signatures`).field('role', 'inspector').field('name', 'Tom Tester');
      expect(res.status).toBe(400);
      expect(res.body.error.message).toMatch(/"image"/);
    });

    it('when the body is JSON rather than a form, then 400 saying how to send it', async () => {
      const agent = await t.signIn('tester');
      const res = await agent.post(`/api/jobs/${t.ids.job}/signatures`).send({ role: 'inspector', name: 'Tom' });
      expect(res.status).toBe(400);
      expect(res.body.error.message).toMatch(/multipart\/form-data/);
    });

    it('when the typed name is blank, then 400 at the name and nothing is written', async () => {
      const res = await sign('tester', { role: 'inspector', name: '   ' });
      expect(res.status).toBe(400);
      expect(res.body.error.issues[0].path).toBe('name');
      expect(storedFiles()).toEqual([]);
    });
  });

  it('when nobody is signed in, then signatures and files answer 401', async () => {
    const { default: request } = await import('supertest');
    expect((await request(t.app).get(`/api/jobs/${t.ids.job}/signatures`)).status).toBe(401);
    expect((await request(t.app).get('/api/files/1')).status).toBe(401);
  });
});
