import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => t.close());

describe('/api/users (admin only)', () => {
  it('when a tester or reviewer lists users, then 403', async () => {
    for (const role of ['tester', 'reviewer'] as const) {
      const res = await (await t.signIn(role)).get('/api/users');
      expect(res.status).toBe(403);
      expect(res.body.error.message).toMatch(/Only an admin can do this/);
    }
  });

  it('when an admin creates a person, then they can sign in with that role', async () => {
    const admin = await t.signIn('admin');
    const created = await admin.post('/api/users').send({ email: 'new@test.example', name: 'New Person', role: 'reviewer', password: 'long enough pw' });
    expect(created.status).toBe(201);
    expect(created.body.user).toMatchObject({ email: 'new@test.example', role: 'reviewer' });
    const signIn = await request(t.app).post('/api/auth/sign-in').send({ email: 'new@test.example', password: 'long enough pw' });
    expect(signIn.body.user.role).toBe('reviewer');
    expect((await admin.get('/api/users')).body.users).toHaveLength(5);
  });

  it('when an admin sets a role, then it changes; when the e-mail exists, then 409', async () => {
    const admin = await t.signIn('admin');
    const res = await admin.patch(`/api/users/${t.ids.tester}`).send({ role: 'reviewer' });
    expect(res.status).toBe(200);
    expect(res.body.user.role).toBe('reviewer');
    const dup = await admin.post('/api/users').send({ email: 'tester@test.example', name: 'X', role: 'tester', password: 'long enough pw' });
    expect(dup.status).toBe(409);
  });

  it('when the body is bad, then 400 naming the field; when the user is missing, then 404', async () => {
    const admin = await t.signIn('admin');
    const bad = await admin.post('/api/users').send({ email: 'x@test.example', name: 'X', role: 'boss', password: 'short' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.issues.map((i: { path: string }) => i.path)).toEqual(expect.arrayContaining(['role', 'password']));
    expect((await admin.patch('/api/users/999').send({ role: 'tester' })).status).toBe(404);
    expect((await admin.patch('/api/users/abc').send({ role: 'tester' })).status).toBe(400);
  });

  it('when the only admin would lose the role, then 409 and nothing changes', async () => {
    const admin = await t.signIn('admin');
    const res = await admin.patch(`/api/users/${t.ids.admin}`).send({ role: 'tester' });
    expect(res.status).toBe(409);
    expect((await admin.get('/api/auth/me')).body.user.role).toBe('admin');
  });
});
