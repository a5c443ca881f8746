import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../helpers/test-app.ts';
import { completeBoard, completeEicrRecord, writeCells, writeRecord } from './review-fixture.ts';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
  await completeBoard(t);
  // 1.50 Ω on a B32: over its 1.37 Ω maximum (BS 7671:2018 Table 41.3) — an error finding.
  await writeCells(t, t.ids.board, { '1': { zs: '1.50' } });
});
afterEach(() => t.close());

const url = () => `/api/jobs/${t.ids.job}/acceptances`;

async function findingOf(code: string) {
  const res = await (await t.signIn('reviewer')).get(`/api/review/jobs/${t.ids.job}`);
  return res.body.boards[0].findings.find((f: { code: string }) => f.code === code) as { key: string; acceptable: true | string; acceptance: unknown };
}

describe('POST /api/jobs/:jobId/acceptances', () => {
  it('when a reviewer accepts an error finding with a reason, then it stays visible, marked accepted with who and why, and the history has it', async () => {
    const zs = await findingOf('zs-over-max');
    const reviewer = await t.signIn('reviewer');
    const res = await reviewer.post(url()).send({ boardId: t.ids.board, findingKey: zs.key, reason: 'Recorded as observation 2, C2' });
    expect(res.status).toBe(201);
    expect(res.body.acceptance).toMatchObject({ boardId: t.ids.board, findingKey: zs.key, code: 'zs-over-max', reason: 'Recorded as observation 2, C2', acceptedBy: { name: 'Rhea Reviewer' } });
    expect(res.body.acceptance.message).toMatch(/1\.37/);

    const after = await findingOf('zs-over-max');
    expect(after.acceptance).toMatchObject({ reason: 'Recorded as observation 2, C2', acceptedBy: { name: 'Rhea Reviewer' } });
    const list = await (await t.signIn('tester')).get(url());
    expect(list.body.acceptances).toHaveLength(1);
    const history = await t.db.selectFrom('job_history').selectAll().where('job_id', '=', t.ids.job).execute();
    expect(history).toEqual([expect.objectContaining({ action: 'finding-accepted', field: zs.key, reason: 'Recorded as observation 2, C2', user_id: t.ids.reviewer })]);
    // The same finding twice: 409.
    expect((await reviewer.post(url()).send({ boardId: t.ids.board, findingKey: zs.key, reason: 'Recorded as observation 2, C2' })).status).toBe(409);
  });

  it('when a tester tries, then 403; when the reason is too short, then 400; and nothing is stored', async () => {
    const zs = await findingOf('zs-over-max');
    const tester = await t.signIn('tester');
    expect((await tester.post(url()).send({ boardId: t.ids.board, findingKey: zs.key, reason: 'Recorded as observation 2, C2' })).status).toBe(403);
    const short = await (await t.signIn('reviewer')).post(url()).send({ boardId: t.ids.board, findingKey: zs.key, reason: 'ok' });
    expect(short.status).toBe(400);
    expect(short.body.error.issues[0]).toMatchObject({ path: 'reason', message: expect.stringMatching(/Say why in words/) });
    expect(await t.db.selectFrom('finding_acceptances').selectAll().execute()).toEqual([]);
  });

  it('when the finding is not an error (a warning, a missing reading, a LIM without reason), then 400', async () => {
    // 1.20 Ω on a B32 is under 1.37 but over 0.8 × 1.37 = 1.10 (IET Guidance Note 3 rule of thumb [memory]): a warning.
    await writeCells(t, t.ids.board, { '1': { zs: '1.20' }, '2': { zs: { text: 'LIM', reason: null } }, '3': { zs: '' } });
    const reviewer = await t.signIn('reviewer');
    for (const code of ['zs-over-80-percent', 'lim-without-reason', 'cells-missing']) {
      const f = await findingOf(code);
      expect(f, code).toBeDefined();
      expect(f.acceptable).not.toBe(true);
      const res = await reviewer.post(url()).send({ boardId: t.ids.board, findingKey: f.key, reason: 'Reviewer is content with this' });
      expect(res.status, code).toBe(400);
    }
  });

  it('when the finding is not (or no longer) there, then 409; a board of another job, then 400', async () => {
    const reviewer = await t.signIn('reviewer');
    expect((await reviewer.post(url()).send({ boardId: t.ids.board, findingKey: `${t.ids.board}:1:zs-over-max:r1PlusR2`, reason: 'Recorded as observation 2, C2' })).status).toBe(409);
    const otherJob = (await t.db.insertInto('jobs').values({ site_id: t.ids.site, kind: 'EIC', reference: 'T-2', visit_date: '2026-12-02' }).returning('id').executeTakeFirstOrThrow()).id;
    const res = await reviewer.post(`/api/jobs/${otherJob}/acceptances`).send({ boardId: t.ids.board, findingKey: 'x', reason: 'Recorded as observation 2, C2' });
    expect(res.status).toBe(400);
  });

  it('when a job finding (no board) is an error, then it can be accepted with boardId null', async () => {
    const record = completeEicrRecord();
    record.inspections['5.4'] = 'C2';
    await writeRecord(t, record);
    const reviewer = await t.signIn('reviewer');
    const review = await reviewer.get(`/api/review/jobs/${t.ids.job}`);
    const f = review.body.jobFindings.find((x: { code: string }) => x.code === 'inspection-coded-without-observation');
    const res = await reviewer.post(url()).send({ boardId: null, findingKey: f.key, reason: 'Observation written on the paper copy, to be typed' });
    expect(res.status).toBe(201);
    const gate = await reviewer.get(`/api/jobs/${t.ids.job}/gate`);
    expect(gate.body.reasons.some((r: string) => /5\.4.*neither resolved nor accepted/.test(r))).toBe(false);
  });

  it('when the job is approved, then accepting answers 423', async () => {
    const zs = await findingOf('zs-over-max');
    await t.db.updateTable('jobs').set({ state: 'approved' }).execute();
    const res = await (await t.signIn('reviewer')).post(url()).send({ boardId: t.ids.board, findingKey: zs.key, reason: 'Recorded as observation 2, C2' });
    expect(res.status).toBe(423);
  });
});

describe('DELETE /api/jobs/:jobId/acceptances/:id', () => {
  it('when withdrawn, then the finding is open again and the history keeps what was withdrawn; on a locked board, 423 first', async () => {
    const zs = await findingOf('zs-over-max');
    const reviewer = await t.signIn('reviewer');
    const { body } = await reviewer.post(url()).send({ boardId: t.ids.board, findingKey: zs.key, reason: 'Recorded as observation 2, C2' });
    await reviewer.post(`/api/boards/${t.ids.board}/lock`).expect(200);
    const refused = await reviewer.delete(`${url()}/${body.acceptance.id}`);
    expect(refused.status).toBe(423);
    await reviewer.post(`/api/boards/${t.ids.board}/unlock`).send({ reason: 'Acceptance to be reconsidered' }).expect(200);
    expect((await (await t.signIn('tester')).delete(`${url()}/${body.acceptance.id}`)).status).toBe(403);
    expect((await reviewer.delete(`${url()}/${body.acceptance.id}`)).status).toBe(204);
    expect((await findingOf('zs-over-max')).acceptance).toBeNull();
    const history = await t.db.selectFrom('job_history').select(['action', 'old_text']).where('job_id', '=', t.ids.job).orderBy('id').execute();
    expect(history.map((h) => h.action)).toEqual(['finding-accepted', 'finding-acceptance-withdrawn']);
    expect(JSON.parse(history[1]!.old_text!)).toMatchObject({ reason: 'Recorded as observation 2, C2' });
    expect((await reviewer.delete(`${url()}/${body.acceptance.id}`)).status).toBe(404);
  });
});

describe('GET /api/review/queue', () => {
  it('when jobs are ready, then they come oldest submission first with their counts; jobs being entered are not there', async () => {
    const second = (await t.db.insertInto('jobs').values({ site_id: t.ids.site, kind: 'EIC', reference: 'T-2', visit_date: '2026-12-02' }).returning('id').executeTakeFirstOrThrow()).id;
    const third = (await t.db.insertInto('jobs').values({ site_id: t.ids.site, kind: 'EIC', reference: 'T-3', visit_date: '2026-12-02' }).returning('id').executeTakeFirstOrThrow()).id;
    const tester = await t.signIn('tester');
    await tester.post(`/api/jobs/${second}/submit`).send({ note: 'First in' }).expect(200);
    await new Promise((r) => setTimeout(r, 5));
    await tester.post(`/api/jobs/${t.ids.job}/submit`).send({ note: 'Second in' }).expect(200);
    const res = await (await t.signIn('reviewer')).get('/api/review/queue');
    expect(res.status).toBe(200);
    expect(res.body.jobs.map((j: { job: { reference: string } }) => j.job.reference)).toEqual(['T-2', 'T-1']);
    expect(res.body.jobs.some((j: { job: { id: number } }) => j.job.id === third)).toBe(false);
    const t1 = res.body.jobs[1];
    expect(t1.submitted).toMatchObject({ by: { name: 'Tom Tester' }, note: 'Second in' });
    // Two open errors: Zs over its maximum on circuit 1, and the job rule asking for the C1 or C2
    // observation such a Zs needs on a condition report; no reading missing on the complete board.
    expect(t1.counts).toMatchObject({ errors: 2, accepted: 0, missingReadings: 0 });
    expect(t1).toMatchObject({ boardCount: 1, lockedBoards: 0 });
  });
});
