import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiErrorSchema } from '../../shared/schemas/common.ts';
import { siteListResponseSchema, siteResponseSchema } from '../../shared/schemas/sites.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';
import { rowCounts } from './row-counts.ts';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => t.close());

const newSite = {
  client: 'Harrow Mill Studios',
  address: '3 Weir Lane, Castleford Hythe, CH2 8LW',
  description: 'Two pottery studios and a kiln room in a converted mill',
  contactName: 'Imogen Tasker',
  contactEmail: 'imogen.tasker@example.test',
  earthing: 'TT' as const,
  zeOhm: 38,
  pfcKa: 0.6,
};

describe('POST /api/sites', () => {
  it('when a tester creates a site, then 201 with the site at version 1, listed, with a history row', async () => {
    const agent = await t.signIn('tester');
    const res = await agent.post('/api/sites').send(newSite);
    expect(res.status).toBe(201);
    const { site } = siteResponseSchema.parse(res.body);
    // Defaults for what the body leaves out: U0 230 V is the UK nominal voltage to earth (BS 7671:2018 Appendix 2 / ESQCR — common practice).
    expect(site).toMatchObject({ ...newSite, nominalVoltageV: 230, version: 1 });
    const list = siteListResponseSchema.parse((await agent.get('/api/sites')).body);
    expect(list.sites.map((s) => s.client)).toContain('Harrow Mill Studios');
    const history = await t.db.selectFrom('site_history').selectAll().where('site_id', '=', site.id).execute();
    expect(history).toEqual([expect.objectContaining({ action: 'created', user_id: t.ids.tester, version: 1 })]);
  });

  it('when only client and address are given, then the rest takes the defaults (TN-C-S, 230 V, blanks)', async () => {
    const res = await (await t.signIn('reviewer')).post('/api/sites').send({ client: 'Wren Cottage', address: '1 Green, Lowby' });
    expect(res.status).toBe(201);
    expect(res.body.site).toMatchObject({ earthing: 'TN-C-S', nominalVoltageV: 230, zeOhm: null, pfcKa: null, contactEmail: '', description: '' });
  });

  it.each([
    ['no client', { ...newSite, client: '  ' }, 'client', /Name the client/],
    ['no address', { ...newSite, address: undefined }, 'address', /address/i],
    ['a bad e-mail', { ...newSite, contactEmail: 'imogen at example' }, 'contactEmail', /not an e-mail address/],
    ['an unknown earthing system', { ...newSite, earthing: 'IT' }, 'earthing', /TN-S, TN-C-S or TT/],
    ['a negative Ze', { ...newSite, zeOhm: -1 }, 'zeOhm', /Ze cannot be negative/],
    ['Ze as text', { ...newSite, zeOhm: '0.35' }, 'zeOhm', /Ze must be a number/],
  ])('when the body has %s, then 400 in words at the field and nothing is written', async (_what, body, path, message) => {
    const before = await rowCounts(t.db);
    const res = await (await t.signIn('tester')).post('/api/sites').send(body);
    expect(res.status).toBe(400);
    const { error } = apiErrorSchema.parse(res.body);
    expect(error.issues?.find((i) => i.path === path)?.message).toMatch(message);
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it('when nobody is signed in, then 401 and nothing is written', async () => {
    const { default: request } = await import('supertest');
    const before = await rowCounts(t.db);
    expect((await request(t.app).post('/api/sites').send(newSite)).status).toBe(401);
    expect(await rowCounts(t.db)).toEqual(before);
  });
});

describe('PATCH /api/sites/:siteId', () => {
  it('when a field is changed at the current version, then the version goes up and the old and new values are in the history', async () => {
    const agent = await t.signIn('tester');
    const res = await agent.patch(`/api/sites/${t.ids.site}`).send({ version: 1, changes: { contactEmail: 'site.office@example.test', zeOhm: 0.19 } });
    expect(res.status).toBe(200);
    expect(siteResponseSchema.parse(res.body).site).toMatchObject({ contactEmail: 'site.office@example.test', zeOhm: 0.19, version: 2 });
    const history = await t.db.selectFrom('site_history').selectAll().where('site_id', '=', t.ids.site).orderBy('id').execute();
    expect(history.map((h) => [h.field, h.old_text, h.new_text, h.version])).toEqual([
      ['contactEmail', '""', '"site.office@example.test"', 2],
      ['zeOhm', '0.2', '0.19', 2],
    ]);
  });

  it('when two people change different fields from the same version, then both land', async () => {
    const a = await t.signIn('tester');
    const b = await t.signIn('tester2');
    expect((await a.patch(`/api/sites/${t.ids.site}`).send({ version: 1, changes: { contactName: 'Nell Prosser' } })).status).toBe(200);
    const second = await b.patch(`/api/sites/${t.ids.site}`).send({ version: 1, changes: { description: 'Detached bungalow' } });
    expect(second.status).toBe(200);
    expect(second.body.site).toMatchObject({ contactName: 'Nell Prosser', description: 'Detached bungalow', version: 3 });
  });

  it('when two people change the same field from the same version, then the second gets 409 with the current site and nothing changes', async () => {
    const a = await t.signIn('tester');
    const b = await t.signIn('tester2');
    await a.patch(`/api/sites/${t.ids.site}`).send({ version: 1, changes: { client: 'Prosser Holdings' } });
    const before = await rowCounts(t.db);
    const res = await b.patch(`/api/sites/${t.ids.site}`).send({ version: 1, changes: { client: 'N. Prosser' } });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/client/);
    expect(res.body.error.details.current).toMatchObject({ client: 'Prosser Holdings', version: 2 });
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it('when the change is empty or invalid, then 400 in words and nothing changes; an unknown site is 404', async () => {
    const agent = await t.signIn('tester');
    const before = await rowCounts(t.db);
    const empty = await agent.patch(`/api/sites/${t.ids.site}`).send({ version: 1, changes: {} });
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toMatch(/Nothing to change/);
    const bad = await agent.patch(`/api/sites/${t.ids.site}`).send({ version: 1, changes: { nominalVoltageV: 0 } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.issues[0]).toEqual({ path: 'changes.nominalVoltageV', message: 'U0 must be above 0 V.' });
    expect((await agent.patch('/api/sites/999').send({ version: 1, changes: { client: 'X' } })).status).toBe(404);
    expect(await rowCounts(t.db)).toEqual(before);
  });
});
