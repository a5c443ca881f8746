import { blankSection, jobSectionKeys, type JobSectionData } from '../../../shared/schemas/job-record.ts';
import type { ReviewFinding, ReviewJob } from '../../../shared/schemas/review.ts';

/** An invented job under review: one board with a Zs error, a warning, a LIM without reason and readings to do. */
export function reviewFinding(f: Partial<ReviewFinding> & Pick<ReviewFinding, 'code' | 'severity' | 'key'>): ReviewFinding {
  return {
    circuitId: 11,
    circuitNumber: '1',
    columns: ['zs'],
    message: 'message',
    limit: null,
    source: null,
    acceptable: true,
    acceptance: null,
    ...f,
  };
}

export const zsError = reviewFinding({
  code: 'zs-over-max',
  severity: 'error',
  key: '5:11:zs-over-max:zs',
  message: 'Zs 1.50 Ω is over the maximum 1.37 Ω for a B32.',
  limit: '≤ 1.37 Ω',
  source: 'BS 7671:2018 Table 41.3',
});
export const warning = reviewFinding({
  code: 'zs-over-80-percent',
  severity: 'warning',
  key: '5:12:zs-over-80-percent:zs',
  circuitId: 12,
  circuitNumber: '2',
  message: 'Zs 6.10 Ω is over 80 % of the maximum.',
  acceptable: 'Only error findings need accepting; this one is a warning.',
});
export const lim = reviewFinding({
  code: 'lim-without-reason',
  severity: 'error',
  key: '5:13:lim-without-reason:zs',
  circuitId: 13,
  circuitNumber: '3',
  message: 'LIM in Zs without a reason.',
  acceptable: 'A LIM without a reason cannot be accepted: record why the test could not be done.',
});
export const todo = reviewFinding({ code: 'cells-missing', severity: 'todo' as ReviewFinding['severity'], key: '5:13:cells-missing:irLiveEarth', circuitId: 13, circuitNumber: '3', columns: ['irLiveEarth'], message: 'Not recorded yet: L-E.', acceptable: 'A reading not yet recorded cannot be accepted.' });

export function record(): JobSectionData {
  return Object.fromEntries(jobSectionKeys.map((k) => [k, blankSection(k)])) as unknown as JobSectionData;
}

export function reviewJob(overrides: Partial<ReviewJob> = {}): ReviewJob {
  const boardReasons = ['L-E not recorded on circuit 3.', 'Circuit 3: LIM in Zs has no reason recorded.', 'Circuit 1: Zs 1.50 Ω is over the maximum 1.37 Ω for a B32. (an error, neither resolved nor accepted by a reviewer)'];
  return {
    job: { id: 9, siteId: 2, kind: 'EICR', reference: 'KV-EICR-0042', visitDate: '2026-11-30', visitEndDate: null, limitations: '', state: 'ready', startedFromJobId: null, createdAt: '2026-11-30T08:00:00.000Z', version: 3 },
    site: { id: 2, client: 'Marsh Lane Lettings', address: '4 Heron Row', description: '', contactName: 'Ivy Penn', contactEmail: 'ivy@example.test', earthing: 'TN-C-S', nominalVoltageV: 230, zeOhm: 0.21, pfcKa: 1.7, version: 1 },
    submitted: { by: { id: 2, name: 'Tom Tester' }, at: '2026-12-01T16:20:00.000Z', note: 'All typed up' },
    boards: [
      {
        board: { id: 5, jobId: 9, reference: 'CU1', location: 'Hall cupboard', suppliedFrom: 'Origin', phases: 1, zdbOhm: 0.25, ipfKa: 1.6, polarityConfirmed: true, phaseSequenceConfirmed: false, instruments: '', state: 'open', lockedBy: null, lockedAt: null, version: 4 },
        circuitCount: 3,
        findings: [todo, warning, lim, zsError],
        counts: { errors: 2, accepted: 0, warnings: 1, missingReadings: 1 },
        missingByColumn: { irLiveEarth: 1 },
        gate: { boardId: 5, reference: 'CU1', state: 'open', canLock: false, reasons: boardReasons },
      },
    ],
    jobFindings: [],
    record: record() as unknown as Record<string, unknown>,
    gate: { jobId: 9, state: 'ready', canApprove: false, reasons: ['Board CU1 is not locked.', 'Declaration: the inspector is not named.'], boards: [{ boardId: 5, reference: 'CU1', state: 'open', canLock: false, reasons: boardReasons }] },
    ...overrides,
  };
}
