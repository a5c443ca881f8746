import { blankSection, type JobSectionData, type JobSectionKey } from '../../../shared/schemas/job-record.ts';
import { inspectionItemIds } from '../../../shared/schemas/inspection-items.ts';
import type { TestApp } from '../../helpers/test-app.ts';

/**
 * Readings of the test app's three circuits that raise no error: invented for the tests, but
 * consistent with the trade's arithmetic (cited where each value comes from).
 * - Ring 2.5/1.5 mm²: r1 0.30, rn 0.30, r2 0.49 (r2/r1 ≈ 12.1/7.41 = 1.63, IEC 60228 Table 2);
 *   R1+R2 = (r1+r2)/4 = 0.20 Ω (the ring's cross-connected reading, domain.md's three-step test).
 * - Zs ≈ Zdb 0.25 + R1+R2 (a little off, as measured), well under B32's 1.37 Ω and B6's 7.28 Ω (BS 7671:2018 Table 41.3).
 * - IR > 200 MΩ at 500 V (≥ 1.0 MΩ, BS 7671:2018 Table 64); RCD 25 ms at IΔn (≤ 300 ms, BS EN 61008-1).
 */
export const goodReadings: Record<string, Record<string, string>> = {
  '1': { ringR1: '0.30', ringRn: '0.30', ringR2: '0.49', r1PlusR2: '0.20', irTestVoltage: '500', irLiveLive: '>200', irLiveEarth: '>200', polarity: '✓', zs: '0.44', rcdTimeMs: '25', rcdButton: '✓' },
  '2': { r1PlusR2: '0.45', irTestVoltage: '500', irLiveLive: '>200', irLiveEarth: '>200', polarity: '✓', zs: '0.69', rcdTimeMs: '23', rcdButton: '✓' },
  '3': { r1PlusR2: '0.52', irTestVoltage: '500', irLiveLive: '>200', irLiveEarth: '>200', polarity: '✓', zs: '0.78', rcdTimeMs: '27', rcdButton: '✓' },
};

/** Writes cells straight into the database (the fixture; the routes under test read them). */
export async function writeCells(t: TestApp, boardId: number, byNumber: Record<string, Record<string, string | { text: string; reason: string | null }>>) {
  const circuits = await t.db.selectFrom('circuits').select(['id', 'number']).where('board_id', '=', boardId).execute();
  for (const circuit of circuits) {
    for (const [column, value] of Object.entries(byNumber[circuit.number] ?? {})) {
      const { text, reason } = typeof value === 'string' ? { text: value, reason: null } : value;
      await t.db
        .insertInto('cells')
        .values({ circuit_id: circuit.id, column_key: column, text, reason, version: 1, updated_by: t.ids.tester, updated_at: '2026-12-01T10:00:00.000Z' })
        .onConflict((oc) => oc.columns(['circuit_id', 'column_key']).doUpdateSet({ text, reason }))
        .execute();
    }
  }
}

/** Fills the test board with good readings and marks its polarity confirmed. */
export async function completeBoard(t: TestApp, boardId = t.ids.board) {
  await writeCells(t, boardId, goodReadings);
  await t.db.updateTable('boards').set({ polarity_confirmed: 1 }).where('id', '=', boardId).execute();
}

/**
 * A complete EICR record (invented): supply, extent, every inspection item with an outcome, one
 * C3 observation, summary and inspector. Tests blank one part at a time to see its reason.
 */
export function completeEicrRecord(): JobSectionData {
  const inspections: JobSectionData['inspections'] = Object.fromEntries(inspectionItemIds.map((id) => [id, 'ok' as const]));
  inspections['2.1'] = 'N/A';
  inspections['4.8'] = 'C3';
  return {
    client: { ...blankSection('client'), orderedBy: 'Test client', reason: 'periodic' },
    installation: { ...blankSection('installation'), premises: 'domestic' },
    work: blankSection('work'),
    supply: {
      ...blankSection('supply'),
      earthing: 'TN-C-S',
      liveConductors: '1-phase 2-wire',
      u0V: 230,
      uV: 230,
      frequencyHz: 50,
      zeOhm: 0.2,
      ipfKa: 1.6,
    },
    origin: blankSection('origin'),
    extent: { extentCovered: 'The whole installation, every circuit of DB1.', agreedWith: 'the owner', limitations: [{ kind: 'agreed', what: 'Loft lighting junctions', reason: 'Loft boarded over' }] },
    inspections,
    observations: {
      'o-1': { number: 1, text: 'No surge protection fitted.', location: 'DB1', code: 'C3', boardId: null, circuitId: null, inspectionItem: '4.8' },
    },
    summary: { generalCondition: 'Sound for its age.', nextInspectionMonths: 120, nextInspectionReason: '' },
    declaration: { ...blankSection('declaration'), inspector: { name: 'Tom Tester', position: 'Inspector', date: '2026-12-01' } },
  };
}

export async function writeRecord(t: TestApp, record: Partial<JobSectionData>, jobId = t.ids.job) {
  for (const [section, data] of Object.entries(record) as [JobSectionKey, unknown][]) {
    await t.db
      .insertInto('job_sections')
      .values({ job_id: jobId, section, data: JSON.stringify(data), version: 1, updated_by: t.ids.tester, updated_at: '2026-12-01T10:00:00.000Z' })
      .onConflict((oc) => oc.columns(['job_id', 'section']).doUpdateSet({ data: JSON.stringify(data) }))
      .execute();
  }
}
