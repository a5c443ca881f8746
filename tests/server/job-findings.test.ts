import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { jobDetailResponseSchema } from '../../shared/schemas/jobs.ts';
import type { Finding } from '../../shared/schemas/findings.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';

/**
 * The job rules reach the job's answers: what a tester writes in the record is checked against
 * the record and the job's boards. The fixture board DB1 has Zdb 0.25 Ω and Ipf 1.5 kA; its ring
 * is on a B32 (maximum Zs 1.37 Ω at 0.4 s, BS 7671:2018 Table 41.3).
 */

let t: TestApp;
let ring: number;
beforeEach(async () => {
  t = await createTestApp();
  ring = (await t.db.selectFrom('circuits').select('id').where('board_id', '=', t.ids.board).orderBy('position').executeTakeFirstOrThrow()).id;
});
afterEach(() => t.close());

const url = (section: string) => `/api/jobs/${t.ids.job}/record/${section}`;
const codes = (findings: readonly Finding[]) => findings.map((f) => f.code);

async function jobFindings(agent: Awaited<ReturnType<TestApp['signIn']>>): Promise<Finding[]> {
  const res = await agent.get(`/api/jobs/${t.ids.job}`);
  expect(res.status).toBe(200);
  return jobDetailResponseSchema.parse(res.body).findings;
}

describe('job findings from the job rules', () => {
  it('when Ze and Ipf at the origin are written, then a board below Ze and above the origin’s Ipf is named in the answer', async () => {
    const agent = await t.signIn('tester');
    const res = await agent.put(url('supply')).send({ version: 0, changes: { earthing: 'TN-C-S', zeOhm: 0.35, ipfKa: 1.2 } });
    expect(res.status).toBe(200);
    const findings: Finding[] = res.body.findings;
    // common practice: Zdb ≥ Ze less max(0.05 Ω, 10 %) = 0.30 Ω; Ipf ≤ 1.2 + max(0.05, 10 %) = 1.32 kA
    expect(findings.find((f) => f.code === 'zdb-below-ze')).toMatchObject({ boardId: t.ids.board, section: 'supply', limit: expect.stringContaining('≥ 0.30 Ω') });
    expect(findings.find((f) => f.code === 'board-ipf-above-origin')).toMatchObject({ boardId: t.ids.board, limit: expect.stringContaining('≤ 1.32 kA') });
  });

  it('when a Zs over its maximum has no C1/C2 observation on its circuit, then the report says so until one is tied to it', async () => {
    const agent = await t.signIn('tester');
    expect((await agent.put(`/api/boards/${t.ids.board}/circuits/${ring}/cells/zs`).send({ text: '1.52', version: 0 })).status).toBe(200);
    expect(codes(await jobFindings(agent))).toContain('zs-over-max-without-observation');
    const observation = { number: 1, text: 'Kitchen ring: Zs above the maximum for its B32', location: 'Kitchen', code: 'C2', boardId: t.ids.board, circuitId: ring, inspectionItem: null };
    const res = await agent.put(url('observations')).send({ version: 0, changes: { 'o-zs': observation } });
    expect(res.status).toBe(200);
    expect(codes(res.body.findings)).not.toContain('zs-over-max-without-observation');
  });

  it('when the main bonding is 6 mm² on a PME supply, then it is below Table 54.8’s 10 mm²', async () => {
    const agent = await t.signIn('tester');
    await agent.put(url('supply')).send({ version: 0, changes: { earthing: 'TN-C-S', supplyNeutralCsaMm2: 25 } });
    const res = await agent.put(url('origin')).send({ version: 0, changes: { earthingConductorCsaMm2: 16, bondingConductorMaterial: 'copper', bondingConductorCsaMm2: 6 } });
    // BS 7671:2018 Table 54.8: supply neutral ≤ 35 mm² → 10 mm² copper [memory]
    expect(res.body.findings.find((f: Finding) => f.code === 'main-bonding-csa-too-small')).toMatchObject({ severity: 'warning', field: 'bondingConductorCsaMm2', limit: '≥ 10 mm² copper' });
  });

  it('when a TT electrode of 200 Ω serves a 300 mA main switch RCD, then RA × IΔn = 60 V is over 50 V', async () => {
    const agent = await t.signIn('tester');
    await agent.put(url('supply')).send({ version: 0, changes: { earthing: 'TT' } });
    const res = await agent.put(url('origin')).send({ version: 0, changes: { meansOfEarthing: 'electrode', electrodeRaOhm: 200, mainSwitchRcdMa: 300 } });
    // BS 7671:2018 411.5.3: RA × IΔn ≤ 50 V
    expect(res.body.findings.find((f: Finding) => f.code === 'electrode-ra-times-idn-over-50v')).toMatchObject({ severity: 'error', section: 'origin', field: 'electrodeRaOhm' });
  });

  it('when a limitation has no reason, then it is an error at that limitation', async () => {
    const agent = await t.signIn('tester');
    const res = await agent
      .put(url('extent'))
      .send({ version: 0, changes: { agreedWith: 'P. Lindqvist (owner)', limitations: [{ kind: 'agreed', what: 'Outbuilding sub-main', reason: '' }] } });
    expect(res.status).toBe(200);
    expect(res.body.findings.find((f: Finding) => f.code === 'limitation-without-reason')).toMatchObject({ severity: 'error', section: 'extent', field: 'limitations.0' });
  });
});
