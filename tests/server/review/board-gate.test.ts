import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../helpers/test-app.ts';
import { completeBoard, writeCells } from './review-fixture.ts';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => t.close());

const lockUrl = () => `/api/boards/${t.ids.board}/lock`;

describe('POST /api/boards/:boardId/lock — the board gate', () => {
  it('when readings are missing, then 409 with one reason per column naming the circuits, and the board stays open', async () => {
    // Only circuit 1 tested; circuits 2 and 3 have nothing recorded yet.
    await writeCells(t, t.ids.board, { '1': { ringR1: '0.30', ringRn: '0.30', ringR2: '0.49', r1PlusR2: '0.20', irTestVoltage: '500', irLiveLive: '>200', irLiveEarth: '>200', polarity: '✓', zs: '0.44', rcdTimeMs: '25', rcdButton: '✓' } });
    const reviewer = await t.signIn('reviewer');
    const res = await reviewer.post(lockUrl());
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('conflict');
    const reasons: string[] = res.body.error.details.reasons;
    // A radial needs R1+R2 (or R2), IR and Zs recorded (common practice: the schedule's columns for a radial).
    expect(reasons).toContain('R1+R2 not recorded on circuits 2, 3.');
    expect(reasons).toContain('Zs not recorded on circuits 2, 3.');
    // An RCD-protected circuit needs its operating time at IΔn (BS 7671:2018+A2 643.7).
    expect(reasons.some((r) => /circuits 2, 3/.test(r) && /Time|RCD/.test(r))).toBe(true);
    expect(reasons.every((r) => !/circuit 1\b|circuits 1/.test(r))).toBe(true);
    const board = await reviewer.get(`/api/boards/${t.ids.board}`);
    expect(board.body.board.state).toBe('open');
  });

  it('when a LIM has no reason, then 409 says so; with its reason, the board locks', async () => {
    await completeBoard(t);
    await writeCells(t, t.ids.board, { '3': { zs: { text: 'LIM', reason: null } } });
    const reviewer = await t.signIn('reviewer');
    const refused = await reviewer.post(lockUrl());
    expect(refused.status).toBe(409);
    // A limitation is recorded with its reason (common practice; the model forms ask for it).
    expect(refused.body.error.details.reasons).toEqual(['Circuit 3: LIM in Zs has no reason recorded.']);
    await writeCells(t, t.ids.board, { '3': { zs: { text: 'LIM', reason: 'Luminaire sealed, no access to terminals' } } });
    expect((await reviewer.post(lockUrl())).status).toBe(200);
  });

  it('when an error finding is open, then 409 names it; once accepted with a reason, the board locks', async () => {
    await completeBoard(t);
    // 1.50 Ω on a B32: over the 1.37 Ω maximum (BS 7671:2018 Table 41.3, 0.95 × 230 / 160 A).
    await writeCells(t, t.ids.board, { '1': { zs: '1.50' } });
    const reviewer = await t.signIn('reviewer');
    const refused = await reviewer.post(lockUrl());
    expect(refused.status).toBe(409);
    expect(refused.body.error.details.reasons).toHaveLength(1);
    expect(refused.body.error.details.reasons[0]).toMatch(/^Circuit 1: .*1\.37.*neither resolved nor accepted/);

    const review = await reviewer.get(`/api/review/jobs/${t.ids.job}`);
    const zs = review.body.boards[0].findings.find((f: { code: string }) => f.code === 'zs-over-max');
    expect(zs.acceptable).toBe(true);
    const accepted = await reviewer
      .post(`/api/jobs/${t.ids.job}/acceptances`)
      .send({ boardId: t.ids.board, findingKey: zs.key, reason: 'Recorded as observation 2, C2; client informed on site.' });
    expect(accepted.status).toBe(201);
    const locked = await reviewer.post(lockUrl());
    expect(locked.status).toBe(200);
    expect(locked.body.board.state).toBe('locked');
  });

  it('when the board is complete, then GET /gate answers canLock with no reasons, the same as the lock route', async () => {
    await completeBoard(t);
    const tester = await t.signIn('tester');
    const gate = await tester.get(`/api/boards/${t.ids.board}/gate`);
    expect(gate.status).toBe(200);
    expect(gate.body.gate).toEqual({ boardId: t.ids.board, reference: 'DB1', state: 'open', canLock: true, reasons: [] });
    expect((await (await t.signIn('admin')).post(lockUrl())).status).toBe(200);
  });

  it('when the board has no readings at all, then GET /gate lists the same reasons the lock answers', async () => {
    const reviewer = await t.signIn('reviewer');
    const gate = await reviewer.get(`/api/boards/${t.ids.board}/gate`);
    const refused = await reviewer.post(lockUrl());
    expect(gate.body.gate.canLock).toBe(false);
    expect(refused.body.error.details.reasons).toEqual(gate.body.gate.reasons);
    expect((await reviewer.get('/api/boards/999/gate')).status).toBe(404);
  });
});
