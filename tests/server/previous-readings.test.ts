import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';

/**
 * A board started from an earlier job: each circuit linked to the same circuit last time
 * (`circuits.previous_circuit_id`) carries that circuit's readings, and the checker compares
 * them. Thresholds: Zs risen by more than a fifth — common practice.
 */

let t: TestApp;
let board: number;
let lights: number;
let earlierLights: number;
beforeEach(async () => {
  t = await createTestApp();
  board = t.ids.board;
  const ids = await t.db.selectFrom('circuits').select('id').where('board_id', '=', board).orderBy('position').execute();
  lights = ids[1]!.id;
  // An earlier report on the same site, with its own board and the lighting circuit's readings.
  const earlierJob = (
    await t.db.insertInto('jobs').values({ site_id: t.ids.site, kind: 'EICR', reference: 'T-0', visit_date: '2021-06-14' }).returning('id').executeTakeFirstOrThrow()
  ).id;
  const earlierBoard = (
    await t.db.insertInto('boards').values({ job_id: earlierJob, reference: 'DB1', phases: 1, zdb_ohm: 0.24, ipf_ka: 1.5, locked_by: null, locked_at: null }).returning('id').executeTakeFirstOrThrow()
  ).id;
  earlierLights = (
    await t.db
      .insertInto('circuits')
      .values({ board_id: earlierBoard, position: 1, number: '2', description: 'Lights', kind: 'radial', phase: null, points: 6, live_csa_mm2: 1.5, cpc_csa_mm2: 1.0, max_disconnection_s: 0.4, rating_a: 6, breaking_ka: 6, rcd_type: null, rcd_rated_residual_ma: null, afdd: null, spur_ring_id: null, spur_origin_point: null, spur_length_m: null })
      .returning('id')
      .executeTakeFirstOrThrow()
  ).id;
  const at = '2021-06-14T10:00:00.000Z';
  await t.db
    .insertInto('cells')
    .values([
      { circuit_id: earlierLights, column_key: 'zs', text: '0.80', reason: null, version: 1, updated_by: null, updated_at: at },
      { circuit_id: earlierLights, column_key: 'irLiveEarth', text: '>200', reason: null, version: 1, updated_by: null, updated_at: at },
    ])
    .execute();
  await t.db.updateTable('circuits').set({ previous_circuit_id: earlierLights }).where('id', '=', lights).execute();
});
afterEach(() => t.close());

describe('GET /api/boards/:boardId on a board started from an earlier job', () => {
  it('when a circuit has a previous circuit, then its readings last time come with the board and its job', async () => {
    const res = await (await t.signIn('tester')).get(`/api/boards/${board}`);
    expect(res.status).toBe(200);
    expect(res.body.previousReadings).toEqual([
      {
        circuitId: lights,
        job: { id: expect.any(Number), kind: 'EICR', reference: 'T-0', visitDate: '2021-06-14' },
        cells: { zs: { text: '0.80', reason: null }, irLiveEarth: { text: '>200', reason: null } },
      },
    ]);
  });

  it('when Zs has risen by more than a fifth since, then the save answers a note on that cell, and the board carries it', async () => {
    const agent = await t.signIn('tester');
    // 0.80 × 1.2 = 0.96 Ω: 1.02 is above it (common practice: more than a fifth)
    const put = await agent.put(`/api/boards/${board}/circuits/${lights}/cells/zs`).send({ text: '1.02', version: 0 });
    expect(put.status).toBe(200);
    const note = put.body.findings.find((f: { code: string }) => f.code === 'zs-risen-since-last-time');
    expect(note).toMatchObject({ severity: 'note', circuitId: lights, columns: ['zs'], limit: expect.stringContaining('≤ 0.96 Ω') });
    const detail = await agent.get(`/api/boards/${board}`);
    expect(detail.body.findings.map((f: { code: string }) => f.code)).toContain('zs-risen-since-last-time');
  });

  it('when Zs is within a fifth of last time, then no note', async () => {
    const agent = await t.signIn('tester');
    const put = await agent.put(`/api/boards/${board}/circuits/${lights}/cells/zs`).send({ text: '0.95', version: 0 });
    expect(put.body.findings.map((f: { code: string }) => f.code)).not.toContain('zs-risen-since-last-time');
  });

  it('when no circuit has a previous circuit, then the list is empty', async () => {
    await t.db.updateTable('circuits').set({ previous_circuit_id: null }).where('id', '=', lights).execute();
    const res = await (await t.signIn('tester')).get(`/api/boards/${board}`);
    expect(res.body.previousReadings).toEqual([]);
  });
});
