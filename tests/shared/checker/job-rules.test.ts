/**
 * The job rules as tables: a job (its record and boards), the finding expected, and beside each
 * case where the expected limit comes from. Invented readings; the limits are the standard's.
 */

import { describe, expect, it } from 'vitest';
import { checkBoard, checkJob, claimsSatisfactory, jobFindingCodes, mainBondingMinimum, type JobCheckBoard, type JobCheckInput } from '../../../shared/checker/index.ts';
import type { CheckCircuit } from '../../../shared/schemas/check.ts';
import type { Finding } from '../../../shared/schemas/findings.ts';
import { blankSection, jobSectionKeys, type JobSectionData, type Observation } from '../../../shared/schemas/job-record.ts';
import { board, cleanRadialCells, radial } from './fixtures.ts';

// ---- building a job ----

type RecordPatch = { [K in keyof JobSectionData]?: Partial<JobSectionData[K]> };

function record(patch: RecordPatch = {}): JobSectionData {
  const r = Object.fromEntries(jobSectionKeys.map((key) => [key, blankSection(key)])) as unknown as JobSectionData;
  for (const [key, value] of Object.entries(patch)) {
    Object.assign((r as Record<string, object>)[key]!, value);
  }
  return r;
}

/** A board of the job, with the board checker's own findings as the server would give them. */
function jobBoard(id: number, circuits: CheckCircuit[], details: { reference?: string; zdbOhm?: number | null; ipfKa?: number | null; earthing?: 'TN-S' | 'TN-C-S' | 'TT' } = {}): JobCheckBoard {
  const zdbOhm = details.zdbOhm === undefined ? 0.35 : details.zdbOhm;
  const ipfKa = details.ipfKa === undefined ? 1.6 : details.ipfKa;
  const input = board(circuits, { board: { zdbOhm, ipfKa }, site: { earthing: details.earthing ?? 'TN-C-S' } });
  return { id, reference: details.reference ?? `DB${id}`, zdbOhm, ipfKa, circuits, findings: checkBoard(input) };
}

function observation(number: number, o: Partial<Observation> = {}): Observation {
  return { number, text: 'Something seen', location: '', code: 'C3', boardId: null, circuitId: null, inspectionItem: null, ...o };
}

function job(kind: 'EIC' | 'EICR', patch: RecordPatch = {}, boards: JobCheckBoard[] = [jobBoard(1, [radial()])]): JobCheckInput {
  return { kind, record: record(patch), boards };
}

/** A clean TN-C-S supply: Ze 0.35 Ω, Ipf 1.6 kA, 16 mm² earthing and 10 mm² bonding, 25 mm² neutral. */
const cleanSupply: RecordPatch = {
  supply: { earthing: 'TN-C-S', zeOhm: 0.35, ipfKa: 1.6, supplyNeutralCsaMm2: 25 },
  origin: { meansOfEarthing: 'supplier', earthingConductorMaterial: 'copper', earthingConductorCsaMm2: 16, bondingConductorMaterial: 'copper', bondingConductorCsaMm2: 10 },
};

function withSupply(patch: RecordPatch): RecordPatch {
  return {
    ...cleanSupply,
    ...patch,
    supply: { ...cleanSupply.supply, ...patch.supply },
    origin: { ...cleanSupply.origin, ...patch.origin },
  };
}

// A B20 radial whose Zs 2.40 Ω is over the 2.19 Ω maximum (BS 7671:2018 Table 41.3:
// 0.95 × 230 / (5 × 20) = 2.185 → 2.19).
const zsFault = radial({ id: 7, number: '7', cells: { ...cleanRadialCells, r1PlusR2: '2.00', zs: '2.40' } });

interface Case {
  name: string;
  input: JobCheckInput;
  /** Every job code the input should produce, sorted. */
  codes: string[];
  expect?: Partial<Finding> & { code: string; sourceIncludes?: string; messageIncludes?: string; limitIncludes?: string };
}

const cases: Case[] = [
  {
    name: 'a clean EICR on TN-C-S gives nothing',
    input: job('EICR', withSupply({ observations: { a: observation(1) }, summary: { generalCondition: 'Satisfactory for continued use.' } })),
    codes: [],
  },

  // ---- Zs over its maximum on an EICR ----
  {
    name: 'EICR: Zs over the maximum with no observation on that circuit',
    input: job('EICR', withSupply({}), [jobBoard(3, [zsFault], { reference: 'Kitchen' })]),
    codes: ['zs-over-max-without-observation'],
    // the maximum 2.19 Ω: BS 7671:2018 Table 41.3 (B20); the coding: common practice
    expect: { code: 'zs-over-max-without-observation', severity: 'error', boardId: 3, circuitId: 7, columns: ['zs'], messageIncludes: '≤ 2.19 Ω', sourceIncludes: 'Table 41.3' },
  },
  {
    name: 'EICR: a C2 tied to the board and circuit answers it',
    input: job('EICR', withSupply({ observations: { a: observation(1, { code: 'C2', boardId: 3, circuitId: 7 }) } }), [jobBoard(3, [zsFault])]),
    codes: [],
  },
  {
    name: 'EICR: a C3 on the circuit does not (C1 or C2 needed), and the message says so',
    input: job('EICR', withSupply({ observations: { a: observation(4, { code: 'C3', boardId: 3, circuitId: 7 }) } }), [jobBoard(3, [zsFault])]),
    codes: ['zs-over-max-without-observation'],
    // common practice: a circuit that cannot disconnect in time is C2 or worse
    expect: { code: 'zs-over-max-without-observation', messageIncludes: 'observation 4 is tied to it coded C3' },
  },
  {
    name: 'EICR: a C2 on the same circuit number of another board does not count',
    input: job('EICR', withSupply({ observations: { a: observation(1, { code: 'C2', boardId: 4, circuitId: 7 }) } }), [jobBoard(3, [zsFault])]),
    codes: ['zs-over-max-without-observation'],
    expect: { code: 'zs-over-max-without-observation', boardId: 3 },
  },
  {
    name: 'EIC: no observations on a certificate (the board checker already calls Zs an error)',
    input: job('EIC', withSupply({}), [jobBoard(3, [zsFault])]),
    codes: [],
  },

  // ---- Zdb against Ze ----
  {
    name: 'TN: Zdb 0.20 Ω below Ze 0.35 Ω',
    input: job('EICR', withSupply({}), [jobBoard(1, [radial()], { zdbOhm: 0.2 })]),
    codes: ['zdb-below-ze'],
    // common practice: Zdb = Ze + distribution R1+R2 ≥ Ze; allowance max(0.05 Ω, 10 % of 0.35) = 0.05 → ≥ 0.30 Ω
    expect: { code: 'zdb-below-ze', severity: 'warning', boardId: 1, limit: '≥ 0.30 Ω (Ze 0.35 Ω less 0.05 Ω)', sourceIncludes: 'common practice' },
  },
  {
    name: 'TN: Zdb 0.31 Ω, a little below Ze 0.35 Ω (parallel paths), passes',
    input: job('EICR', withSupply({}), [jobBoard(1, [radial()], { zdbOhm: 0.31 })]),
    codes: [],
  },
  {
    name: 'TN: a sub-board above Ze passes',
    input: job('EICR', withSupply({}), [jobBoard(1, [radial()], { zdbOhm: 0.35 }), jobBoard(2, [radial()], { zdbOhm: 0.61, ipfKa: 0.4 })]),
    codes: [],
  },
  {
    name: 'TT: Zdb 60 Ω against Ze 95 Ω is usual (the electrode dominates)',
    input: job('EICR', withSupply({ supply: { earthing: 'TT', zeOhm: 95 }, origin: { meansOfEarthing: 'electrode', electrodeRaOhm: 90 } }), [jobBoard(1, [radial()], { zdbOhm: 60, earthing: 'TT' })]),
    codes: [],
  },
  {
    name: 'TT: Zdb 0.40 Ω against Ze 95 Ω is noted (another earth reached?)',
    input: job('EICR', withSupply({ supply: { earthing: 'TT', zeOhm: 95 }, origin: { meansOfEarthing: 'electrode', electrodeRaOhm: 90 } }), [jobBoard(1, [radial()], { zdbOhm: 0.4, earthing: 'TT' })]),
    codes: ['zdb-far-below-ze-tt'],
    // common practice; half of Ze (47.5 → 47.5 Ω printed as 47.5) is the checker's own threshold
    expect: { code: 'zdb-far-below-ze-tt', severity: 'note', limit: '≥ 47.5 Ω (half of Ze)' },
  },

  // ---- Ipf at a board against the origin ----
  {
    name: 'Ipf 2.10 kA at a board above 1.6 kA at the origin',
    input: job('EICR', withSupply({}), [jobBoard(2, [radial()], { ipfKa: 2.1 })]),
    codes: ['board-ipf-above-origin'],
    // common practice; allowance max(0.05, 10 % of 1.6 = 0.16) → ≤ 1.76 kA
    expect: { code: 'board-ipf-above-origin', severity: 'warning', boardId: 2, limit: '≤ 1.76 kA (origin 1.60 kA + 0.16 kA)' },
  },
  {
    name: 'Ipf 1.70 kA at the board by the origin: within the meter allowance',
    input: job('EICR', withSupply({}), [jobBoard(2, [radial()], { ipfKa: 1.7 })]),
    codes: [],
  },
  {
    name: 'origin Ipf as the supplier’s declared 16 kA: every board is below it',
    input: job('EICR', withSupply({ supply: { ipfKa: 16 } }), [jobBoard(2, [radial()], { ipfKa: 1.9 })]),
    codes: [],
  },

  // ---- TT electrode ----
  {
    name: 'TT: RA 200 Ω × a 300 mA main switch RCD = 60 V, over 50 V',
    input: job('EICR', withSupply({ supply: { earthing: 'TT', zeOhm: null }, origin: { meansOfEarthing: 'electrode', electrodeRaOhm: 200, mainSwitchRcdMa: 300 } })),
    codes: ['electrode-ra-times-idn-over-50v'],
    // BS 7671:2018 411.5.3: RA × IΔn ≤ 50 V → RA ≤ 50 / 0.3 = 166.7 Ω, printed 167
    expect: { code: 'electrode-ra-times-idn-over-50v', severity: 'error', limit: 'RA × IΔn ≤ 50 V (RA ≤ 167 Ω for 300 mA)', sourceIncludes: '411.5.3', messageIncludes: 'RA 200 Ω × 300 mA = 60 V (the main switch)' },
  },
  {
    name: 'TT: RA 150 Ω × 300 mA = 45 V passes; the 30 mA RCBOs are far inside',
    input: job('EICR', withSupply({ supply: { earthing: 'TT', zeOhm: null }, origin: { meansOfEarthing: 'electrode', electrodeRaOhm: 150, mainSwitchRcdMa: 300 } })),
    // BS 7671:2018 411.5.3: 150 × 0.3 = 45 V ≤ 50 V
    codes: [],
  },
  {
    name: 'TT: RA 520 Ω fails for the 100 mA RCD of circuit 2 but not the 30 mA of circuit 1; and is above 200 Ω',
    input: job(
      'EICR',
      withSupply({ supply: { earthing: 'TT', zeOhm: null }, origin: { meansOfEarthing: 'electrode', electrodeRaOhm: 520 } }),
      [jobBoard(1, [radial({ id: 1, number: '1' }), radial({ id: 2, number: '2', rcdRatedResidualMa: 100 })], { zdbOhm: null, earthing: 'TT' })],
    ),
    codes: ['electrode-ra-may-be-unstable', 'electrode-ra-times-idn-over-50v'],
    // BS 7671:2018 411.5.3: 520 × 0.1 = 52 V > 50; 520 × 0.03 = 15.6 V ≤ 50 (Table 41.5: 1667 Ω for 30 mA [memory])
    expect: { code: 'electrode-ra-times-idn-over-50v', messageIncludes: '× 100 mA = 52 V (circuit 2 on DB1)', limitIncludes: 'RA ≤ 500 Ω for 100 mA' },
  },
  {
    name: 'TT: RA 250 Ω with 30 mA RCDs: within 50 V but noted as possibly unstable',
    input: job('EICR', withSupply({ supply: { earthing: 'TT', zeOhm: null }, origin: { meansOfEarthing: 'electrode', electrodeRaOhm: 250 } })),
    codes: ['electrode-ra-may-be-unstable'],
    // note to BS 7671:2018 Table 41.5: above 200 Ω may not be stable [memory] — common practice
    expect: { code: 'electrode-ra-may-be-unstable', severity: 'warning', limit: '≤ 200 Ω', sourceIncludes: '[memory]' },
  },
  {
    name: 'TN-C-S with an electrode resistance recorded: the TT rules do not apply',
    input: job('EICR', withSupply({ origin: { electrodeRaOhm: 400, mainSwitchRcdMa: 300 } })),
    codes: [],
  },

  // ---- the overall assessment ----
  {
    name: 'EICR: an observation with no code',
    input: job('EICR', withSupply({ observations: { 'o-1': observation(1), 'o-2': observation(2, { code: null }) } })),
    codes: ['observation-without-code'],
    // BS 7671:2018 Appendix 6: every observation is classified — common practice
    expect: { code: 'observation-without-code', severity: 'error', section: 'observations', field: 'o-2', messageIncludes: 'Observation 2' },
  },
  {
    name: 'EICR: a C2 stands while the general condition says "satisfactory"',
    input: job('EICR', withSupply({ observations: { a: observation(1, { code: 'C2' }) }, summary: { generalCondition: 'Installation generally satisfactory.' } })),
    codes: ['summary-says-satisfactory'],
    // any C1, C2 or FI makes a condition report unsatisfactory (BS 7671:2018 Appendix 6; domain.md)
    expect: { code: 'summary-says-satisfactory', severity: 'warning', section: 'summary', field: 'generalCondition', messageIncludes: 'observation 1 (C2)' },
  },
  {
    name: 'EICR: an FI stands and the words say "not satisfactory": consistent',
    input: job('EICR', withSupply({ observations: { a: observation(1, { code: 'FI' }) }, summary: { generalCondition: 'Not satisfactory until the FI item is looked at.' } })),
    codes: [],
  },
  {
    name: 'EICR: only C3s and the words say satisfactory: consistent (C3 alone does not make it unsatisfactory)',
    input: job('EICR', withSupply({ observations: { a: observation(1, { code: 'C3' }) }, summary: { generalCondition: 'Satisfactory; improvements recommended.' } })),
    codes: [],
  },

  // ---- main protective bonding ----
  {
    name: 'PME, 25 mm² neutral: 6 mm² bonding is under 10 mm² (EICR: a warning)',
    input: job('EICR', withSupply({ origin: { bondingConductorCsaMm2: 6 } })),
    codes: ['main-bonding-csa-too-small'],
    // BS 7671:2018 Table 54.8: neutral ≤ 35 mm² → 10 mm² copper [memory]
    expect: { code: 'main-bonding-csa-too-small', severity: 'warning', section: 'origin', field: 'bondingConductorCsaMm2', limit: '≥ 10 mm² copper', sourceIncludes: 'Table 54.8' },
  },
  {
    name: 'PME, 70 mm² neutral: 16 mm² bonding is under 25 mm² (EIC: an error)',
    input: job('EIC', withSupply({ supply: { supplyNeutralCsaMm2: 70 }, origin: { earthingConductorCsaMm2: 25, bondingConductorCsaMm2: 16 } })),
    codes: ['main-bonding-csa-too-small'],
    // BS 7671:2018 Table 54.8: neutral over 50 up to 95 mm² → 25 mm² [memory]
    expect: { code: 'main-bonding-csa-too-small', severity: 'error', limit: '≥ 25 mm² copper', messageIncludes: '70 mm² supply neutral' },
  },
  {
    name: 'TN-S, 25 mm² earthing conductor: 10 mm² bonding is under half of it',
    input: job('EICR', withSupply({ supply: { earthing: 'TN-S' }, origin: { earthingConductorCsaMm2: 25, bondingConductorCsaMm2: 10 } })),
    codes: ['main-bonding-csa-too-small'],
    // BS 7671:2018 544.1.1: at least half the earthing conductor: 12.5 mm² [memory]
    expect: { code: 'main-bonding-csa-too-small', limit: '≥ 12.5 mm² copper', sourceIncludes: '544.1.1' },
  },
  {
    name: 'TN-S, 16 mm² earthing conductor: 10 mm² bonding passes (half is 8)',
    input: job('EICR', withSupply({ supply: { earthing: 'TN-S' }, origin: { bondingConductorCsaMm2: 10 } })),
    codes: [],
  },
  {
    name: 'aluminium bonding is not compared with the copper sizes',
    input: job('EICR', withSupply({ origin: { bondingConductorMaterial: 'aluminium', bondingConductorCsaMm2: 6 } })),
    codes: [],
  },

  // ---- limitations ----
  {
    name: 'a limitation with no reason',
    input: job('EICR', withSupply({ extent: { agreedWith: 'R. Okafor, facilities manager', limitations: [{ kind: 'agreed', what: 'Loft void', reason: 'No safe access' }, { kind: 'operational', what: 'Server room', reason: '  ' }] } })),
    codes: ['limitation-without-reason'],
    // BS 7671:2018 Appendix 6: each limitation with its reason — common practice
    expect: { code: 'limitation-without-reason', severity: 'error', section: 'extent', field: 'limitations.1', messageIncludes: 'Limitation 2 (Server room)' },
  },
  {
    name: 'agreed limitations but nobody named as agreeing',
    input: job('EICR', withSupply({ extent: { limitations: [{ kind: 'agreed', what: 'Loft void', reason: 'No safe access' }] } })),
    codes: ['agreed-limitation-without-whom'],
    expect: { code: 'agreed-limitation-without-whom', severity: 'warning', field: 'agreedWith' },
  },
];

describe('checkJob', () => {
  it.each(cases)('$name', ({ input, codes, expect: e }) => {
    const findings = checkJob(input);
    expect(findings.map((f) => f.code).sort()).toEqual([...codes].sort());
    for (const f of findings) {
      expect(f.source, `${f.code} names its source`).toBeTruthy();
      expect(Object.keys(jobFindingCodes)).toContain(f.code);
    }
    if (!e) return;
    const { sourceIncludes, messageIncludes, limitIncludes, ...fields } = e;
    const found = findings.find((f) => f.code === e.code);
    expect(found).toBeDefined();
    expect(found).toMatchObject(fields);
    if (sourceIncludes) expect(found!.source).toContain(sourceIncludes);
    if (messageIncludes) expect(found!.message).toContain(messageIncludes);
    if (limitIncludes) expect(found!.limit).toContain(limitIncludes);
  });

  it('keeps a stable order whatever the order of boards and observations', () => {
    const a = job('EICR', withSupply({ observations: { x: observation(2, { code: null }), y: observation(1, { code: null }) } }), [
      jobBoard(2, [radial()], { ipfKa: 3 }),
      jobBoard(1, [zsFault], { zdbOhm: 0.1 }),
    ]);
    const b: JobCheckInput = { ...a, boards: [...a.boards].reverse() };
    expect(checkJob(b)).toEqual(checkJob(a));
  });
});

describe('mainBondingMinimum', () => {
  // BS 7671:2018 Table 54.8 (PME, copper, by supply neutral csa) [memory; also domain.md]:
  // ≤ 35 → 10 · > 35 ≤ 50 → 16 · > 50 ≤ 95 → 25 · > 95 ≤ 150 → 35 · > 150 → 50
  it.each([
    [16, 10],
    [35, 10],
    [50, 16],
    [70, 25],
    [95, 25],
    [120, 35],
    [150, 35],
    [185, 50],
    [300, 50],
  ])('PME with a %d mm² supply neutral: %d mm²', (neutral, bonding) => {
    expect(mainBondingMinimum({ earthing: 'TN-C-S', earthingConductorCsaMm2: 16, supplyNeutralCsaMm2: neutral }).minMm2).toBe(bonding);
  });

  // BS 7671:2018 544.1.1 [memory]: half the earthing conductor, at least 6 mm², need not exceed 25 mm²
  it.each([
    [10, 6],
    [16, 8],
    [25, 12.5],
    [35, 17.5],
    [70, 25],
    [null, 6],
  ])('TN-S with a %s mm² earthing conductor: %d mm²', (earthingConductor, bonding) => {
    expect(mainBondingMinimum({ earthing: 'TN-S', earthingConductorCsaMm2: earthingConductor, supplyNeutralCsaMm2: null }).minMm2).toBe(bonding);
  });

  it('PME with the neutral unknown uses the table’s smallest entry and says so', () => {
    const m = mainBondingMinimum({ earthing: 'TN-C-S', earthingConductorCsaMm2: 16, supplyNeutralCsaMm2: null });
    expect(m.minMm2).toBe(10);
    expect(m.basis).toContain('not recorded');
  });

  it('PME where half the earthing conductor is larger than the table entry takes the larger', () => {
    // 544.1.1: half of 35 = 17.5 mm² > Table 54.8's 10 mm² for a 25 mm² neutral
    expect(mainBondingMinimum({ earthing: 'TN-C-S', earthingConductorCsaMm2: 35, supplyNeutralCsaMm2: 25 }).minMm2).toBe(17.5);
  });
});

describe('claimsSatisfactory', () => {
  it.each([
    ['Satisfactory for continued use.', true],
    ['Generally satisfactory condition', true],
    ['Unsatisfactory: see C2 items.', false],
    ['not satisfactory', false],
    ['The earthing isn’t entirely satisfactory', false],
    ['Far from satisfactory', false],
    ['', false],
  ])('%j → %s', (text, expected) => {
    expect(claimsSatisfactory(text)).toBe(expected);
  });
});
