import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../helpers/test-app.ts';
import { completeBoard, completeEicrRecord, writeRecord } from './review-fixture.ts';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => t.close());

type State = 'entering' | 'ready' | 'approved' | 'issued';
type Role = 'tester' | 'reviewer' | 'admin';
type Action = 'submit' | 'approve' | 'send-back';

/** A job whose gate passes: every board locked, the record complete. */
async function makeApprovable() {
  await completeBoard(t);
  await t.db.updateTable('boards').set({ state: 'locked', locked_by: t.ids.reviewer, locked_at: '2026-12-01T12:00:00.000Z' }).execute();
  await writeRecord(t, completeEicrRecord());
}

const setState = (state: State) => t.db.updateTable('jobs').set({ state }).where('id', '=', t.ids.job).execute();
const bodyFor = (action: Action) => (action === 'send-back' ? { reason: 'Zs of circuit 2 to be measured again' } : { note: 'All boards typed up' });

/**
 * Every transition by every role, written out by hand from the design (issue 8): anyone submits
 * a job being entered; only a reviewer or an admin approves a ready job or sends a ready or
 * approved job back; issuing and reopening are not these routes. 403 for the wrong role comes
 * before 409 for the wrong state.
 */
const expected: Record<Action, Record<Role, Record<State, 200 | 403 | 409>>> = {
  submit: {
    tester: { entering: 200, ready: 409, approved: 409, issued: 409 },
    reviewer: { entering: 200, ready: 409, approved: 409, issued: 409 },
    admin: { entering: 200, ready: 409, approved: 409, issued: 409 },
  },
  approve: {
    tester: { entering: 403, ready: 403, approved: 403, issued: 403 },
    reviewer: { entering: 409, ready: 200, approved: 409, issued: 409 },
    admin: { entering: 409, ready: 200, approved: 409, issued: 409 },
  },
  'send-back': {
    tester: { entering: 403, ready: 403, approved: 403, issued: 403 },
    reviewer: { entering: 409, ready: 200, approved: 200, issued: 409 },
    admin: { entering: 409, ready: 200, approved: 200, issued: 409 },
  },
};
const after: Record<Action, State> = { submit: 'ready', approve: 'approved', 'send-back': 'entering' };

describe('job states: every transition by every role', () => {
  const cases = (Object.keys(expected) as Action[]).flatMap((action) =>
    (Object.keys(expected[action]) as Role[]).flatMap((role) =>
      (Object.keys(expected[action][role]) as State[]).map((state) => ({ action, role, state, status: expected[action][role][state] })),
    ),
  );
  it.each(cases)('when a $role does $action on a job $state, then $status', async ({ action, role, state, status }) => {
    await makeApprovable();
    await setState(state);
    const agent = await t.signIn(role);
    const res = await agent.post(`/api/jobs/${t.ids.job}/${action}`).send(bodyFor(action));
    expect(res.status).toBe(status);
    const job = await t.db.selectFrom('jobs').select(['state', 'version']).where('id', '=', t.ids.job).executeTakeFirstOrThrow();
    const history = await t.db.selectFrom('job_history').selectAll().where('job_id', '=', t.ids.job).execute();
    if (status === 200) {
      expect(res.body.job.state).toBe(after[action]);
      expect(job.state).toBe(after[action]);
      expect(history).toHaveLength(1);
      expect(history[0]).toMatchObject({ action: 'state', old_text: JSON.stringify(state), new_text: JSON.stringify(after[action]), user_id: t.ids[role] });
    } else {
      expect(res.body.error.message.length).toBeGreaterThan(10);
      expect(job.state).toBe(state);
      expect(history).toHaveLength(0);
    }
  });
});

describe('POST /api/jobs/:jobId/submit, /approve, /send-back', () => {
  it('when a tester submits with a note, then the job is ready and the history keeps who, when and the note', async () => {
    const tester = await t.signIn('tester');
    const res = await tester.post(`/api/jobs/${t.ids.job}/submit`).send({ note: 'Board DB1 typed from the paper sheets' });
    expect(res.status).toBe(200);
    expect(res.body.job).toMatchObject({ state: 'ready', version: 2 });
    const [entry] = await t.db.selectFrom('job_history').selectAll().where('job_id', '=', t.ids.job).execute();
    expect(entry).toMatchObject({ action: 'state', reason: 'Board DB1 typed from the paper sheets', user_id: t.ids.tester });
    expect(Date.parse(entry!.at)).not.toBeNaN();
  });

  it('when a reviewer approves a job whose gate fails, then 409 lists every reason and the job stays ready', async () => {
    await setState('ready');
    const reviewer = await t.signIn('reviewer');
    const res = await reviewer.post(`/api/jobs/${t.ids.job}/approve`).send({});
    expect(res.status).toBe(409);
    const reasons: string[] = res.body.error.details.reasons;
    expect(reasons).toContain('Board DB1 is not locked.');
    expect(reasons.some((r) => r.startsWith('Supply characteristics:'))).toBe(true);
    expect(reasons.some((r) => r.startsWith('Declaration: the inspector'))).toBe(true);
    const gate = await reviewer.get(`/api/jobs/${t.ids.job}/gate`);
    expect(gate.body).toMatchObject({ canApprove: false, reasons });
    expect(gate.body.boards[0]).toMatchObject({ reference: 'DB1', canLock: false });
    expect((await t.db.selectFrom('jobs').select('state').executeTakeFirstOrThrow()).state).toBe('ready');
  });

  it('when sending back without a reason, then 400 and nothing changes', async () => {
    await setState('ready');
    const reviewer = await t.signIn('reviewer');
    const res = await reviewer.post(`/api/jobs/${t.ids.job}/send-back`).send({ reason: 'no' });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].message).toMatch(/Say why the job is sent back/);
    expect((await t.db.selectFrom('jobs').select('state').executeTakeFirstOrThrow()).state).toBe('ready');
  });

  it('when the job does not exist, then 404', async () => {
    expect((await (await t.signIn('tester')).post('/api/jobs/999/submit').send({})).status).toBe(404);
  });
});

describe('an approved or issued job refuses writes to its boards (423)', () => {
  for (const state of ['approved', 'issued'] as const) {
    it(`when the job is ${state}, then cell, circuit, board and lock writes answer 423 and change nothing`, async () => {
      await setState(state);
      const reviewer = await t.signIn('reviewer');
      const circuit = (await t.db.selectFrom('circuits').select('id').orderBy('position').executeTakeFirstOrThrow()).id;
      const base = `/api/boards/${t.ids.board}`;
      const writes = [
        reviewer.put(`${base}/circuits/${circuit}/cells/zs`).send({ text: '0.44', version: 0 }),
        reviewer.post(`${base}/circuits`).send({ number: '4' }),
        reviewer.patch(`${base}/circuits/${circuit}`).send({ version: 1, changes: { description: 'Kitchen' } }),
        reviewer.delete(`${base}/circuits/${circuit}`),
        reviewer.patch(base).send({ version: 1, changes: { location: 'Hall' } }),
        reviewer.post(`${base}/lock`),
      ];
      for (const res of await Promise.all(writes)) {
        expect(res.status).toBe(423);
        expect(res.body.error.message).toMatch(new RegExp(`Job T-1 is ${state}`));
      }
      expect(await t.db.selectFrom('cells').selectAll().execute()).toEqual([]);
      expect(await t.db.selectFrom('circuits').select('id').execute()).toHaveLength(3);
    });
  }

  it('when an approved job is sent back, then its boards take writes again', async () => {
    await setState('approved');
    const reviewer = await t.signIn('reviewer');
    await reviewer.post(`/api/jobs/${t.ids.job}/send-back`).send({ reason: 'Client asked for the garage circuit to be added' });
    const circuit = (await t.db.selectFrom('circuits').select('id').orderBy('position').executeTakeFirstOrThrow()).id;
    expect((await reviewer.put(`/api/boards/${t.ids.board}/circuits/${circuit}/cells/zs`).send({ text: '0.44', version: 0 })).status).toBe(200);
  });
});
