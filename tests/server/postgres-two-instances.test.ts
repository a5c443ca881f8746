import type { Server } from 'node:http';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { SharedPresence } from '../../server/shared-presence.ts';
import { openPostgres, type OpenedPostgres } from '../../server/db/database.ts';
import { asOwnPage, createTestApp, listen, password, testPostgresUrl, type TestApp } from '../helpers/test-app.ts';

/**
 * Two Boardwalk processes behind a load balancer share one PostgreSQL database: each instance here
 * is a separate app with its own pool, listening on its own port, as two processes would. Runs only
 * on PostgreSQL (`.ci/run` sets BOARDWALK_TEST_DATABASE_URL); on SQLite there is one process.
 */
describe.skipIf(!testPostgresUrl)('two instances on one PostgreSQL database', () => {
  let t: TestApp;
  let second: OpenedPostgres;
  let servers: Server[];
  let urlA: string;
  let urlB: string;
  let lights: number;

  beforeEach(async () => {
    t = await createTestApp();
    second = openPostgres(t.postgres!.url, { max: 4 });
    // Both as their own pages call them (same-origin changes), like t.app.
    const appB = asOwnPage(createApp({ db: second.db, postgres: second.pool, sessionSecret: 'test-secret', signInAttemptsPerMinute: 1000, dataDir: t.dataDir }));
    const a = await listen(t.app);
    const b = await listen(appB);
    servers = [a.server, b.server];
    urlA = a.url;
    urlB = b.url;
    const ids = await t.db.selectFrom('circuits').select('id').orderBy('position').execute();
    lights = ids[1]!.id;
  });

  afterEach(async () => {
    for (const server of servers) {
      server.closeAllConnections();
      await new Promise((resolve) => server.close(resolve));
    }
    await second.pool.end();
    await t.close();
  });

  async function typist(url: string, email: string) {
    const agent = request.agent(url);
    const res = await agent.post('/api/auth/sign-in').send({ email, password });
    expect(res.status).toBe(200);
    return agent;
  }

  it('when a typist on each instance works on the same board, then each sees the other within two seconds, and a stale write answers 409 on the other instance', async () => {
    const tom = await typist(urlA, 'tester@test.example'); // on instance A
    const tess = await typist(urlB, 'tester2@test.example'); // on instance B
    const board = t.ids.board;
    const openA = await tom.get(`/api/boards/${board}`);
    const openB = await tess.get(`/api/boards/${board}`);
    expect(openA.status).toBe(200);
    expect(openB.status).toBe(200);

    // Tom types on A; Tess's console polls B once a second, as the console does.
    const written = await tom.put(`/api/boards/${board}/circuits/${lights}/cells/r1PlusR2`).send({ text: '0.62', version: 0 });
    expect(written.status).toBe(200);
    const writtenAt = Date.now();
    let cursor: number = openB.body.cursor;
    let seen: { circuits: { id: number; cells: Record<string, { text: string }> }[]; present: { name: string }[] } | null = null;
    while (Date.now() - writtenAt < 2000) {
      await new Promise((resolve) => setTimeout(resolve, 1000 - ((Date.now() - writtenAt) % 1000) || 1));
      const feed = await tess.get(`/api/boards/${board}/changes`).query({ after: cursor });
      expect(feed.status).toBe(200);
      cursor = feed.body.cursor;
      if (feed.body.circuits.some((c: { id: number }) => c.id === lights)) {
        seen = feed.body;
        break;
      }
    }
    const elapsed = Date.now() - writtenAt;
    expect(seen, `Tess on instance B had not seen Tom's reading ${elapsed} ms after it was written on A`).not.toBeNull();
    expect(elapsed).toBeLessThan(2000);
    expect(seen!.circuits.find((c) => c.id === lights)!.cells.r1PlusR2!.text).toBe('0.62');
    // Presence is shared too: Tess on B sees Tom, who is on A.
    expect(seen!.present.map((p) => p.name)).toContain('Tom Tester');
    const feedA = await tom.get(`/api/boards/${board}/changes`).query({ after: openA.body.cursor });
    expect(feedA.body.present.map((p: { name: string }) => p.name)).toContain('Tess Second');

    // Tess, on B, writes the same cell from the version she saw before Tom's write: 409 with Tom's text.
    const stale = await tess.put(`/api/boards/${board}/circuits/${lights}/cells/r1PlusR2`).send({ text: '0.58', version: 0 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.current).toMatchObject({ text: '0.62', updatedBy: { name: 'Tom Tester' } });
    // Her edit on B is seen on A within the same two seconds, through the same feed.
    const fresh = await tess.put(`/api/boards/${board}/circuits/${lights}/cells/r1PlusR2`).send({ text: '0.58', version: 1 });
    expect(fresh.status).toBe(200);
    const onA = await tom.get(`/api/boards/${board}/changes`).query({ after: written.body.cursor });
    expect(onA.body.circuits.find((c: { id: number }) => c.id === lights).cells.r1PlusR2.text).toBe('0.58');
  });

  it('when a sign-in on one instance is used on the other (no sticky sessions), then it is the same session', async () => {
    const signIn = await request(urlA).post('/api/auth/sign-in').send({ email: 'tester@test.example', password });
    expect(signIn.status).toBe(200);
    const cookie = signIn.headers['set-cookie']![0]!.split(';')[0]!;
    expect(cookie).toMatch(/^boardwalk\.sid=/);
    const onB = await request(urlB).get('/api/auth/me').set('Cookie', cookie);
    expect(onB.status).toBe(200);
    expect(onB.body.user.email).toBe('tester@test.example');
    // Signing out on B ends it on A too.
    expect((await request(urlB).post('/api/auth/sign-out').set('Cookie', cookie)).status).toBe(204);
    expect((await request(urlA).get('/api/auth/me').set('Cookie', cookie)).status).toBe(401);
  });

  it('when both instances take writes of one cell from the same version at the same moment, then exactly one lands and the others answer 409', async () => {
    const tom = await typist(urlA, 'tester@test.example');
    const tess = await typist(urlB, 'tester2@test.example');
    const board = t.ids.board;
    const texts = ['0.60', '0.61', '0.62', '0.63', '0.64', '0.65', '0.66', '0.67'];
    const answers = await Promise.all(
      texts.map((text, i) => (i % 2 === 0 ? tom : tess).put(`/api/boards/${board}/circuits/${lights}/cells/r1PlusR2`).send({ text, version: 0 })),
    );
    const statuses = answers.map((a) => a.status).sort();
    expect(statuses).toEqual([200, 409, 409, 409, 409, 409, 409, 409]);
    const winner = texts[answers.findIndex((a) => a.status === 200)];
    const cell = await t.db.selectFrom('cells').select(['text', 'version']).where('circuit_id', '=', lights).where('column_key', '=', 'r1PlusR2').executeTakeFirstOrThrow();
    expect(cell).toEqual({ text: winner, version: 1 });
    const history = await t.db.selectFrom('history').select('new_text').where('circuit_id', '=', lights).where('column_key', '=', 'r1PlusR2').execute();
    expect(history).toEqual([{ new_text: winner }]);
  });

  it('when someone has not been seen for the window, then the shared presence no longer names them and their row is swept', async () => {
    const onA = new SharedPresence(t.db, 400);
    const onB = new SharedPresence(second.db, 400);
    await onA.touch(t.ids.board, { id: t.ids.tester, name: 'Tom Tester' });
    await onB.touch(t.ids.board, { id: t.ids.tester2, name: 'Tess Second' });
    expect(await onB.others(t.ids.board, t.ids.tester2)).toEqual([{ id: t.ids.tester, name: 'Tom Tester' }]);
    expect(await onA.others(t.ids.board, t.ids.tester)).toEqual([{ id: t.ids.tester2, name: 'Tess Second' }]);
    // Another board is not this one.
    expect(await onB.others(t.ids.board + 1, t.ids.tester2)).toEqual([]);
    await new Promise((resolve) => setTimeout(resolve, 600));
    await onB.touch(t.ids.board, { id: t.ids.tester2, name: 'Tess Second' });
    expect(await onB.others(t.ids.board, t.ids.tester2)).toEqual([]);
    const rows = await t.db.withTables<{ presence: { board_id: number; user_id: number } }>().selectFrom('presence').select('user_id').execute();
    expect(rows).toEqual([{ user_id: t.ids.tester2 }]);
  });
});
