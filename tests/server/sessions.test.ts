import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { createTestApp, password, type TestApp } from '../helpers/test-app.ts';

// Ending every session when a password changes or an account is deactivated, and keeping the
// person's name on what they did: common practice (OWASP Session Management Cheat Sheet,
// "Renew the session ID after any privilege level change" and "Manual session expiration").

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => {
  vi.useRealTimers();
  t.close();
});

const signInAs = (email: string, pw: string) => request.agent(t.app).post('/api/auth/sign-in').send({ email, password: pw });

describe('a password change ends the person’s other sessions', () => {
  it('when an admin resets a tester’s password, then the tester’s open sessions answer 401 at once with a message; the new password signs in', async () => {
    const tester = await t.signIn('tester');
    const testerOnPhone = await t.signIn('tester');
    expect((await tester.get('/api/auth/me')).status).toBe(200);
    const admin = await t.signIn('admin');
    expect((await admin.patch(`/api/users/${t.ids.tester}`).send({ password: 'a new long password' })).status).toBe(200);

    for (const session of [tester, testerOnPhone]) {
      const res = await session.get(`/api/boards/${t.ids.board}`);
      expect(res.status).toBe(401);
      expect(res.body.error.message).toMatch(/signed out because your password was changed/);
    }
    expect((await signInAs('tester@test.example', password)).status).toBe(401);
    expect((await signInAs('tester@test.example', 'a new long password')).status).toBe(200);
    // The admin's own session is untouched.
    expect((await admin.get('/api/users')).status).toBe(200);
  });

  it('when a person changes their own password, then their other sessions end and this one goes on', async () => {
    const here = await t.signIn('tester');
    const elsewhere = await t.signIn('tester');
    const res = await here.post('/api/auth/password').send({ currentPassword: password, newPassword: 'another long password' });
    expect(res.status).toBe(204);
    expect((await here.get('/api/auth/me')).status).toBe(200);
    expect((await elsewhere.get('/api/auth/me')).status).toBe(401);
    expect((await signInAs('tester@test.example', 'another long password')).status).toBe(200);
  });

  it('when the current password is wrong or the new one too short, then 400 with a message and nothing changes', async () => {
    const here = await t.signIn('tester');
    const elsewhere = await t.signIn('tester');
    const wrong = await here.post('/api/auth/password').send({ currentPassword: 'not it', newPassword: 'another long password' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.message).toMatch(/current password is not right/);
    expect(wrong.body.error.details).toEqual({ field: 'currentPassword' });
    const short = await here.post('/api/auth/password').send({ currentPassword: password, newPassword: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.issues[0].path).toBe('newPassword');
    expect((await elsewhere.get('/api/auth/me')).status).toBe(200);
    expect((await signInAs('tester@test.example', password)).status).toBe(200);
  });

  it('when an admin changes their own password through the people list, then they stay signed in there', async () => {
    const admin = await t.signIn('admin');
    const adminElsewhere = await t.signIn('admin');
    expect((await admin.patch(`/api/users/${t.ids.admin}`).send({ password: 'admin new password' })).status).toBe(200);
    expect((await admin.get('/api/users')).status).toBe(200);
    expect((await adminElsewhere.get('/api/users')).status).toBe(401);
  });
});

describe('deactivating a person', () => {
  it('when an admin deactivates a tester, then the tester’s sessions end, sign-in is refused with a message, and their name stays on their readings', async () => {
    const tester = await t.signIn('tester');
    const circuit = await t.db.selectFrom('circuits').select('id').where('board_id', '=', t.ids.board).orderBy('position').executeTakeFirstOrThrow();
    const cellUrl = `/api/boards/${t.ids.board}/circuits/${circuit.id}/cells/zs`;
    expect((await tester.put(cellUrl).send({ text: '0.44', version: 0 })).status).toBe(200);

    const admin = await t.signIn('admin');
    const res = await admin.patch(`/api/users/${t.ids.tester}`).send({ active: false });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ id: t.ids.tester, name: 'Tom Tester', active: false, deactivatedAt: expect.any(String) });

    const cut = await tester.get('/api/auth/me');
    expect(cut.status).toBe(401);
    expect(cut.body.error.message).toMatch(/account has been deactivated/);
    const refused = await signInAs('tester@test.example', password);
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toMatch(/deactivated, so it cannot sign in.*Ask an admin/);
    // A wrong password to a deactivated account says only that the password is wrong.
    expect((await signInAs('tester@test.example', 'wrong')).body.error.message).toMatch(/do not match/);

    const reviewer = await t.signIn('reviewer');
    const board = await reviewer.get(`/api/boards/${t.ids.board}`);
    expect(board.body.circuits[0].cells.zs.updatedBy).toEqual({ id: t.ids.tester, name: 'Tom Tester' });
    const history = await reviewer.get(`${cellUrl}/history`);
    expect(history.body.history[0].by).toEqual({ id: t.ids.tester, name: 'Tom Tester' });
    const people = (await admin.get('/api/users')).body.users;
    expect(people.find((p: { id: number }) => p.id === t.ids.tester)).toMatchObject({ active: false });

    expect((await admin.patch(`/api/users/${t.ids.tester}`).send({ active: true })).body.user.active).toBe(true);
    expect((await signInAs('tester@test.example', password)).status).toBe(200);
  });

  it('when an admin would deactivate themself or the last admin, then 409 with a message', async () => {
    const admin = await t.signIn('admin');
    const self = await admin.patch(`/api/users/${t.ids.admin}`).send({ active: false });
    expect(self.status).toBe(409);
    expect(self.body.error.message).toMatch(/cannot deactivate your own account/);
    // A second admin may not deactivate the first when the first would be the last active one…
    expect((await admin.patch(`/api/users/${t.ids.reviewer}`).send({ role: 'admin' })).status).toBe(200);
    const second = await t.signIn('reviewer');
    expect((await second.patch(`/api/users/${t.ids.admin}`).send({ active: false })).status).toBe(200);
    const last = await admin.get('/api/users');
    expect(last.status).toBe(401);
    // …and now the reviewer-made-admin is the last one who can sign in.
    expect((await second.patch(`/api/users/${t.ids.reviewer}`).send({ role: 'tester' })).status).toBe(409);
  });

  it('when someone would add an account with a deactivated person’s e-mail, then 409 saying to reactivate it', async () => {
    const admin = await t.signIn('admin');
    await admin.patch(`/api/users/${t.ids.tester}`).send({ active: false });
    const dup = await admin.post('/api/users').send({ email: 'tester@test.example', name: 'T', role: 'tester', password: 'long enough pw' });
    expect(dup.status).toBe(409);
    expect(dup.body.error.message).toMatch(/reactivate it instead/);
  });

  it('when a tester or reviewer tries to deactivate someone, then 403', async () => {
    for (const role of ['tester', 'reviewer'] as const) {
      expect((await (await t.signIn(role)).patch(`/api/users/${t.ids.tester2}`).send({ active: false })).status).toBe(403);
    }
  });
});

describe('sign-out without a session', () => {
  it('when nobody is signed in, then sign-out still answers 204 (the wanted outcome already holds)', async () => {
    const res = await request(t.app).post('/api/auth/sign-out').send({});
    expect(res.status).toBe(204);
  });
});

describe('session expiry renewal', () => {
  async function storedExpiry(): Promise<string[]> {
    const rows = await t.db.selectFrom('sessions' as never).select('expire' as never).execute();
    return (rows as { expire: string }[]).map((r) => r.expire);
  }

  it('when a signed-in person makes requests within a minute, then the stored expiry is written at most once a minute', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-12-02T08:00:00Z'));
    const agent = await t.signIn('tester');
    const atSignIn = await storedExpiry();
    expect(atSignIn).toHaveLength(1);
    vi.setSystemTime(new Date('2026-12-02T08:00:30Z'));
    for (let i = 0; i < 5; i++) expect((await agent.get('/api/auth/me')).status).toBe(200);
    expect(await storedExpiry()).toEqual(atSignIn);
    vi.setSystemTime(new Date('2026-12-02T08:01:01Z'));
    await agent.get('/api/auth/me');
    const renewed = await storedExpiry();
    expect(renewed[0]! > atSignIn[0]!).toBe(true);
    vi.setSystemTime(new Date('2026-12-02T08:01:30Z'));
    await agent.get('/api/auth/me');
    expect(await storedExpiry()).toEqual(renewed);
  });
});
