import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { openDatabase } from '../../server/db/database.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { asOwnPage, createTestApp, listen } from '../helpers/test-app.ts';

// Content-Encoding and Cache-Control semantics: RFC 9110 §8.4 and RFC 9111 §5.2 (max-age,
// no-cache) with RFC 8246 (immutable). Decompressed with Node's zlib as an independent reader.

let dir: string;
let app: ReturnType<typeof createApp>;
let close: () => void;
const script = `export const rows = [${Array.from({ length: 2000 }, (_, i) => `"circuit ${i}"`).join(',')}];\n`;

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'boardwalk-delivery-'));
  fs.mkdirSync(path.join(dir, 'assets'));
  fs.writeFileSync(path.join(dir, 'index.html'), '<!doctype html><title>Boardwalk</title><script type="module" src="/assets/main-1a2b3c4d.js"></script>');
  fs.writeFileSync(path.join(dir, 'assets', 'main-1a2b3c4d.js'), script);
  const { db, sqlite } = openDatabase(':memory:');
  await migrateToLatest(db);
  app = asOwnPage(createApp({ db, sqlite, sessionSecret: 's', clientDir: dir }));
  close = () => sqlite.close();
});
afterAll(() => {
  close();
  fs.rmSync(dir, { recursive: true, force: true });
});

/** The bytes as they cross the wire (supertest would decompress them). */
async function rawGet(url: string, acceptEncoding: string) {
  const { server, url: base } = await listen(app);
  try {
    return await new Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }>((resolve, reject) => {
      http.get(`${base}${url}`, { headers: { 'accept-encoding': acceptEncoding } }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
      }).on('error', reject);
    });
  } finally {
    server.close();
  }
}

describe('serving the built client', () => {
  it('when a hashed asset is asked for with gzip accepted, then it comes gzipped, decodes to the file, and may be kept for a year', async () => {
    const res = await rawGet('/assets/main-1a2b3c4d.js', 'gzip');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.headers['cache-control']).toMatch(/max-age=31536000/);
    expect(res.headers['cache-control']).toMatch(/immutable/);
    const body = res.body;
    expect(zlib.gunzipSync(body).toString()).toBe(script);
    expect(body.length).toBeLessThan(script.length / 4);
  });

  it('when brotli is accepted, then it comes as br', async () => {
    const res = await request(app).get('/assets/main-1a2b3c4d.js').set('Accept-Encoding', 'br');
    expect(res.headers['content-encoding']).toBe('br');
  });

  it('when a page route is asked for, then the page comes and must be checked again each time (it names the current build)', async () => {
    const res = await request(app).get('/boards/7');
    expect(res.status).toBe(200);
    expect(res.text).toMatch(/<title>Boardwalk<\/title>/);
    expect(res.headers['cache-control']).toBe('no-cache');
  });

  it('when an asset of an older build is asked for, then 404 rather than the page in its place', async () => {
    const res = await request(app).get('/assets/main-00000000.js');
    expect(res.status).toBe(404);
    expect(res.text).not.toMatch(/<title>/);
  });
});

describe('compressed API answers', () => {
  it('when a board is fetched with gzip accepted, then the JSON comes gzipped', async () => {
    const t = await createTestApp();
    const agent = await t.signIn('tester');
    const res = await agent.get(`/api/boards/${t.ids.board}`).set('Accept-Encoding', 'gzip');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.body.circuits).toHaveLength(3);
    t.close();
  });
});
