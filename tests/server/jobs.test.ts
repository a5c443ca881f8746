import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { companyResponseSchema, defaultCompany } from '../../shared/schemas/company.ts';
import { jobDetailResponseSchema, jobHistoryResponseSchema } from '../../shared/schemas/jobs.ts';
import { blankSection, jobSectionKeys } from '../../shared/schemas/job-record.ts';
import { boardResponseSchema } from '../../shared/schemas/boards.ts';
import { jobListResponseSchema, jobResponseSchema } from '../../shared/schemas/sites.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';
import { rowCounts } from './row-counts.ts';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => t.close());

const newJob = (extra: Record<string, unknown> = {}) => ({ siteId: t.ids.site, kind: 'EICR', visitDate: '2026-12-03', ...extra });

describe('POST /api/jobs', () => {
  it('when a tester creates a job without a reference, then 201 with the next reference of the default pattern, being entered, version 1', async () => {
    const agent = await t.signIn('tester');
    const res = await agent.post('/api/jobs').send(newJob({ visitEndDate: '2026-12-04' }));
    expect(res.status).toBe(201);
    const { job } = jobResponseSchema.parse(res.body);
    // defaultCompany.referencePattern is {kind}-{yyyy}-{seq:4}: the first EICR of 2026.
    expect(defaultCompany.referencePattern).toBe('{kind}-{yyyy}-{seq:4}');
    expect(job).toMatchObject({ reference: 'EICR-2026-0001', state: 'entering', version: 1, visitEndDate: '2026-12-04', startedFromJobId: null, siteId: t.ids.site });
    const second = jobResponseSchema.parse((await agent.post('/api/jobs').send(newJob())).body).job;
    expect(second.reference).toBe('EICR-2026-0002');
    // Numbers count per kind when the pattern names the kind, and per year.
    expect((await agent.post('/api/jobs').send(newJob({ kind: 'EIC' }))).body.job.reference).toBe('EIC-2026-0001');
    expect((await agent.post('/api/jobs').send(newJob({ visitDate: '2027-01-05' }))).body.job.reference).toBe('EICR-2027-0001');
    const list = jobListResponseSchema.parse((await agent.get(`/api/jobs?siteId=${t.ids.site}`)).body);
    expect(list.jobs).toHaveLength(5);
    const history = await t.db.selectFrom('job_history').selectAll().where('job_id', '=', job.id).execute();
    expect(history).toEqual([expect.objectContaining({ action: 'created', user_id: t.ids.tester })]);
  });

  it('when the company pattern is changed by an admin, then new references follow it and skip numbers already taken', async () => {
    const admin = await t.signIn('admin');
    const company = { ...defaultCompany, name: 'Lanyard & Pike Electrical', referencePattern: 'LP/{yy}{mm}/{seq:3}' };
    const { logoFileId: _logo, ...fields } = company;
    expect((await admin.put('/api/company').send(fields)).status).toBe(200);
    const tester = await t.signIn('tester');
    // Someone typed the next number by hand earlier: it is skipped, not reused.
    expect((await tester.post('/api/jobs').send(newJob({ reference: 'LP/2612/004' }))).status).toBe(201);
    expect((await tester.post('/api/jobs').send(newJob())).body.job.reference).toBe('LP/2612/005');
    expect((await tester.post('/api/jobs').send(newJob({ visitDate: '2026-11-20' }))).body.job.reference).toBe('LP/2611/006');
  });

  it('when a typed reference is already used (in any case), then 409 in words and nothing is written', async () => {
    const agent = await t.signIn('tester');
    const before = await rowCounts(t.db);
    const res = await agent.post('/api/jobs').send(newJob({ reference: 't-1' }));
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/t-1 is already used by another job/);
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it.each([
    ['no site', { siteId: undefined }, 'siteId', /Choose the site/],
    ['an unknown kind', { kind: 'PIR' }, 'kind', /Choose EIC or EICR/],
    ['a date in another form', { visitDate: '03/12/2026' }, 'visitDate', /YYYY-MM-DD/],
    ['a last day before the first', { visitEndDate: '2026-12-01' }, 'visitEndDate', /cannot be before the first/],
  ])('when the body has %s, then 400 in words at the field and nothing is written', async (_what, extra, path, message) => {
    const before = await rowCounts(t.db);
    const res = await (await t.signIn('tester')).post('/api/jobs').send(newJob(extra));
    expect(res.status).toBe(400);
    expect(res.body.error.issues.find((i: { path: string }) => i.path === path)?.message).toMatch(message);
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it('when the site does not exist, then 400 in words and nothing is written', async () => {
    const before = await rowCounts(t.db);
    const res = await (await t.signIn('tester')).post('/api/jobs').send(newJob({ siteId: 999 }));
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/There is no site 999/);
    expect(await rowCounts(t.db)).toEqual(before);
  });
});

describe('a job started from an earlier job', () => {
  it('when a new EICR starts from the earlier job, then each board and its circuit details are copied, readings empty, each circuit linked to last time', async () => {
    const agent = await t.signIn('tester');
    // The earlier job's ring has a reading and a spur hanging from it.
    const circuits = await t.db.selectFrom('circuits').selectAll().where('board_id', '=', t.ids.board).orderBy('position').execute();
    const ring = circuits[0]!;
    await agent.put(`/api/boards/${t.ids.board}/circuits/${ring.id}/cells/zs`).send({ text: '0.61', version: 0 });
    const spur = await agent.post(`/api/boards/${t.ids.board}/circuits`).send({ description: 'Spur to hob', kind: 'spur', spurRingId: ring.id, spurOriginPoint: 'socket 3' });
    expect(spur.status).toBe(201);
    await t.db.updateTable('boards').set({ zdb_ohm: 0.31, instruments: 'MFT 5521' }).where('id', '=', t.ids.board).execute();

    const res = await agent.post('/api/jobs').send(newJob({ startFromJobId: t.ids.job, visitDate: '2031-11-02' }));
    expect(res.status).toBe(201);
    const { job } = jobResponseSchema.parse(res.body);
    expect(job.startedFromJobId).toBe(t.ids.job);

    const detail = jobDetailResponseSchema.parse((await agent.get(`/api/jobs/${job.id}`)).body);
    expect(detail.boards).toEqual([expect.objectContaining({ reference: 'DB1', circuitCount: 4, cellsFilled: 0 })]);
    const newBoard = await t.db.selectFrom('boards').selectAll().where('job_id', '=', job.id).executeTakeFirstOrThrow();
    expect(newBoard).toMatchObject({ phases: 1, zdb_ohm: null, ipf_ka: null, instruments: '', state: 'open' });
    const copies = await t.db.selectFrom('circuits').selectAll().where('board_id', '=', newBoard.id).orderBy('position').execute();
    const earlier = await t.db.selectFrom('circuits').selectAll().where('board_id', '=', t.ids.board).orderBy('position').execute();
    expect(copies.map((c) => c.previous_circuit_id)).toEqual(earlier.map((c) => c.id));
    expect(copies.map((c) => [c.number, c.description, c.rating_a, c.kind])).toEqual(earlier.map((c) => [c.number, c.description, c.rating_a, c.kind]));
    const spurCopy = copies.find((c) => c.kind === 'spur')!;
    expect(spurCopy.spur_ring_id).toBe(copies[0]!.id);
    const cells = await t.db.selectFrom('cells').innerJoin('circuits', 'circuits.id', 'cells.circuit_id').where('circuits.board_id', '=', newBoard.id).select('cells.text').execute();
    expect(cells).toEqual([]);
  });

  it('when the earlier job is on another site, then 400 in words and nothing is written', async () => {
    const agent = await t.signIn('tester');
    const other = (await agent.post('/api/sites').send({ client: 'Ferngate Surgery', address: '9 Upper Row, Elham Cross' })).body.site.id as number;
    const before = await rowCounts(t.db);
    const res = await agent.post('/api/jobs').send({ siteId: other, kind: 'EICR', visitDate: '2026-12-05', startFromJobId: t.ids.job });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/T-1 is on another site: a new job can only start from an earlier job on the same site/);
    expect(await rowCounts(t.db)).toEqual(before);
    const missing = await agent.post('/api/jobs').send(newJob({ startFromJobId: 999 }));
    expect(missing.status).toBe(400);
    expect(await rowCounts(t.db)).toEqual(before);
  });
});

describe('PATCH /api/jobs/:jobId', () => {
  it('when the reference and dates are edited, then 200, the version goes up and each change is in the history', async () => {
    const agent = await t.signIn('tester');
    const res = await agent.patch(`/api/jobs/${t.ids.job}`).send({ version: 1, changes: { reference: 'T-1A', visitEndDate: '2026-12-02' } });
    expect(res.status).toBe(200);
    expect(jobResponseSchema.parse(res.body).job).toMatchObject({ reference: 'T-1A', visitEndDate: '2026-12-02', version: 2 });
    const history = jobHistoryResponseSchema.parse((await agent.get(`/api/jobs/${t.ids.job}/history`)).body);
    expect(history.entries.map((e) => [e.field, e.oldValue, e.newValue, e.by?.name])).toEqual([
      ['reference', 'T-1', 'T-1A', 'Tom Tester'],
      ['visitEndDate', null, '2026-12-02', 'Tom Tester'],
    ]);
  });

  it('when two people edit different details from the same version, then both land; the same detail, then 409 with the current job', async () => {
    const a = await t.signIn('tester');
    const b = await t.signIn('tester2');
    expect((await a.patch(`/api/jobs/${t.ids.job}`).send({ version: 1, changes: { reference: 'T-9' } })).status).toBe(200);
    expect((await b.patch(`/api/jobs/${t.ids.job}`).send({ version: 1, changes: { visitDate: '2026-11-30' } })).status).toBe(200);
    const before = await rowCounts(t.db);
    const clash = await b.patch(`/api/jobs/${t.ids.job}`).send({ version: 1, changes: { reference: 'T-10' } });
    expect(clash.status).toBe(409);
    expect(clash.body.error.details.current).toMatchObject({ reference: 'T-9', visitDate: '2026-11-30', version: 3 });
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it('when the reference is taken or the last day falls before the first, then 409 / 400 in words and nothing changes', async () => {
    const agent = await t.signIn('tester');
    const other = jobResponseSchema.parse((await agent.post('/api/jobs').send(newJob())).body).job;
    const before = await rowCounts(t.db);
    const taken = await agent.patch(`/api/jobs/${t.ids.job}`).send({ version: 1, changes: { reference: other.reference } });
    expect(taken.status).toBe(409);
    expect(taken.body.error.message).toMatch(/already used by another job/);
    const dates = await agent.patch(`/api/jobs/${t.ids.job}`).send({ version: 1, changes: { visitEndDate: '2026-11-01' } });
    expect(dates.status).toBe(400);
    expect(dates.body.error.issues).toEqual([{ path: 'changes.visitEndDate', message: 'The last day of the visit cannot be before the first.' }]);
    const blank = await agent.patch(`/api/jobs/${t.ids.job}`).send({ version: 1, changes: { reference: ' ' } });
    expect(blank.status).toBe(400);
    expect(blank.body.error.message).toMatch(/A job needs a reference/);
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it('when the job is approved or issued, then 423 and nothing changes', async () => {
    const agent = await t.signIn('reviewer');
    for (const state of ['approved', 'issued'] as const) {
      await t.db.updateTable('jobs').set({ state }).where('id', '=', t.ids.job).execute();
      const before = await rowCounts(t.db);
      const res = await agent.patch(`/api/jobs/${t.ids.job}`).send({ version: 1, changes: { reference: 'T-2' } });
      expect(res.status).toBe(423);
      expect(res.body.error.message).toMatch(new RegExp(`T-1 is ${state}`));
      expect(await rowCounts(t.db)).toEqual(before);
    }
  });
});

describe('GET /api/jobs/:jobId', () => {
  it('when a new job is read, then every section of the record is there, blank at version 0, with its boards and findings', async () => {
    const agent = await t.signIn('tester');
    const res = await agent.get(`/api/jobs/${t.ids.job}`);
    expect(res.status).toBe(200);
    const detail = jobDetailResponseSchema.parse(res.body);
    expect(detail.job.reference).toBe('T-1');
    expect(detail.site.client).toBe('Test client');
    expect(detail.boards).toEqual([expect.objectContaining({ id: t.ids.board, reference: 'DB1', circuitCount: 3 })]);
    for (const key of jobSectionKeys) expect(detail.record[key]).toEqual({ data: blankSection(key), version: 0 });
    expect(detail.findings).toEqual([]);
    expect((await agent.get('/api/jobs/999')).status).toBe(404);
    expect((await agent.get('/api/jobs/abc')).status).toBe(400);
  });
});

describe('GET and PUT /api/company', () => {
  it('when anyone signed in reads the company, then the defaults come until an admin saves them', async () => {
    const res = await (await t.signIn('tester')).get('/api/company');
    expect(res.status).toBe(200);
    expect(companyResponseSchema.parse(res.body).company).toEqual(defaultCompany);
  });

  it('when a tester or reviewer tries to change the company, then 403 and nothing is written', async () => {
    const { logoFileId: _logo, ...fields } = defaultCompany;
    const before = await rowCounts(t.db);
    for (const role of ['tester', 'reviewer'] as const) {
      const res = await (await t.signIn(role)).put('/api/company').send({ ...fields, name: 'Takeover Ltd' });
      expect(res.status).toBe(403);
    }
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it('when an admin saves a pattern without {seq}, then 400 in words and nothing is written', async () => {
    const { logoFileId: _logo, ...fields } = defaultCompany;
    const before = await rowCounts(t.db);
    const res = await (await t.signIn('admin')).put('/api/company').send({ ...fields, referencePattern: '{kind}-{yyyy}' });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0]).toMatchObject({ path: 'referencePattern', message: expect.stringMatching(/needs \{seq\}/) });
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it('when an admin saves the company, then everyone reads the new details', async () => {
    const fields = { name: 'Lanyard & Pike Electrical', address: '2 Cooper Yard, Brackwell', phone: '01632 960 118', email: 'office@lanyard-pike.example.test', registration: '', referencePattern: 'LPE-{seq:5}' };
    const saved = await (await t.signIn('admin')).put('/api/company').send(fields);
    expect(saved.status).toBe(200);
    expect((await (await t.signIn('tester')).get('/api/company')).body.company).toEqual({ ...fields, logoFileId: null });
  });
});

describe('POST /api/jobs/:jobId/boards', () => {
  const board = (extra: Record<string, unknown>) => ({ reference: 'DB2', location: 'Garage', suppliedFrom: 'DB1 way 6', ...extra });

  it('when a 10-way single-phase board is made, then 201 with an open board of ten empty circuits numbered 1..10', async () => {
    const agent = await t.signIn('tester');
    const res = await agent.post(`/api/jobs/${t.ids.job}/boards`).send(board({ layout: 'single-phase', ways: 10 }));
    expect(res.status).toBe(201);
    const created = boardResponseSchema.parse(res.body).board;
    expect(created).toMatchObject({ jobId: t.ids.job, reference: 'DB2', location: 'Garage', suppliedFrom: 'DB1 way 6', phases: 1, state: 'open', zdbOhm: null, version: 1 });
    const circuits = await t.db.selectFrom('circuits').selectAll().where('board_id', '=', created.id).orderBy('position').execute();
    expect(circuits.map((c) => [c.position, c.number, c.phase])).toEqual(Array.from({ length: 10 }, (_, i) => [i + 1, String(i + 1), null]));
    const detail = await agent.get(`/api/boards/${created.id}`);
    expect(detail.status).toBe(200);
    expect(detail.body.circuits).toHaveLength(10);
    const jobHistory = await t.db.selectFrom('job_history').selectAll().where('job_id', '=', t.ids.job).execute();
    expect(jobHistory).toEqual([expect.objectContaining({ action: 'board-created', user_id: t.ids.tester })]);
  });

  it('when a three-phase board of 4 ways is made, then it has 12 circuits numbered per phase 1L1 1L2 1L3 2L1 … with their phase', async () => {
    // Three-phase boards number circuits per phase, e.g. 3L1 3L2 3L3 (common practice).
    const res = await (await t.signIn('tester')).post(`/api/jobs/${t.ids.job}/boards`).send(board({ layout: 'three-phase', ways: 4 }));
    expect(res.status).toBe(201);
    expect(res.body.board.phases).toBe(3);
    const circuits = await t.db.selectFrom('circuits').selectAll().where('board_id', '=', res.body.board.id).orderBy('position').execute();
    expect(circuits.map((c) => `${c.number}:${c.phase}`)).toEqual([
      '1L1:L1', '1L2:L2', '1L3:L3', '2L1:L1', '2L2:L2', '2L3:L3', '3L1:L1', '3L2:L2', '3L3:L3', '4L1:L1', '4L2:L2', '4L3:L3',
    ]);
  });

  it('when a board is copied, then its circuit details come across in order with readings empty, spurs linked to the copied ring, and no board readings', async () => {
    const agent = await t.signIn('tester');
    const source = await t.db.selectFrom('circuits').selectAll().where('board_id', '=', t.ids.board).orderBy('position').execute();
    await agent.put(`/api/boards/${t.ids.board}/circuits/${source[0]!.id}/cells/r1PlusR2`).send({ text: '0.32', version: 0 });
    await agent.post(`/api/boards/${t.ids.board}/circuits`).send({ description: 'Spur to utility room', kind: 'spur', spurRingId: source[0]!.id, spurOriginPoint: 'socket 2', spurLengthM: 4 });
    await agent.patch(`/api/boards/${t.ids.board}`).send({ version: 1, changes: { polarityConfirmed: true, instruments: 'MFT 5521' } });
    const res = await agent.post(`/api/jobs/${t.ids.job}/boards`).send(board({ layout: 'single-phase', copyFromBoardId: t.ids.board }));
    expect(res.status).toBe(201);
    const copy = boardResponseSchema.parse(res.body).board;
    expect(copy).toMatchObject({ zdbOhm: null, ipfKa: null, polarityConfirmed: false, instruments: '', phases: 1 });
    const detail = (await agent.get(`/api/boards/${copy.id}`)).body;
    const original = (await agent.get(`/api/boards/${t.ids.board}`)).body;
    const details = (c: Record<string, unknown>) => {
      const { id: _id, boardId: _b, cells: _c, spurRingId: _s, version: _v, ...rest } = c;
      return rest;
    };
    expect(detail.circuits.map(details)).toEqual(original.circuits.map(details));
    expect(detail.circuits.every((c: { cells: object }) => Object.keys(c.cells).length === 0)).toBe(true);
    const spur = detail.circuits.find((c: { kind: string }) => c.kind === 'spur');
    expect(spur.spurRingId).toBe(detail.circuits[0].id);
    expect(spur.spurRingId).not.toBe(original.circuits[0].id);
    const rows = await t.db.selectFrom('circuits').select('previous_circuit_id').where('board_id', '=', copy.id).execute();
    expect(rows.every((r) => r.previous_circuit_id === null)).toBe(true);
  });

  it.each([
    ['no reference', { reference: undefined, layout: 'single-phase', ways: 6 }, 'reference', /Give the board a reference/],
    ['no ways and nothing to copy', { layout: 'single-phase' }, 'ways', /number of ways, or a board to copy/],
    ['zero ways', { layout: 'single-phase', ways: 0 }, 'ways', /At least one way/],
    ['half a way', { layout: 'single-phase', ways: 2.5 }, 'ways', /whole number/],
    ['an unknown layout', { layout: 'split-phase', ways: 6 }, 'layout', /single-phase or three-phase/],
    ['a board to copy that does not exist', { layout: 'single-phase', copyFromBoardId: 999 }, 'copyFromBoardId', /no board 999/],
    ['a copy of a single-phase board as three-phase', { layout: 'three-phase', copyFromBoardId: -1 }, 'layout', /single-phase: a copy of it is single-phase too/],
  ] as [string, Record<string, unknown>, string, RegExp][])('when the body has %s, then 400 in words at the field and nothing is written', async (_what, extra, path, message) => {
    const body = board(extra.copyFromBoardId === -1 ? { ...extra, copyFromBoardId: t.ids.board } : extra);
    const before = await rowCounts(t.db);
    const res = await (await t.signIn('tester')).post(`/api/jobs/${t.ids.job}/boards`).send(body);
    expect(res.status).toBe(400);
    expect(res.body.error.issues.find((i: { path: string }) => i.path === path)?.message).toMatch(message);
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it('when the job already has a board of that reference, then 409; when the job is approved, then 423; nothing is written', async () => {
    const agent = await t.signIn('tester');
    const before = await rowCounts(t.db);
    const same = await agent.post(`/api/jobs/${t.ids.job}/boards`).send(board({ reference: 'db1', layout: 'single-phase', ways: 4 }));
    expect(same.status).toBe(409);
    expect(same.body.error.message).toMatch(/already has a board db1/);
    await t.db.updateTable('jobs').set({ state: 'approved' }).where('id', '=', t.ids.job).execute();
    const locked = await agent.post(`/api/jobs/${t.ids.job}/boards`).send(board({ layout: 'single-phase', ways: 4 }));
    expect(locked.status).toBe(423);
    expect(await rowCounts(t.db)).toEqual(before);
    expect((await agent.post('/api/jobs/999/boards').send(board({ layout: 'single-phase', ways: 4 }))).status).toBe(404);
  });
});
