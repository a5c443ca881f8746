import { describe, expect, it } from 'vitest';
import {
  conductorResistance,
  defaultDisconnectionTimeS,
  iec60228FactorFrom20C,
  iec60228Kt,
  insulationMinimum,
  isTimeDelayedRcd,
  r1PlusR2PerMetre,
  rcdFiveTimesLimit,
  rcdTimeLimit,
  tradeTemperatureFactors,
} from '../../../shared/checker/index.ts';

describe('copper conductor resistance at 20 °C', () => {
  it.each([
    [1, 18.1],
    [1.5, 12.1],
    [2.5, 7.41],
    [4, 4.61],
    [6, 3.08],
    [10, 1.83],
    [16, 1.15],
    [25, 0.727],
    [35, 0.524],
  ])('%s mm² → %s mΩ/m (IEC 60228 Table 2, class 2 plain copper)', (csa, expected) => {
    expect(conductorResistance(csa)).toMatchObject({ ok: true, milliohmPerMetre: expected });
  });

  it('has no value for a size it does not hold', () => {
    expect(conductorResistance(0.75)).toMatchObject({ ok: false, reason: expect.stringContaining('0.75') });
  });

  it.each([
    [2.5, 1.5, 19.51], // 7.41 + 12.1, IEC 60228 Table 2
    [1, 1, 36.2], // 18.1 + 18.1, IEC 60228 Table 2
    [1.5, 1, 30.2], // 12.1 + 18.1, IEC 60228 Table 2
    [4, 1.5, 16.71], // 4.61 + 12.1, IEC 60228 Table 2
    [6, 2.5, 10.49], // 3.08 + 7.41, IEC 60228 Table 2
    [10, 4, 6.44], // 1.83 + 4.61, IEC 60228 Table 2
  ])('R1+R2 per metre of %s/%s is %s mΩ/m (sum of IEC 60228 Table 2 values)', (live, cpc, expected) => {
    expect(r1PlusR2PerMetre(live, cpc)).toMatchObject({ ok: true, milliohmPerMetre: expected });
  });
});

describe('temperature correction', () => {
  it('uses the trade factors 1.20 (70 °C) and 1.28 (90 °C) (IET Guidance Note 3 [from memory])', () => {
    expect(tradeTemperatureFactors.thermoplastic70.factor).toBe(1.2);
    expect(tradeTemperatureFactors.thermosetting90.factor).toBe(1.28);
  });

  it('gives the IEC 60228 Annex B factor kt = 254.5/(234.5 + t)', () => {
    expect(iec60228Kt(20)).toBeCloseTo(1, 12); // IEC 60228 Annex B: kt(20 °C) = 254.5/254.5
    expect(iec60228Kt(70)).toBeCloseTo(254.5 / 304.5, 12); // IEC 60228 Annex B formula
    expect(iec60228FactorFrom20C(70)).toBeCloseTo(1.196, 3); // 304.5 / 254.5, IEC 60228 Annex B; the trade rounds to 1.20
  });
});

describe('insulation resistance minima', () => {
  it.each([
    [250, 0.5], // SELV and PELV
    [500, 1.0], // up to and including 500 V
    [1000, 1.0], // above 500 V
  ])('%i V DC test → at least %s MΩ (BS 7671:2018 Table 64)', (voltage, minimum) => {
    expect(insulationMinimum(voltage)).toMatchObject({ ok: true, minMegohm: minimum, source: 'BS 7671:2018 Table 64' });
  });

  it('has no row for other test voltages (BS 7671:2018 Table 64)', () => {
    expect(insulationMinimum(400)).toMatchObject({ ok: false });
  });
});

describe('RCD operating times at IΔn', () => {
  it.each([
    ['AC', null, 300],
    ['A', null, 300],
    ['F', null, 300],
    ['B', null, 300],
    ['S-AC', 130, 500],
    ['S-A', 130, 500],
  ])('type %s → %s–%s ms (BS EN 61008-1 / 61009-1; BS 7671:2018+A2 643.7)', (type, min, max) => {
    expect(rcdTimeLimit(type)).toMatchObject({ minMs: min, maxMs: max });
  });

  it('reads "S-" as time-delayed and 5 × IΔn as ≤ 40 ms (BS EN 61008-1 / 61009-1)', () => {
    expect(isTimeDelayedRcd('S-A')).toBe(true);
    expect(isTimeDelayedRcd('A')).toBe(false);
    expect(rcdFiveTimesLimit.maxMs).toBe(40);
  });
});

describe('maximum disconnection times', () => {
  it.each([
    ['TN-C-S', 'ring', 32, 0.4],
    ['TN-S', 'radial', 20, 0.4],
    ['TT', 'radial', 20, 0.2],
    ['TN-C-S', 'distribution', 63, 5],
    ['TT', 'distribution', 63, 1],
    ['TN-S', 'radial', 80, 5],
  ] as const)('%s %s %i A → %s s (BS 7671:2018 Table 41.1 / 411.3.2)', (earthing, kind, ratingA, seconds) => {
    expect(defaultDisconnectionTimeS({ earthing, kind, ratingA })).toMatchObject({ seconds });
  });
});

describe('maximum disconnection times follow U0 (final circuits ≤ 63 A / ≤ 32 A)', () => {
  it.each([
    ['TN-C-S', 230, 0.4], // BS 7671:2018 Table 41.1, 120 V < U0 ≤ 230 V
    ['TT', 230, 0.2], // Table 41.1, 120 V < U0 ≤ 230 V
    ['TN-S', 240, 0.2], // Table 41.1, 230 V < U0 ≤ 400 V
    ['TN-C-S', 400, 0.2], // Table 41.1, 230 V < U0 ≤ 400 V (400 V is in this row)
    ['TT', 277, 0.07], // Table 41.1, 230 V < U0 ≤ 400 V
    ['TN-S', 110, 0.8], // Table 41.1, 50 V < U0 ≤ 120 V [from memory]
    ['TT', 480, 0.04], // Table 41.1, U0 > 400 V [from memory]
    ['TN-S', 480, 0.1], // Table 41.1, U0 > 400 V [from memory]
  ] as const)('%s at U0 %i V → %s s', (earthing, u0, seconds) => {
    expect(defaultDisconnectionTimeS({ earthing, kind: 'radial', ratingA: 20, u0 })).toMatchObject({ seconds });
  });

  it.each([
    ['TN-S', 5],
    ['TT', 1],
  ] as const)('a distribution circuit on %s keeps %s s at U0 277 V (BS 7671:2018 411.3.2.3 / 411.3.2.4)', (earthing, seconds) => {
    expect(defaultDisconnectionTimeS({ earthing, kind: 'distribution', ratingA: 63, u0: 277 })).toMatchObject({ seconds });
  });
});
