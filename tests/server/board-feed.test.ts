import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { boardChangesResponseSchema } from '../../shared/schemas/boards.ts';
import { appendHistory } from '../../server/db/history.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';

// The live feed sends what changed since a cursor. Duplicate circuit numbers are a rule that
// compares circuits (a finding on a circuit nobody touched can appear or go): common practice,
// each way of a board has its own number.

let t: TestApp;
let ids: number[];
beforeEach(async () => {
  t = await createTestApp();
  ids = (await t.db.selectFrom('circuits').select('id').orderBy('position').execute()).map((r) => r.id);
});
afterEach(() => t.close());

const feed = async (agent: Awaited<ReturnType<TestApp['signIn']>>, after: number) =>
  boardChangesResponseSchema.parse((await agent.get(`/api/boards/${t.ids.board}/changes?after=${after}`)).body);

describe('GET /changes', () => {
  it('when nothing changed since the cursor, then it answers no circuits, no findings and the same cursor', async () => {
    const viewer = await t.signIn('reviewer');
    const { cursor } = (await viewer.get(`/api/boards/${t.ids.board}`)).body;
    const idle = await feed(viewer, cursor);
    expect(idle).toMatchObject({ cursor, circuits: [], findings: [], findingsCircuits: [], order: ids });
  });

  it('when one circuit is renumbered onto another’s number and back, then each feed carries the findings of both circuits, including a circuit left with none of that kind', async () => {
    const typist = await t.signIn('tester');
    const viewer = await t.signIn('reviewer');
    const start = (await viewer.get(`/api/boards/${t.ids.board}`)).body;
    const circuit3 = start.circuits[2];
    const dup = await typist.patch(`/api/boards/${t.ids.board}/circuits/${ids[2]}`).send({ version: circuit3.version, changes: { number: '2' } });
    expect(dup.status).toBe(200);
    const first = await feed(viewer, start.cursor);
    expect(first.circuits.map((c) => c.id)).toEqual([ids[2]]);
    // Circuit 2 was not touched, but it now shares its number: its findings come too.
    expect(first.findingsCircuits).toEqual(expect.arrayContaining([ids[1], ids[2]]));
    expect(first.findings.filter((f) => f.code === 'circuit-number-duplicate').map((f) => f.circuitId).sort()).toEqual([ids[1], ids[2]].sort());

    await typist.patch(`/api/boards/${t.ids.board}/circuits/${ids[2]}`).send({ version: dup.body.circuit.version, changes: { number: '3' } });
    const second = await feed(viewer, first.cursor);
    expect(second.findingsCircuits).toEqual(expect.arrayContaining([ids[1], ids[2]]));
    expect(second.findings.filter((f) => f.code === 'circuit-number-duplicate')).toEqual([]);
    // Circuit 1 did not change in either step: its findings are not resent.
    expect(second.findingsCircuits).not.toContain(ids[0]);
  });

  it('when a change is written behind the routes’ back with its history row, or a board detail without one, then the board as served shows it', async () => {
    const viewer = await t.signIn('reviewer');
    const before = (await viewer.get(`/api/boards/${t.ids.board}`)).body;
    await t.db.insertInto('cells').values({ circuit_id: ids[1]!, column_key: 'zs', text: '1.05', reason: null, version: 1, updated_by: t.ids.tester, updated_at: '2026-12-02T09:00:00Z' }).execute();
    await appendHistory(t.db, { board_id: t.ids.board, circuit_id: ids[1]!, column_key: 'zs', action: 'cell', old_text: null, new_text: '1.05', user_id: t.ids.tester, how: 'imported', version: 1 });
    await t.db.updateTable('boards').set({ zdb_ohm: 0.31 }).where('id', '=', t.ids.board).execute();
    const after = (await viewer.get(`/api/boards/${t.ids.board}`)).body;
    expect(after.circuits[1].cells.zs.text).toBe('1.05');
    expect(after.board.zdbOhm).toBe(0.31);
    expect(after.cursor).toBeGreaterThan(before.cursor);
  });

  it('when several typists save at the same moment, then each answer carries the findings of its own reading', async () => {
    // A B6 type B breaker: maximum Zs 7.28 Ω at 0.4 s (BS 7671:2018+A2 Table 41.3 [memory]); 9.99 Ω is over on any reading of it.
    const agents = await Promise.all([t.signIn('tester'), t.signIn('tester2'), t.signIn('reviewer')]);
    const answers = await Promise.all(
      [ids[1]!, ids[2]!].map((id, i) => agents[i]!.put(`/api/boards/${t.ids.board}/circuits/${id}/cells/zs`).send({ text: '9.99', version: 0 })),
    );
    for (const [i, answer] of answers.entries()) {
      expect(answer.status).toBe(200);
      expect(answer.body.findings.filter((f: { code: string }) => f.code === 'zs-over-max').map((f: { circuitId: number }) => f.circuitId)).toEqual([[ids[1], ids[2]][i]]);
    }
  });
});
