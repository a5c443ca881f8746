import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { jobDetailResponseSchema, jobHistoryResponseSchema, writeJobSectionResponseSchema } from '../../shared/schemas/jobs.ts';
import { overallAssessment, type JobSectionData, type Observation } from '../../shared/schemas/job-record.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';
import { rowCounts } from './row-counts.ts';

let t: TestApp;
let ring: number;
beforeEach(async () => {
  t = await createTestApp();
  ring = (await t.db.selectFrom('circuits').select('id').where('board_id', '=', t.ids.board).orderBy('position').executeTakeFirstOrThrow()).id;
});
afterEach(() => t.close());

const url = (section: string, jobId = t.ids.job) => `/api/jobs/${jobId}/record/${section}`;

const observation = (extra: Partial<Observation> = {}): Observation => ({
  number: 1,
  text: 'Socket-outlet in the utility room cracked, live parts reachable with a finger',
  location: 'Utility room',
  code: 'C1',
  boardId: null,
  circuitId: null,
  inspectionItem: '5.4',
  ...extra,
});

describe('PUT /api/jobs/:jobId/record/:section', () => {
  it('when a tester fills part of the supply section at version 0, then 200 with version 1, the rest still blank, and one history row per field', async () => {
    const agent = await t.signIn('tester');
    // TN-C-S single-phase: U0 230 V, 50 Hz (UK supply: ESQCR 2002 reg. 27 — common practice).
    const res = await agent.put(url('supply')).send({ version: 0, changes: { earthing: 'TN-C-S', liveConductors: '1-phase 2-wire', u0V: 230, frequencyHz: 50, zeOhm: 0.21 } });
    expect(res.status).toBe(200);
    const body = writeJobSectionResponseSchema.parse(res.body);
    expect(body.section.version).toBe(1);
    expect(body.section.data).toMatchObject({ earthing: 'TN-C-S', u0V: 230, zeOhm: 0.21, ipfKa: null, supplyDeviceStandard: '' });
    const history = jobHistoryResponseSchema.parse((await agent.get(`/api/jobs/${t.ids.job}/history`)).body);
    expect(history.entries.map((e) => [e.section, e.field, e.action, e.oldValue, e.newValue])).toEqual([
      ['supply', 'earthing', 'record', null, 'TN-C-S'],
      ['supply', 'liveConductors', 'record', null, '1-phase 2-wire'],
      ['supply', 'u0V', 'record', null, 230],
      ['supply', 'frequencyHz', 'record', null, 50],
      ['supply', 'zeOhm', 'record', null, 0.21],
    ]);
    expect(body.cursor).toBe(history.entries.at(-1)!.id);
    const detail = jobDetailResponseSchema.parse((await agent.get(`/api/jobs/${t.ids.job}`)).body);
    expect(detail.record.supply).toEqual(body.section);
  });

  it('when the supply section records TT and Ze, then the site follows, so the board checker judges the same earthing as the job rules', async () => {
    const agent = await t.signIn('tester');
    // TT with Ze through the electrode of tens of ohms is normal (BS 7671:2018 Table 41.5 note — common practice).
    expect((await agent.put(url('supply')).send({ version: 0, changes: { earthing: 'TT', zeOhm: 48, u0V: 230 } })).status).toBe(200);
    const board = (await agent.get(`/api/boards/${t.ids.board}`)).body;
    expect(board.site).toMatchObject({ earthing: 'TT', zeOhm: 48, nominalVoltageV: 230 });
    const siteHistory = await t.db.selectFrom('site_history').select(['field', 'new_text']).where('field', '=', 'earthing').execute();
    expect(siteHistory).toEqual([{ field: 'earthing', new_text: '"TT"' }]);
  });

  it('when two people change different fields of a section from the same version, then both land and are merged', async () => {
    const a = await t.signIn('tester');
    const b = await t.signIn('tester2');
    expect((await a.put(url('origin')).send({ version: 0, changes: { meansOfEarthing: 'supplier', earthingConductorCsaMm2: 16 } })).status).toBe(200);
    const second = await b.put(url('origin')).send({ version: 0, changes: { bondingConductorCsaMm2: 10, bondedWater: 'yes' } });
    expect(second.status).toBe(200);
    expect(second.body.section).toMatchObject({ version: 2, data: { meansOfEarthing: 'supplier', earthingConductorCsaMm2: 16, bondingConductorCsaMm2: 10, bondedWater: 'yes' } });
    const rows = await t.db.selectFrom('job_history').select(['field', 'user_id', 'version']).where('section', '=', 'origin').orderBy('id').execute();
    expect(rows).toEqual([
      { field: 'meansOfEarthing', user_id: t.ids.tester, version: 1 },
      { field: 'earthingConductorCsaMm2', user_id: t.ids.tester, version: 1 },
      { field: 'bondingConductorCsaMm2', user_id: t.ids.tester2, version: 2 },
      { field: 'bondedWater', user_id: t.ids.tester2, version: 2 },
    ]);
  });

  it('when two people add different observations at once, then both are kept', async () => {
    const a = await t.signIn('tester');
    const b = await t.signIn('tester2');
    expect((await a.put(url('observations')).send({ version: 0, changes: { 'o-a': observation() } })).status).toBe(200);
    const res = await b.put(url('observations')).send({ version: 0, changes: { 'o-b': observation({ number: 2, code: 'C3', text: 'No RCD test notice at the board', inspectionItem: '4.7' }) } });
    expect(res.status).toBe(200);
    expect(Object.keys(res.body.section.data).sort()).toEqual(['o-a', 'o-b']);
  });

  it('when the same field was changed since the version sent, then 409 with the current section and nothing is written', async () => {
    const a = await t.signIn('tester');
    const b = await t.signIn('tester2');
    await a.put(url('summary')).send({ version: 0, changes: { generalCondition: 'Sound, but the board is past its best.' } });
    const before = await rowCounts(t.db);
    const res = await b.put(url('summary')).send({ version: 0, changes: { generalCondition: 'Fair.', nextInspectionMonths: 60 } });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/generalCondition in the summary section/);
    expect(res.body.error.details).toEqual({ section: { data: expect.objectContaining({ generalCondition: 'Sound, but the board is past its best.', nextInspectionMonths: null }), version: 1 }, fields: ['generalCondition'] });
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it('when a write is sent again after its answer was lost, then 200 and nothing new is written', async () => {
    const agent = await t.signIn('tester');
    const changes = { extentCovered: 'Whole installation', limitations: [{ kind: 'agreed', what: 'Loft wiring', reason: 'Boarded loft, no access' }] };
    await agent.put(url('extent')).send({ version: 0, changes });
    const before = await rowCounts(t.db);
    const again = await agent.put(url('extent')).send({ version: 0, changes });
    expect(again.status).toBe(200);
    expect(again.body.section.version).toBe(1);
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it('when observations and coded items are written, then the overall assessment follows them and the job findings come back with the write', async () => {
    const agent = await t.signIn('tester');
    const coded = await agent.put(url('inspections')).send({ version: 0, changes: { '5.4': 'C1', '1.1': 'ok' } });
    expect(coded.status).toBe(200);
    // An item coded C1 without its observation is a job finding (the job checker's rule).
    expect(coded.body.findings.map((f: { code: string; field: string }) => [f.code, f.field])).toEqual([['inspection-coded-without-observation', '5.4']]);
    const written = await agent.put(url('observations')).send({ version: 0, changes: { 'o-1': observation({ boardId: t.ids.board, circuitId: ring }) } });
    expect(written.status).toBe(200);
    expect(written.body.findings).toEqual([]);
    const detail = jobDetailResponseSchema.parse((await agent.get(`/api/jobs/${t.ids.job}`)).body);
    // Any C1, C2 or FI makes a condition report unsatisfactory (BS 7671:2018 Appendix 6, notes on the EICR).
    expect(overallAssessment(detail.record.observations.data as JobSectionData['observations']).assessment).toBe('unsatisfactory');
    const removed = await agent.put(url('observations')).send({ version: 1, changes: { 'o-1': null } });
    expect(removed.body.section).toEqual({ data: {}, version: 2 });
  });

  it('when the job is approved or issued, then 423 and nothing is written', async () => {
    const agent = await t.signIn('reviewer');
    for (const state of ['approved', 'issued'] as const) {
      await t.db.updateTable('jobs').set({ state }).where('id', '=', t.ids.job).execute();
      const before = await rowCounts(t.db);
      const res = await agent.put(url('summary')).send({ version: 0, changes: { generalCondition: 'Late addition' } });
      expect(res.status).toBe(423);
      expect(res.body.error.message).toMatch(/T-1 is (approved|issued)/);
      expect(await rowCounts(t.db)).toEqual(before);
    }
  });

  const observationWithBoard = () => ({ 'o-2': observation({ boardId: t.ids.board, circuitId: 99999 }) });
  const cases: [string, string, () => unknown, string, RegExp][] = [
    ['a field the section does not have', 'supply', () => ({ voltage: 230 }), 'voltage', /no field "voltage"/],
    ['a number as text', 'supply', () => ({ zeOhm: '0.2' }), 'zeOhm', /Ze must be a number/],
    ['a negative Ipf', 'supply', () => ({ ipfKa: -2 }), 'ipfKa', /Ipf cannot be negative/],
    ['an earthing system that does not exist', 'supply', () => ({ earthing: 'IT' }), 'earthing', /Choose one of: TN-S, TN-C-S, TT/],
    ['a date in another form', 'installation', () => ({ lastInspectionDate: '1/2/2019' }), 'lastInspectionDate', /YYYY-MM-DD/],
    ['an interval over ten years', 'summary', () => ({ nextInspectionMonths: 180 }), 'nextInspectionMonths', /At most ten years/],
    ['an inspection item that does not exist', 'inspections', () => ({ '9.9': 'ok' }), '9.9', /no inspection item 9.9/],
    ['✗ on a condition report', 'inspections', () => ({ '4.1': 'fail' }), '4.1', /C1, C2 or C3/],
    ['an observation without text', 'observations', () => ({ 'o-1': observation({ text: ' ' }) }), 'o-1.text', /Say what was observed/],
    ['an observation code that does not exist', 'observations', () => ({ 'o-1': { ...observation(), code: 'C4' } }), 'o-1.code', /Choose one of: C1, C2, C3, FI/],
    ['an observation on a board of another job', 'observations', () => ({ 'o-1': observation({ boardId: 4242 }) }), 'o-1.boardId', /not a board of this job/],
    ['an observation on a circuit not on its board', 'observations', observationWithBoard, 'o-2.circuitId', /not on board DB1/],
    ['an observation on a circuit with no board', 'observations', () => ({ 'o-1': observation({ circuitId: 1 }) }), 'o-1.boardId', /Say which board/],
    ['a limitation without its kind', 'extent', () => ({ limitations: [{ what: 'Loft', reason: 'No access' }] }), 'limitations.0.kind', /Choose one of: agreed, operational/],
  ];
  it.each(cases)('when the change has %s, then 400 in words at the field and nothing is written', async (_what, section, changes, path, message) => {
    const agent = await t.signIn('tester');
    const before = await rowCounts(t.db);
    const res = await agent.put(url(section)).send({ version: 0, changes: changes() });
    expect(res.status).toBe(400);
    expect(res.body.error.issues.find((i: { path: string }) => i.path === path)?.message).toMatch(message);
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it('when two observations would share a number, then 400 and nothing is written', async () => {
    const agent = await t.signIn('tester');
    await agent.put(url('observations')).send({ version: 0, changes: { 'o-1': observation() } });
    const before = await rowCounts(t.db);
    const res = await agent.put(url('observations')).send({ version: 1, changes: { 'o-2': observation({ text: 'Another' }) } });
    expect(res.status).toBe(400);
    expect(res.body.error.issues).toEqual([{ path: 'o-2.number', message: 'Observation 1 already exists; give this one another number.' }]);
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it('when the section does not belong to the kind of job, or does not exist, or the body is wrong, then 400 in words and nothing is written', async () => {
    const agent = await t.signIn('tester');
    const before = await rowCounts(t.db);
    const work = await agent.put(url('work')).send({ version: 0, changes: { description: 'New kitchen circuits' } });
    expect(work.status).toBe(400);
    expect(work.body.error.message).toMatch(/An EICR has no work covered section/);
    const eic = (await agent.post('/api/jobs').send({ siteId: t.ids.site, kind: 'EIC', visitDate: '2026-12-03' })).body.job.id as number;
    const beforeEic = await rowCounts(t.db);
    const obs = await agent.put(url('observations', eic)).send({ version: 0, changes: { 'o-1': observation() } });
    expect(obs.status).toBe(400);
    expect(obs.body.error.message).toMatch(/An EIC has no observations section/);
    const codedOnEic = await agent.put(url('inspections', eic)).send({ version: 0, changes: { '4.1': 'C2' } });
    expect(codedOnEic.status).toBe(400);
    expect(codedOnEic.body.error.issues[0].message).toMatch(/C2 belongs to a condition report/);
    expect(await rowCounts(t.db)).toEqual(beforeEic);
    const nowhere = await agent.put(url('appendix')).send({ version: 0, changes: { a: 1 } });
    expect(nowhere.status).toBe(400);
    expect(nowhere.body.error.message).toMatch(/no section "appendix"/);
    const noVersion = await agent.put(url('summary')).send({ changes: { generalCondition: 'x' } });
    expect(noVersion.status).toBe(400);
    expect(noVersion.body.error.message).toMatch(/Give the version of the section/);
    const nothing = await agent.put(url('summary')).send({ version: 0, changes: {} });
    expect(nothing.status).toBe(400);
    expect(nothing.body.error.message).toMatch(/Nothing to change/);
    expect((await agent.put(url('summary', 999)).send({ version: 0, changes: { generalCondition: 'x' } })).status).toBe(404);
    expect(await rowCounts(t.db)).toEqual({ ...before, jobs: before.jobs! + 1, job_history: before.job_history! + 1 });
  });
});
