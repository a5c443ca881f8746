import express from 'express';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { errorHandler } from '../../server/middleware/error-handler.ts';
import { parseAllowedOrigins, sameOriginOnly } from '../../server/middleware/same-origin.ts';
import { createTestApp, password, type TestApp } from '../helpers/test-app.ts';

// What a browser sends and when (the Origin header on every request that is not GET or HEAD, the
// "simple" content types a form may send without a preflight): the Fetch standard
// (fetch.spec.whatwg.org, "append a request Origin header", "CORS-safelisted request-header").
// Checking Origin, then Referer, and refusing when neither matches: OWASP Cross-Site Request
// Forgery Prevention Cheat Sheet, "Verifying Origin with standard headers".

const host = 'boardwalk.local:3000';
const own = `http://${host}`;

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => t.close());

/** A reviewer signed in through the raw app from the app's own page. */
async function reviewerAgent() {
  const agent = request.agent(t.rawApp);
  const res = await agent.post('/api/auth/sign-in').set('Host', host).set('Origin', own).send({ email: 'reviewer@test.example', password });
  expect(res.status).toBe(200);
  return agent;
}

async function boardState() {
  return (await t.db.selectFrom('boards').select('state').where('id', '=', t.ids.board).executeTakeFirstOrThrow()).state;
}

describe('changes sent from another origin', () => {
  it('when a plain form on another port of the same host posts lock with the reviewer’s cookie, then 403 and the board stays open', async () => {
    const agent = await reviewerAgent();
    const res = await agent
      .post(`/api/boards/${t.ids.board}/lock`)
      .set('Host', host)
      .set('Origin', 'http://boardwalk.local:8080')
      .type('form')
      .send('x=1');
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/another site \(http:\/\/boardwalk\.local:8080\).*Nothing was changed/);
    expect(await boardState()).toBe('open');
  });

  it('when a sibling subdomain sends a JSON PUT to a cell, then 403 and the cell is not written', async () => {
    const agent = await reviewerAgent();
    const circuit = await t.db.selectFrom('circuits').select('id').where('board_id', '=', t.ids.board).executeTakeFirstOrThrow();
    const res = await agent
      .put(`/api/boards/${t.ids.board}/circuits/${circuit.id}/cells/zs`)
      .set('Host', host)
      .set('Origin', 'http://reports.boardwalk.local:3000')
      .send({ text: '0.44', version: 0 });
    expect(res.status).toBe(403);
    expect(await t.db.selectFrom('cells').selectAll().where('circuit_id', '=', circuit.id).execute()).toEqual([]);
  });

  it('when there is no Origin, then the Referer decides: another site’s page is refused, the app’s own page accepted', async () => {
    const agent = await reviewerAgent();
    const lock = () => agent.post(`/api/boards/${t.ids.board}/lock`).set('Host', host).type('json').send({});
    expect((await lock().set('Referer', 'http://elsewhere.example/page')).status).toBe(403);
    expect(await boardState()).toBe('open');
    // From the app's own page the request passes this check and meets the route's own rules
    // (the review gate refuses to lock an incomplete board, in words, with 409 rather than 403).
    const fromOwnPage = await lock().set('Referer', `${own}/boards/${t.ids.board}`);
    expect(fromOwnPage.status).toBe(409);
    expect(fromOwnPage.body.error.message).toMatch(/cannot be locked yet/);
  });

  it('when a change names no page at all, or the opaque origin "null", then 403 with a message', async () => {
    const agent = await reviewerAgent();
    const none = await agent.post(`/api/boards/${t.ids.board}/lock`).set('Host', host).send({});
    expect(none.status).toBe(403);
    expect(none.body.error.message).toMatch(/does not say which page sent it/);
    const opaque = await agent.post(`/api/boards/${t.ids.board}/lock`).set('Host', host).set('Origin', 'null').send({});
    expect(opaque.status).toBe(403);
    expect(await boardState()).toBe('open');
  });

  it('when a page of another origin only reads, then it is not refused here (reads change nothing)', async () => {
    const agent = await reviewerAgent();
    const res = await agent.get(`/api/boards/${t.ids.board}`).set('Host', host).set('Origin', 'http://elsewhere.example');
    expect(res.status).toBe(200);
  });

  it('when the app runs behind a proxy whose public origin is listed, then changes from it are accepted', async () => {
    const { openDatabase } = await import('../../server/db/database.ts');
    const { migrateToLatest } = await import('../../server/db/migrate.ts');
    const { db, sqlite } = openDatabase(':memory:');
    await migrateToLatest(db);
    const app = createApp({ db, sqlite, sessionSecret: 's', allowedOrigins: parseAllowedOrigins('https://boardwalk.example.com') });
    const signIn = (origin: string) =>
      request(app).post('/api/auth/sign-in').set('Host', 'internal:3000').set('Origin', origin).send({ email: 'a@b.example', password: 'x' });
    expect((await signIn('https://boardwalk.example.com')).status).toBe(401); // passed the check, wrong password
    expect((await signIn('https://other.example.com')).status).toBe(403);
    sqlite.close();
  });
});

describe('changes that are not JSON', () => {
  it('when lock is sent from the app’s own page without a Content-Type, then 403 with a message; with application/json it reaches the route', async () => {
    const agent = await reviewerAgent();
    const bare = await agent.post(`/api/boards/${t.ids.board}/lock`).set('Host', host).set('Origin', own);
    expect(bare.status).toBe(403);
    expect(bare.body.error.message).toMatch(/no Content-Type; Boardwalk takes only application\/json/);
    expect(await boardState()).toBe('open');
    const json = await agent.post(`/api/boards/${t.ids.board}/lock`).set('Host', host).set('Origin', own).set('Content-Type', 'application/json');
    // Past this check: the review gate answers (an incomplete board cannot be locked yet).
    expect(json.status).toBe(409);
    expect(json.body.error.message).toMatch(/cannot be locked yet/);
  });

  it.each(['text/plain', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x'])(
    'when a change of type %s comes from the app’s own origin, then 403 and nothing changes',
    async (type) => {
      const agent = await reviewerAgent();
      const res = await agent.post(`/api/boards/${t.ids.board}/lock`).set('Host', host).set('Origin', own).set('Content-Type', type).send('{}');
      expect(res.status).toBe(403);
      expect(res.body.error.message).toMatch(/takes only application\/json/);
      expect(await boardState()).toBe('open');
    },
  );

  it('when an upload route opted in, then multipart/form-data reaches it, and only it', async () => {
    const app = express();
    app.use(sameOriginOnly({ uploadRoutes: [{ method: 'POST', path: /^\/api\/jobs\/\d+\/signatures$/ }] }));
    app.post('/{*splat}', (_req, res) => void res.json({ reached: true }));
    app.use(errorHandler);
    const post = (path: string) => request(app).post(path).set('Origin', 'http://127.0.0.1').set('Host', '127.0.0.1').attach('file', Buffer.from('png'), 'sig.png');
    expect((await post('/api/jobs/4/signatures')).body).toEqual({ reached: true });
    expect((await post('/api/jobs/4/sections/client')).status).toBe(403);
    expect((await request(app).put('/api/jobs/4/signatures').set('Origin', 'http://127.0.0.1').set('Host', '127.0.0.1').attach('file', Buffer.from('png'), 'sig.png')).status).toBe(403);
  });
});

describe('BOARDWALK_ALLOWED_ORIGINS', () => {
  it('when it lists origins with paths or spaces, then they are read as origins; a word that is not one is refused at start', () => {
    expect(parseAllowedOrigins(' https://boardwalk.example.com/ , http://10.0.0.5:8080/app')).toEqual(['https://boardwalk.example.com', 'http://10.0.0.5:8080']);
    expect(parseAllowedOrigins(undefined)).toEqual([]);
    expect(() => parseAllowedOrigins('boardwalk')).toThrow(/not an origin/);
  });
});
