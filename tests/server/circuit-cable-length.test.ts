import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { boardDetailResponseSchema } from '../../shared/schemas/boards.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';

let t: TestApp;
let board: number;
let lights: number;
beforeEach(async () => {
  t = await createTestApp();
  board = t.ids.board;
  const ids = await t.db.selectFrom('circuits').select('id').orderBy('position').execute();
  lights = ids[1]!.id; // radial, 1.5/1.5 on a B6
});
afterEach(() => t.close());

describe('a radial circuit with its cable length', () => {
  it('when the length is written, then it is kept and returned, and R1+R2 is judged against it', async () => {
    const tester = await t.signIn('tester');
    const patched = await tester.patch(`/api/boards/${board}/circuits/${lights}`).send({ version: 1, changes: { cableLengthM: 20 } });
    expect(patched.status).toBe(200);
    expect(patched.body.circuit.cableLengthM).toBe(20);

    // 20 m × (12.1 + 12.1) mΩ/m = 0.484 Ω at 20 °C, × 1.20 = 0.581 Ω at 70 °C (IEC 60228 Table 2; IET GN3 [from memory]);
    // allowance 15 % of 0.484 = 0.073 Ω — common practice: 0.41–0.65 Ω. 0.90 Ω is outside.
    const put = await tester.put(`/api/boards/${board}/circuits/${lights}/cells/r1PlusR2`).send({ text: '0.90', version: 0 });
    expect(put.status).toBe(200);
    const lengthFinding = put.body.findings.find((f: { code: string }) => f.code === 'radial-r1r2-vs-length');
    expect(lengthFinding).toMatchObject({ severity: 'warning', circuitId: lights, limit: '0.41–0.65 Ω' });

    const detail = await tester.get(`/api/boards/${board}`);
    const parsed = boardDetailResponseSchema.parse(detail.body);
    expect(parsed.circuits.find((c) => c.id === lights)?.cableLengthM).toBe(20);
    // Readings not yet recorded come back as "todo", which the response schema knows.
    expect(parsed.findings.some((f) => f.severity === 'todo' && f.code === 'cells-missing')).toBe(true);
  });

  it('when the length is not a positive number, then 400 and nothing changes', async () => {
    const tester = await t.signIn('tester');
    const res = await tester.patch(`/api/boards/${board}/circuits/${lights}`).send({ version: 1, changes: { cableLengthM: -3 } });
    expect(res.status).toBe(400);
    const row = await t.db.selectFrom('circuits').select('cable_length_m').where('id', '=', lights).executeTakeFirstOrThrow();
    expect(row.cable_length_m).toBeNull();
  });
});

describe('values a TT installation needs', () => {
  it('when a board on TT has Zdb 150 Ω, then it is accepted (the electrode is in the loop; 50 V / 30 mA = 1667 Ω, BS 7671:2018 411.5.3 [from memory])', async () => {
    const tester = await t.signIn('tester');
    const res = await tester.patch(`/api/boards/${board}`).send({ version: 1, changes: { zdbOhm: 150 } });
    expect(res.status).toBe(200);
    expect(res.body.board.zdbOhm).toBe(150);
  });

  it('when the optional RCD test at 5 × IΔn is written, then it is kept and checked against 40 ms (BS EN 61008-1 / 61009-1)', async () => {
    const tester = await t.signIn('tester');
    const res = await tester.put(`/api/boards/${board}/circuits/${lights}/cells/rcdTime5Ms`).send({ text: '46', version: 0 });
    expect(res.status).toBe(200);
    expect(res.body.findings.find((f: { code: string }) => f.code === 'rcd-5x-over-limit')).toMatchObject({ severity: 'error', limit: '≤ 40 ms' });
  });
});
