import { describe, expect, it } from 'vitest';
import { checkJob } from '../../../shared/checker/index.ts';
import { acceptability, boardLockReasons, gateFindingKey, isMissingReading, jobApprovalReasons, missingReadingCounts } from '../../../shared/review/gate.ts';
import { jobTransition } from '../../../shared/review/job-state.ts';
import { blankSection, type JobSectionData } from '../../../shared/schemas/job-record.ts';
import type { Finding } from '../../../shared/schemas/findings.ts';
import { completeEicrRecord } from '../../server/review/review-fixture.ts';

const finding = (f: Partial<Finding> & Pick<Finding, 'code' | 'severity'>): Finding => ({
  circuitId: 1,
  columns: [],
  message: 'm',
  limit: null,
  source: null,
  ...f,
});

const board = { id: 7, reference: 'DB1' };
const circuits = [
  { id: 1, number: '1' },
  { id: 2, number: '2' },
  { id: 3, number: '10' },
];

describe('boardLockReasons', () => {
  it('when readings are missing, then one reason per column, circuits in number order', () => {
    const reasons = boardLockReasons({
      board,
      circuits,
      findings: [
        finding({ code: 'cells-missing', severity: 'error', circuitId: 3, columns: ['zs', 'irLiveEarth'] }),
        finding({ code: 'cells-missing', severity: 'error', circuitId: 2, columns: ['zs'] }),
        finding({ code: 'rcd-time-missing', severity: 'error', circuitId: 1, columns: ['rcdTimeMs'] }),
      ],
      acceptedKeys: new Set(),
    });
    expect(reasons).toEqual(['Zs not recorded on circuits 2, 10.', 'L-E not recorded on circuit 10.', 'Time not recorded on circuit 1.']);
  });

  it('when the checker marks readings as to do (severity todo), then they count as missing too', () => {
    const todo = { ...finding({ code: 'reading-to-do', severity: 'error', columns: ['zs'] }), severity: 'todo' } as unknown as Finding;
    expect(isMissingReading(todo)).toBe(true);
    expect(boardLockReasons({ board, circuits, findings: [todo], acceptedKeys: new Set() })).toEqual(['Zs not recorded on circuit 1.']);
  });

  it('when a LIM has no reason, then it is a reason of its own and cannot be accepted', () => {
    const lim = finding({ code: 'lim-without-reason', severity: 'error', circuitId: 2, columns: ['zs'] });
    const accepted = new Set([gateFindingKey(board.id, lim)]);
    expect(boardLockReasons({ board, circuits, findings: [lim], acceptedKeys: accepted })).toEqual(['Circuit 2: LIM in Zs has no reason recorded.']);
    expect(acceptability(lim)).toMatch(/cannot be accepted/);
  });

  it('when an error finding is open, then it is a reason until accepted; warnings and notes never are', () => {
    const zs = finding({ code: 'zs-over-max', severity: 'error', columns: ['zs'], message: 'Zs 1.50 Ω is over the maximum 1.37 Ω.' });
    const warning = finding({ code: 'zs-over-80-percent', severity: 'warning', columns: ['zs'] });
    const input = { board, circuits, findings: [zs, warning], acceptedKeys: new Set<string>() };
    expect(boardLockReasons(input)).toEqual(['Circuit 1: Zs 1.50 Ω is over the maximum 1.37 Ω. (an error, neither resolved nor accepted by a reviewer)']);
    expect(boardLockReasons({ ...input, acceptedKeys: new Set([gateFindingKey(board.id, zs)]) })).toEqual([]);
    expect(acceptability(zs)).toBe(true);
    expect(acceptability(warning)).toMatch(/Only error findings/);
    expect(acceptability(finding({ code: 'cells-missing', severity: 'error' }))).toMatch(/not yet recorded cannot be accepted/);
  });

  it('counts missing readings per column', () => {
    const counts = missingReadingCounts([
      finding({ code: 'cells-missing', severity: 'error', columns: ['zs', 'r1PlusR2'] }),
      finding({ code: 'cells-missing', severity: 'error', circuitId: 2, columns: ['zs'] }),
      finding({ code: 'zs-over-max', severity: 'error', columns: ['zs'] }),
    ]);
    expect(counts).toEqual({ total: 3, byColumn: { zs: 2, r1PlusR2: 1 } });
  });
});

describe('gateFindingKey', () => {
  it('when two job findings differ only by the field, then their keys differ', () => {
    const a = finding({ code: 'inspection-coded-without-observation', severity: 'error', circuitId: null, section: 'inspections', field: '4.1' });
    const b = { ...a, field: '4.2' };
    expect(gateFindingKey(null, a)).not.toBe(gateFindingKey(null, b));
  });
});

/** The job gate, one missing part at a time, on an otherwise complete record. */
describe('jobApprovalReasons', () => {
  const lockedBoard: Array<{ id: number; reference: string; state: 'open' | 'locked' }> = [{ id: 7, reference: 'DB1', state: 'locked' }];
  const reasonsFor = (kind: 'EIC' | 'EICR', record: JobSectionData, boards = lockedBoard, jobFindings: Finding[] = []) =>
    jobApprovalReasons({ kind, record, boards, jobFindings, acceptedKeys: new Set() });

  it('when everything is there, then no reason', () => {
    expect(reasonsFor('EICR', completeEicrRecord())).toEqual([]);
  });

  it('when a board is open or there is none, then it says so', () => {
    expect(reasonsFor('EICR', completeEicrRecord(), [{ id: 7, reference: 'DB1', state: 'open' }])).toEqual(['Board DB1 is not locked.']);
    expect(reasonsFor('EICR', completeEicrRecord(), [])).toEqual([expect.stringMatching(/^The job has no board/)]);
  });

  it('when supply characteristics are missing, then it names each one (the model forms ask for them: BS 7671 Appendix 6)', () => {
    const record = completeEicrRecord();
    record.supply = { ...record.supply, earthing: null, zeOhm: null };
    expect(reasonsFor('EICR', record)).toEqual(['Supply characteristics: the earthing arrangement and Ze not given.']);
  });

  it('when the extent is blank, a limitation has no reason, or agreed limitations name nobody, then each is a reason', () => {
    const record = completeEicrRecord();
    record.extent = { extentCovered: ' ', agreedWith: '', limitations: [{ kind: 'agreed', what: 'Loft', reason: '' }] };
    expect(reasonsFor('EICR', record)).toEqual([
      'Extent and limitations: what the inspection and testing covered is not given.',
      'Limitation 1 (Loft): no reason is given.',
      'Extent and limitations: agreed limitations are listed but not with whom they were agreed.',
    ]);
  });

  it('when an EIC lacks its work description and extent, then both are reasons', () => {
    const record = { ...completeEicrRecord(), observations: {} };
    record.inspections = Object.fromEntries(Object.keys(record.inspections).map((id) => [id, 'ok' as const]));
    record.declaration = { ...record.declaration, samePersonForAll: true };
    expect(reasonsFor('EIC', record)).toEqual(['The work: its description is not given.', 'The work: its extent (what this certificate covers) is not given.']);
  });

  it('when the declaration lacks its people, then EIC names design, construction, inspection; EICR the inspector', () => {
    const eic = { ...completeEicrRecord(), observations: {}, work: { ...blankSection('work'), description: 'New kitchen circuits', extent: 'Circuits 3 and 4' } };
    eic.inspections = Object.fromEntries(Object.keys(eic.inspections).map((id) => [id, 'ok' as const]));
    eic.declaration = blankSection('declaration');
    expect(reasonsFor('EIC', eic)).toEqual([
      'Declaration: the person responsible for design is not named.',
      'Declaration: the person responsible for construction is not named.',
      'Declaration: the person responsible for inspection and testing is not named.',
    ]);
    eic.declaration = { ...blankSection('declaration'), samePersonForAll: true };
    expect(reasonsFor('EIC', eic)).toEqual(['Declaration: the person responsible for design, construction, and inspection and testing is not named.']);
    const eicr = completeEicrRecord();
    eicr.declaration = blankSection('declaration');
    expect(reasonsFor('EICR', eicr)).toEqual(['Declaration: the inspector is not named.']);
  });

  it('when inspection items are blank, then one reason lists them', () => {
    const record = completeEicrRecord();
    delete record.inspections['1.1'];
    record.inspections['6.2'] = null;
    expect(reasonsFor('EICR', record)).toEqual(['Schedule of inspections: 2 items 1.1 and 6.2 left blank (write N/A where an item does not apply).']);
  });

  it('when an observation has no code, then it says which', () => {
    const record = completeEicrRecord();
    record.observations['o-2'] = { number: 2, text: 'Cracked socket front', location: 'Kitchen', code: null, boardId: null, circuitId: null, inspectionItem: null };
    expect(reasonsFor('EICR', record)).toEqual(['Observations: 2 has no code (C1, C2, C3 or FI).']);
  });

  it('when an item is coded C2 but the observations make the report satisfactory, then the assessment contradicts them (any C1, C2 or FI makes it unsatisfactory: BS 7671 Appendix 6)', () => {
    const record = completeEicrRecord();
    // Item 4.8 has its observation, but coded C3 there and C2 on the schedule of inspections.
    record.inspections['4.8'] = 'C2';
    const reasons = reasonsFor('EICR', record);
    expect(reasons).toEqual([expect.stringMatching(/^The overall assessment reads satisfactory, but inspection item 4\.8 .* is coded C2/)]);
    // Once the observation carries C2 too, the report is unsatisfactory and nothing contradicts.
    record.observations['o-1'] = { ...record.observations['o-1']!, code: 'C2' };
    expect(reasonsFor('EICR', record)).toEqual([]);
  });

  it('when the interval is missing, or shorter than usual with no reason (IET Guidance Note 3 [memory]: domestic 10 years), then it says so', () => {
    const record = completeEicrRecord();
    record.summary = { ...record.summary, nextInspectionMonths: null };
    expect(reasonsFor('EICR', record)).toEqual(['Summary: the recommended interval to the next inspection is not given.']);
    record.summary = { ...record.summary, nextInspectionMonths: 60 };
    expect(reasonsFor('EICR', record)).toEqual(['Summary: the interval of 60 months is shorter than the usual 120 for these premises; say why.']);
    record.summary = { ...record.summary, nextInspectionReason: 'Older wiring, some rubber-insulated' };
    expect(reasonsFor('EICR', record)).toEqual([]);
  });

  it('when a job finding is an error, then it is a reason until accepted', () => {
    const record = completeEicrRecord();
    record.inspections['5.4'] = 'C2';
    const jobFindings = checkJob({ kind: 'EICR', record, boards: [] });
    expect(jobFindings.map((f) => f.code)).toEqual(['inspection-coded-without-observation']);
    const reasons = jobApprovalReasons({ kind: 'EICR', record, boards: lockedBoard, jobFindings, acceptedKeys: new Set() });
    expect(reasons.some((r) => /5\.4.*neither resolved nor accepted/.test(r))).toBe(true);
    const accepted = jobApprovalReasons({ kind: 'EICR', record, boards: lockedBoard, jobFindings, acceptedKeys: new Set([gateFindingKey(null, jobFindings[0]!)]) });
    expect(accepted.some((r) => /neither resolved nor accepted/.test(r))).toBe(false);
  });
});

describe('job findings in the job gate', () => {
  const lockedBoard: Array<{ id: number; reference: string; state: 'open' | 'locked' }> = [{ id: 7, reference: 'DB1', state: 'locked' }];
  it('when the checker flags a required part, then it is said once (in the record\'s words) and cannot be accepted', () => {
    const record = completeEicrRecord();
    record.observations['o-2'] = { number: 2, text: 'Cracked socket front', location: 'Kitchen', code: null, boardId: null, circuitId: null, inspectionItem: null };
    const jobFindings = checkJob({ kind: 'EICR', record, boards: [] });
    const uncoded = jobFindings.find((f) => f.code === 'observation-without-code');
    expect(uncoded).toBeDefined();
    expect(acceptability(uncoded!)).toMatch(/cannot be accepted/);
    expect(jobApprovalReasons({ kind: 'EICR', record, boards: lockedBoard, jobFindings, acceptedKeys: new Set() })).toEqual(['Observations: 2 has no code (C1, C2, C3 or FI).']);
  });

  it('when the general condition calls an unsatisfactory installation satisfactory, then approval is stopped (any C2 makes it unsatisfactory: BS 7671 Appendix 6)', () => {
    const record = completeEicrRecord();
    record.observations['o-1'] = { ...record.observations['o-1']!, code: 'C2' };
    record.inspections['4.8'] = 'C2';
    record.summary = { ...record.summary, generalCondition: 'Satisfactory overall for its age.' };
    const jobFindings = checkJob({ kind: 'EICR', record, boards: [] });
    const reasons = jobApprovalReasons({ kind: 'EICR', record, boards: lockedBoard, jobFindings, acceptedKeys: new Set() });
    expect(reasons).toEqual([expect.stringMatching(/^Summary: The general condition calls the installation satisfactory/)]);
  });
});

describe('jobTransition', () => {
  it('checks the role before the state, and says both in words', () => {
    expect(jobTransition('entering', 'approve', 'tester')).toMatchObject({ ok: false, status: 403 });
    expect(jobTransition('entering', 'approve', 'reviewer')).toMatchObject({ ok: false, status: 409, message: expect.stringMatching(/submitted for review/) });
    expect(jobTransition('issued', 'send-back', 'admin')).toMatchObject({ ok: false, status: 409, message: expect.stringMatching(/reopen/) });
    expect(jobTransition('approved', 'send-back', 'reviewer')).toEqual({ ok: true, to: 'entering' });
  });
});
