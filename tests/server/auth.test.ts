import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createTestApp, password, type TestApp } from '../helpers/test-app.ts';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => t.close());

describe('POST /api/auth/sign-in', () => {
  it('when the password is right, then it answers the user and sets an httpOnly SameSite cookie', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: 'Tester@Test.example', password });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: 'tester@test.example', role: 'tester', name: 'Tom Tester' });
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/boardwalk\.sid=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(res.body.user.password_hash).toBeUndefined();
  });

  it('when the password is wrong, then 401 with a message and no session', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: 'tester@test.example', password: 'nope' });
    expect(res.status).toBe(401);
    expect(res.body.error).toMatchObject({ code: 'unauthenticated', message: 'That e-mail and password do not match an account.' });
    expect(res.headers['set-cookie']).toBeUndefined();
  });

  it('when the e-mail is unknown, then the same answer as a wrong password', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: 'nobody@test.example', password });
    expect(res.status).toBe(401);
    expect(res.body.error.message).toBe('That e-mail and password do not match an account.');
  });

  it('when the body is malformed, then 400 with a message a person understands', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: 'not-an-email' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_request');
    expect(res.body.error.message).toMatch(/e-mail address/);
    expect(res.body.error.issues.map((i: { path: string }) => i.path)).toEqual(expect.arrayContaining(['email', 'password']));
  });

  it('when the body is not JSON, then 400, not 500', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').set('content-type', 'application/json').send('{"email":');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('The request body is not valid JSON.');
  });

  it('when signing in, then the session id changes (no fixation)', async () => {
    const agent = request.agent(t.app);
    const first = await agent.post('/api/auth/sign-in').send({ email: 'tester@test.example', password });
    const second = await agent.post('/api/auth/sign-in').send({ email: 'tester@test.example', password });
    const sid = (r: request.Response) => /boardwalk\.sid=([^;]+)/.exec(String(r.headers['set-cookie']))?.[1];
    expect(sid(first)).toBeTruthy();
    expect(sid(second)).toBeTruthy();
    expect(sid(first)).not.toBe(sid(second));
  });
});

describe('GET /api/auth/me and sign-out', () => {
  it('when there is no session, then 401', async () => {
    const res = await request(t.app).get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('when signed in and then signed out, then me answers 401', async () => {
    const agent = await t.signIn('reviewer');
    expect((await agent.get('/api/auth/me')).body.user.role).toBe('reviewer');
    expect((await agent.post('/api/auth/sign-out')).status).toBe(204);
    expect((await agent.get('/api/auth/me')).status).toBe(401);
  });

  it('when any API route is called without a session, then 401', async () => {
    for (const [method, url] of [
      ['get', '/api/boards'],
      ['get', `/api/boards/${t.ids.board}`],
      ['get', '/api/sites'],
      ['get', '/api/users'],
      ['post', `/api/boards/${t.ids.board}/lock`],
      ['put', `/api/boards/${t.ids.board}/circuits/1/cells/zs`],
    ] as const) {
      const res = await request(t.app)[method](url).send({});
      expect(res.status, `${method} ${url}`).toBe(401);
    }
  });
});

describe('sign-in rate limit', () => {
  it('when too many attempts come in a minute, then 429 with a message', async () => {
    const { createApp } = await import('../../server/app.ts');
    const { openDatabase } = await import('../../server/db/database.ts');
    const { migrateToLatest } = await import('../../server/db/migrate.ts');
    const { db, sqlite } = openDatabase(':memory:');
    await migrateToLatest(db);
    const { asOwnPage } = await import('../helpers/test-app.ts');
    const app = asOwnPage(createApp({ db, sqlite, sessionSecret: 's', signInAttemptsPerMinute: 2 }));
    const attempt = () => request(app).post('/api/auth/sign-in').send({ email: 'a@b.example', password: 'x' });
    expect((await attempt()).status).toBe(401);
    expect((await attempt()).status).toBe(401);
    const third = await attempt();
    expect(third.status).toBe(429);
    expect(third.body.error.message).toMatch(/Too many sign-in attempts/);
    sqlite.close();
  });
});

describe('security headers', () => {
  it('when any page is asked for, then a content security policy is sent that does not force HTTPS', async () => {
    const res = await request(t.app).get('/api/auth/me');
    const csp = String(res.headers['content-security-policy']);
    expect(csp).toMatch(/default-src 'self'/);
    expect(csp).not.toMatch(/upgrade-insecure-requests/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
  });
});
