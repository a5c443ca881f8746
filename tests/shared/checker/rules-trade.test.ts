/**
 * Rules a reviewer expects of a checker, and the limits that depend on the system (TT, U0, the test
 * voltage). One small board per case; each names the source of the value it expects.
 */

import { describe, expect, it } from 'vitest';
import { checkBoard, findingCodes } from '../../../shared/checker/index.ts';
import type { CheckInput } from '../../../shared/schemas/check.ts';
import type { Finding } from '../../../shared/schemas/findings.ts';
import { board, cleanRadialCells, cleanRingCells, radial, ring } from './fixtures.ts';

interface Case {
  name: string;
  input: CheckInput;
  codes: string[];
  expect: Partial<Finding> & { code: string; sourceIncludes?: string; messageIncludes?: string };
}

const tt = { site: { earthing: 'TT' as const }, board: { zdbOhm: null } };

const cases: Case[] = [
  // ---- TT: loop impedances of hundreds of ohms ----
  {
    name: 'TT, 30 mA RCD, Zs 350 Ω: within 50 V / IΔn, only a remark about the electrode',
    input: board([radial({ cells: { ...cleanRadialCells, zs: '350' } })], tt),
    codes: ['zs-tt-electrode-unstable'],
    // 50 V / 0.030 A = 1667 Ω (BS 7671:2018 411.5.3, Table 41.5 [from memory]); > 200 Ω: electrode may not be stable (note to Table 41.5 [from memory])
    expect: { code: 'zs-tt-electrode-unstable', severity: 'note', columns: ['zs'], sourceIncludes: 'Table 41.5' },
  },
  {
    name: 'TT, 30 mA RCD, Zs 1800 Ω: over 50 V / IΔn',
    input: board([radial({ cells: { ...cleanRadialCells, zs: '1800' } })], tt),
    codes: ['zs-over-max', 'zs-tt-electrode-unstable'],
    // 50 000 / 30 = 1666.7 → 1667 Ω (BS 7671:2018 411.5.3 [from memory])
    expect: { code: 'zs-over-max', severity: 'error', limit: '≤ 1667 Ω', sourceIncludes: '411.5.3' },
  },
  {
    name: 'TT, 100 mA RCD, Zs 120 Ω: within 500 Ω and below 200 Ω, no finding',
    input: board([radial({ rcdRatedResidualMa: 100, cells: { ...cleanRadialCells, zs: '120' } })], tt),
    codes: [],
    // 50 V / 0.1 A = 500 Ω (BS 7671:2018 411.5.3 [from memory])
    expect: { code: '' },
  },
  {
    name: 'TT, 300 mA RCD, Zs 180 Ω: over 50 V / 0.3 A',
    input: board([radial({ description: 'Outbuilding supply', kind: 'distribution', rcdType: 'S-A', rcdRatedResidualMa: 300, cells: { ...cleanRadialCells, zs: '180', rcdTimeMs: '200' } })], tt),
    codes: ['zs-over-max'],
    // 50 / 0.3 = 166.7 → 167 Ω (BS 7671:2018 411.5.3 [from memory])
    expect: { code: 'zs-over-max', limit: '≤ 167 Ω' },
  },
  {
    name: 'TN: a Zs of 350 Ω is simply over the device limit (no TT remark)',
    input: board([radial({ cells: { ...cleanRadialCells, zs: '350' } })]),
    codes: ['zs-above-expected', 'zs-over-max'],
    // B20: 0.95 × 230 / 100 = 2.185 → 2.19 Ω (BS 7671:2018 Table 41.3)
    expect: { code: 'zs-over-max', limit: '≤ 2.19 Ω' },
  },

  // ---- Disconnection time follows U0 ----
  {
    name: 'U0 277 V, TN, no time recorded: 0.2 s assumed, Zs judged against the B20 at 277 V',
    input: board([radial({ maxDisconnectionS: null, cells: { ...cleanRadialCells, r1PlusR2: '2.40', zs: '2.75' } })], { site: { nominalVoltageV: 277 } }),
    codes: ['zs-over-max'],
    // BS 7671:2018 Table 41.1: 230 V < U0 ≤ 400 V, TN → 0.2 s; B20: 0.95 × 277 / 100 = 2.6315 → 2.63 Ω (411.4.4 formula)
    expect: { code: 'zs-over-max', limit: '≤ 2.63 Ω', messageIncludes: '0.2 s assumed', sourceIncludes: '230 V < U0 ≤ 400 V' },
  },
  {
    name: 'U0 277 V, TT without an RCD: 0.07 s is shorter than any breaker table, so the limit is not guessed',
    input: board([radial({ maxDisconnectionS: null, rcdType: null, rcdRatedResidualMa: null, description: 'Lighting', cells: { ...cleanRadialCells, rcdTimeMs: '', rcdButton: '', zs: '0.62' } })], {
      site: { earthing: 'TT', nominalVoltageV: 277 },
    }),
    codes: ['zs-limit-unknown'],
    // BS 7671:2018 Table 41.1: TT, 230 V < U0 ≤ 400 V → 0.07 s; Table 41.3 starts at 0.1 s
    expect: { code: 'zs-limit-unknown', messageIncludes: '0.07 s' },
  },

  // ---- Insulation at 250 V ----
  {
    name: '250 V test, 0.9 MΩ: below the 1.0 MΩ a circuit up to 500 V still needs',
    input: board([radial({ cells: { ...cleanRadialCells, irTestVoltage: '250', irLiveLive: '0.9' } })]),
    codes: ['ir-below-minimum'],
    // BS 7671:2018 643.3.3 [from memory]: reduced to 250 V, at least 1 MΩ; SELV/PELV 0.5 MΩ (Table 64)
    expect: { code: 'ir-below-minimum', severity: 'error', limit: '≥ 1.0 MΩ at 250 V', sourceIncludes: '643.3.3', messageIncludes: 'SELV or PELV' },
  },
  {
    name: '250 V test, 1.5 MΩ: passes, only worth a look',
    input: board([radial({ cells: { ...cleanRadialCells, irTestVoltage: '250', irLiveLive: '1.5' } })]),
    codes: ['ir-below-2-megohm'],
    // ≥ 1 MΩ (643.3.3 [from memory]); below 2 MΩ worth investigating (IET Guidance Note 3 [from memory]) — common practice
    expect: { code: 'ir-below-2-megohm', severity: 'note' },
  },

  // ---- RCD at 5 × IΔn (optional) ----
  {
    name: 'RCD at 5 × IΔn in 28 ms: within 40 ms',
    input: board([radial({ cells: { ...cleanRadialCells, rcdTime5Ms: '28' } })]),
    codes: [],
    // BS EN 61008-1 / 61009-1: ≤ 40 ms at 5 × IΔn
    expect: { code: '' },
  },
  {
    name: 'RCD at 5 × IΔn in 46 ms: over 40 ms',
    input: board([radial({ cells: { ...cleanRadialCells, rcdTime5Ms: '46' } })]),
    codes: ['rcd-5x-over-limit'],
    // BS EN 61008-1 / 61009-1: ≤ 40 ms at 5 × IΔn
    expect: { code: 'rcd-5x-over-limit', severity: 'error', columns: ['rcdTime5Ms'], limit: '≤ 40 ms', sourceIncludes: '61008-1' },
  },
  {
    name: 'time-delayed RCD at 5 × IΔn in 170 ms: over 150 ms',
    input: board([radial({ rcdType: 'S-A', rcdRatedResidualMa: 100, cells: { ...cleanRadialCells, rcdTimeMs: '210', rcdTime5Ms: '170' } })]),
    codes: ['rcd-5x-over-limit'],
    // time-delayed (S) at 5 × IΔn: 50–150 ms (BS EN 61008-1 / 61009-1 [from memory])
    expect: { code: 'rcd-5x-over-limit', limit: '50–150 ms', sourceIncludes: '[from memory]' },
  },
  {
    name: 'time-delayed RCD at 5 × IΔn in 30 ms: faster than an S type',
    input: board([radial({ rcdType: 'S-A', rcdRatedResidualMa: 100, cells: { ...cleanRadialCells, rcdTimeMs: '210', rcdTime5Ms: '30' } })]),
    codes: ['rcd-5x-below-delay'],
    // 50–150 ms (BS EN 61008-1 / 61009-1 [from memory])
    expect: { code: 'rcd-5x-below-delay', severity: 'warning', limit: '50–150 ms' },
  },

  // ---- Readings of exactly 0 ----
  {
    name: 'Zs 0.00 Ω is not a measurement',
    input: board([radial({ cells: { ...cleanRadialCells, zs: '0.00' } })]),
    codes: ['reading-zero'],
    // common practice: every loop has some impedance
    expect: { code: 'reading-zero', severity: 'error', columns: ['zs'], sourceIncludes: 'common practice' },
  },
  {
    name: 'RCD time 0 ms is not a measurement',
    input: board([radial({ cells: { ...cleanRadialCells, rcdTimeMs: '0' } })]),
    codes: ['reading-zero'],
    // common practice: no RCD operates in no time
    expect: { code: 'reading-zero', columns: ['rcdTimeMs'] },
  },

  // ---- Socket-outlets without a 30 mA RCD ----
  {
    name: 'a ring final with no RCD',
    input: board([ring({ rcdType: null, rcdRatedResidualMa: null, cells: { ...cleanRingCells, rcdTimeMs: '', rcdButton: '' } })]),
    codes: ['socket-circuit-without-rcd'],
    // BS 7671:2018 411.3.3: socket-outlets ≤ 32 A, additional protection by an RCD ≤ 30 mA
    expect: { code: 'socket-circuit-without-rcd', severity: 'warning', columns: ['rcdType'], limit: 'RCD, IΔn ≤ 30 mA', sourceIncludes: '411.3.3' },
  },
  {
    name: 'a radial of sockets behind a 100 mA RCD',
    input: board([radial({ description: 'Garage sockets', rcdRatedResidualMa: 100 })]),
    codes: ['socket-circuit-without-rcd'],
    // BS 7671:2018 411.3.3: IΔn ≤ 30 mA
    expect: { code: 'socket-circuit-without-rcd', columns: ['rcdRatedResidualMa'], messageIncludes: '100 mA' },
  },
  {
    name: 'a cooker radial with no RCD is not a socket circuit',
    input: board([radial({ description: 'Cooker', liveCsaMm2: 6, cpcCsaMm2: 2.5, ratingA: 32, rcdType: null, rcdRatedResidualMa: null, cells: { ...cleanRadialCells, r1PlusR2: '0.25', zs: '0.58', rcdTimeMs: '', rcdButton: '' } })]),
    codes: [],
    expect: { code: '' },
  },

  // ---- Conductor size against the device ----
  {
    name: '2.5 mm² radial on a B32',
    input: board([radial({ ratingA: 32 })]),
    codes: ['csa-small-for-device'],
    // flat twin-and-earth 2.5 mm², method C: 27 A < 32 A (BS 7671:2018 Table 4D5 [from memory])
    expect: { code: 'csa-small-for-device', severity: 'warning', columns: ['liveCsaMm2', 'ratingA'], limit: 'Iz ≥ 32 A (In)', sourceIncludes: 'Table 4D5', messageIncludes: 'installation method' },
  },
  {
    name: '1.5 mm² ring on a B32',
    input: board([ring({ liveCsaMm2: 1.5, cpcCsaMm2: 1, cells: { ...cleanRingCells, ringR2: '0.78' } })]),
    codes: ['csa-small-for-device'],
    // ring: Iz ≥ 0.67 × 32 = 21.4 A (BS 7671:2018 433.1.204 [from memory]); 1.5 mm² method C 20 A (Table 4D5 [from memory]);
    // r2 0.78 ≈ 0.52 × 18.1/12.1 = 0.778 (IEC 60228)
    expect: { code: 'csa-small-for-device', limit: 'Iz ≥ 21.4 A (0.67 × In, ring)', sourceIncludes: '433.1.204' },
  },
  {
    name: '2.5 mm² ring on a B32 is the usual design',
    input: board([ring()]),
    codes: [],
    // 27 A ≥ 0.67 × 32 = 21.4 A (Table 4D5, 433.1.204 [from memory])
    expect: { code: '' },
  },
  {
    name: 'an unfused spur of 2.5 mm² on the ring’s B32 is not judged as a radial',
    input: board([ring({ id: 2 }), radial({ id: 3, kind: 'spur', description: 'Spur to socket', spurRingId: 2, ratingA: 32, cells: { ...cleanRadialCells, r1PlusR2: '0.40', zs: '0.74' } })]),
    codes: [],
    // the spur is fed from the ring (BS 7671:2018 Appendix 15 [from memory])
    expect: { code: '' },
  },

  // ---- Ipf against U0 / Zdb ----
  {
    name: 'Ipf 0.066 kA with Zdb 0.35 Ω: a slip in one of them',
    input: board([radial()], { board: { ipfKa: 0.066 } }),
    codes: ['ipf-below-earth-fault-current'],
    // U0 / Zdb = 230 / 0.35 = 657 A = 0.66 kA; Ipf is at least the earth fault current — common practice
    expect: { code: 'ipf-below-earth-fault-current', severity: 'warning', circuitId: null, limit: '≥ 0.33 kA (half of U0 / Zdb)', sourceIncludes: 'common practice', messageIncludes: '0.66 kA' },
  },
  {
    name: 'Ipf 1.6 kA with Zdb 0.35 Ω: consistent (a short-circuit current may well be higher)',
    input: board([radial()], { board: { ipfKa: 1.6 } }),
    codes: [],
    expect: { code: '' },
  },

  // ---- A radial's R1+R2 against its length ----
  {
    name: 'radial of 15 m of 2.5/1.5, R1+R2 0.30 Ω: fits',
    input: board([radial({ cableLengthM: 15 })]),
    codes: [],
    // 15 m × 19.51 mΩ/m = 0.293 Ω at 20 °C, × 1.20 = 0.351 Ω at 70 °C (IEC 60228; IET GN3 [from memory])
    expect: { code: '' },
  },
  {
    name: 'radial of 15 m of 2.5/1.5, R1+R2 0.60 Ω: too high for its length',
    input: board([radial({ cableLengthM: 15, cells: { ...cleanRadialCells, r1PlusR2: '0.60', zs: '0.93' } })]),
    codes: ['radial-r1r2-vs-length'],
    // 0.293 − 0.05 = 0.24 Ω … 0.351 + 0.05 = 0.40 Ω (IEC 60228 Table 2: 7.41 + 12.1 mΩ/m; × 1.20, IET GN3 [from memory]; ± 0.05 Ω — common practice)
    expect: { code: 'radial-r1r2-vs-length', severity: 'warning', columns: ['r1PlusR2', 'cableLengthM'], limit: '0.24–0.40 Ω', sourceIncludes: 'IEC 60228', messageIncludes: 'poor joint' },
  },
  {
    name: 'radial of 40 m of 4/1.5, R1+R2 0.30 Ω: too low for its length',
    input: board([radial({ cableLengthM: 40, liveCsaMm2: 4, cells: { ...cleanRadialCells, r1PlusR2: '0.30' } })]),
    codes: ['radial-r1r2-vs-length'],
    // 40 m × (4.61 + 12.1) = 0.668 Ω at 20 °C, allowance 15 % = 0.100 → from 0.57 Ω (IEC 60228 Table 2)
    expect: { code: 'radial-r1r2-vs-length', limit: '0.57–0.90 Ω' },
  },
  {
    name: 'no length recorded: no finding about length',
    input: board([radial({ cableLengthM: null, cells: { ...cleanRadialCells, r1PlusR2: '0.60', zs: '0.93' } })]),
    codes: [],
    expect: { code: '' },
  },
];

function codesOf(findings: readonly Finding[]): string[] {
  return [...new Set(findings.map((f) => f.code))].sort();
}

describe('checkBoard: the rules testers expect, and limits that follow the system', () => {
  it.each(cases)('$name', ({ input, codes, expect: wanted }) => {
    const findings = checkBoard(input);
    expect(codesOf(findings)).toEqual(codes);
    if (wanted.code === '') return;
    const found = findings.find((f) => f.code === wanted.code);
    expect(found, `no ${wanted.code} in ${JSON.stringify(findings, null, 1)}`).toBeDefined();
    const { sourceIncludes, messageIncludes, ...exact } = wanted;
    expect(found).toMatchObject(exact);
    expect(found!.severity).toBe(findingCodes[found!.code as keyof typeof findingCodes]);
    if (sourceIncludes) expect(found!.source).toContain(sourceIncludes);
    if (messageIncludes) expect(found!.message).toContain(messageIncludes);
  });

  it('counts only readings not yet recorded as to do: nothing about a typed value is todo', () => {
    const todo = Object.entries(findingCodes).filter(([, severity]) => severity === 'todo').map(([code]) => code).sort();
    expect(todo).toEqual(['cells-missing', 'rcd-time-missing']);
  });
});
