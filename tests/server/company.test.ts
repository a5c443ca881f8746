import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { maxLogoBytes } from '../../shared/schemas/company-logo.ts';
import { defaultCompany } from '../../shared/schemas/company.ts';
import { pngBytes } from '../helpers/images.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => t.close());

const details = {
  name: 'Kestrel Lane Electrical Ltd',
  address: '4 Kestrel Lane, Harwick HW2 9QP',
  phone: '01632 960 418',
  email: 'office@kestrel-lane.example',
  registration: 'Registered with a certification body, no. 30418',
  referencePattern: 'KL-{yyyy}-{seq:4}',
};

function storedFiles(): string[] {
  const root = path.join(t.dataDir, 'files');
  if (!fs.existsSync(root)) return [];
  return (fs.readdirSync(root, { recursive: true }) as string[]).filter((p) => fs.statSync(path.join(root, p)).isFile());
}

describe('company details', () => {
  it('when nothing was saved, then the defaults are served to anyone signed in', async () => {
    const res = await (await t.signIn('tester')).get('/api/company');
    expect(res.status).toBe(200);
    expect(res.body.company).toEqual(defaultCompany);
    expect((await request(t.app).get('/api/company')).status).toBe(401);
  });

  it('when an admin saves the details, then they are kept and served back', async () => {
    const admin = await t.signIn('admin');
    const res = await admin.put('/api/company').send(details);
    expect(res.status).toBe(200);
    expect((await admin.get('/api/company')).body.company).toEqual({ ...details, logoFileId: null });
  });

  it('when a reviewer tries to change them, then 403', async () => {
    expect((await (await t.signIn('reviewer')).put('/api/company').send(details)).status).toBe(403);
  });

  it('when the reference pattern lacks {seq}, then 400 at that field', async () => {
    const res = await (await t.signIn('admin')).put('/api/company').send({ ...details, referencePattern: 'KL-{yyyy}' });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('referencePattern');
  });
});

describe('the logo', () => {
  it('when an admin uploads a PNG, then it is stored as a logo file and named in the details', async () => {
    const admin = await t.signIn('admin');
    await admin.put('/api/company').send(details);
    const logo = pngBytes(120, 40);
    const res = await admin.post('/api/company/logo').attach('logo', logo, 'kestrel.png');
    expect(res.status).toBe(201);
    expect(res.body.company).toMatchObject({ name: details.name, logoFileId: expect.any(Number) });
    const file = await t.db.selectFrom('files').selectAll().where('id', '=', res.body.company.logoFileId).executeTakeFirstOrThrow();
    expect(file).toMatchObject({ kind: 'logo', mime: 'image/png', size_bytes: logo.length, original_name: 'kestrel.png' });
    expect((await admin.get('/api/company')).body.company.logoFileId).toBe(file.id);
    expect((await (await t.signIn('tester')).get(`/api/files/${file.id}`)).headers['content-type']).toBe('image/png');

    // Removing it leaves the file (an issued document may have printed it) but clears the setting.
    const removed = await admin.delete('/api/company/logo');
    expect(removed.body.company.logoFileId).toBeNull();
    expect(storedFiles()).toHaveLength(1);
  });

  it('when the logo is over 1 MB, then 413 and nothing is written', async () => {
    const res = await (await t.signIn('admin')).post('/api/company/logo').attach('logo', pngBytes(40, 20, maxLogoBytes + 1), 'big.png');
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/at most 1 MB/);
    expect(storedFiles()).toEqual([]);
    expect(await t.db.selectFrom('files').selectAll().execute()).toEqual([]);
  });

  it('when a PDF is sent as a logo, then 415 saying what it is', async () => {
    const pdfStart = Buffer.from('%PDF-1.7\n1 0 obj\n<< >>\nendobj\n', 'latin1');
    const res = await (await t.signIn('admin')).post('/api/company/logo').attach('logo', pdfStart, { filename: 'logo.png', contentType: 'image/png' });
    expect(res.status).toBe(415);
    expect(res.body.error.message).toMatch(/application\/pdf/);
    expect(storedFiles()).toEqual([]);
  });

  it('when a tester uploads a logo, then 403 before anything is read', async () => {
    const res = await (await t.signIn('tester')).post('/api/company/logo').attach('logo', pngBytes(), 'x.png');
    expect(res.status).toBe(403);
    expect(storedFiles()).toEqual([]);
  });
});
