import { describe, expect, it } from 'vitest';
import {
  expectedRadialR1PlusR2,
  expectedRingReading,
  expectedSpurR1PlusR2,
  maxCableLength,
  ringProfile,
} from '../../../shared/checker/index.ts';

describe('expected R1+R2 of a radial', () => {
  it.each([
    [20, 2.5, 1.5, 1, 0.3902], // 20 m × (7.41 + 12.1) mΩ/m, IEC 60228 Table 2
    [20, 2.5, 1.5, 1.2, 0.46824], // × 1.20 for 70 °C, IET Guidance Note 3 [from memory]
    [35, 1.5, 1, 1, 1.057], // 35 m × (12.1 + 18.1) mΩ/m, IEC 60228 Table 2
    [12, 6, 2.5, 1, 0.12588], // 12 m × (3.08 + 7.41) mΩ/m, IEC 60228 Table 2
  ])('%s m of %s/%s × %s → %s Ω', (lengthM, liveCsaMm2, cpcCsaMm2, temperatureFactor, expected) => {
    const result = expectedRadialR1PlusR2({ lengthM, liveCsaMm2, cpcCsaMm2, temperatureFactor });
    expect(result.ok).toBe(true);
    if (result.ok) {
      expect(result.ohm).toBeCloseTo(expected, 10);
      expect(result.source).toContain('IEC 60228');
    }
  });

  it('says why for a conductor size it does not hold', () => {
    expect(expectedRadialR1PlusR2({ lengthM: 10, liveCsaMm2: 0.75, cpcCsaMm2: 0.75 })).toMatchObject({ ok: false });
  });
});

describe('maximum cable length', () => {
  it('B32, Ze 0.35 Ω, 2.5/1.5 at 70 °C: (1.37 − 0.35) ÷ (19.51 mΩ/m × 1.20) = 43.57 m (formula; BS 7671:2018 Table 41.3, IEC 60228)', () => {
    const result = maxCableLength({ standard: '60898', type: 'B', ratingA: 32, disconnectionTimeS: 0.4, zeOhm: 0.35, liveCsaMm2: 2.5, cpcCsaMm2: 1.5 });
    expect(result).toMatchObject({ ok: true, maxZsOhm: 1.37, usedLimitOhm: 1.37 });
    if (result.ok) expect(result.lengthM).toBeCloseTo(1.02 / (0.01951 * 1.2), 9);
  });

  it('with the 0.8 rule on cold conductors: (0.8 × 1.37 − 0.35) ÷ 19.51 mΩ/m = 38.24 m (rule of thumb, IET Guidance Note 3 [from memory])', () => {
    const result = maxCableLength({ standard: '60898', type: 'B', ratingA: 32, disconnectionTimeS: 0.4, zeOhm: 0.35, liveCsaMm2: 2.5, cpcCsaMm2: 1.5, basis: 'measured-0.8' });
    expect(result.ok).toBe(true);
    if (result.ok) expect(result.lengthM).toBeCloseTo((0.8 * 1.37 - 0.35) / 0.01951, 9);
  });

  it('refuses when Ze already reaches the limit (C32: 0.68 Ω, formula Cmin·U0/Ia)', () => {
    expect(maxCableLength({ standard: '60898', type: 'C', ratingA: 32, disconnectionTimeS: 0.4, zeOhm: 0.8, liveCsaMm2: 2.5, cpcCsaMm2: 1.5 })).toMatchObject({ ok: false });
  });
});

describe('ring and spur expectations', () => {
  it('r1 0.52, rn 0.53, r2 0.85 → L-cpc 0.3425, L-N 0.2625, at the ends 0.3226 Ω (formulas (r1+r2)/4, (r1+rn)/4, r1·r2/(r1+r2))', () => {
    const result = expectedRingReading({ r1: 0.52, rn: 0.53, r2: 0.85 });
    expect(result.ok).toBe(true);
    if (result.ok) {
      expect(result.lineCpcOhm).toBeCloseTo(0.3425, 12);
      expect(result.lineNeutralOhm).toBeCloseTo(0.2625, 12);
      expect(result.lineCpcAtEndsOhm).toBeCloseTo((0.52 * 0.85) / 1.37, 12);
    }
  });

  it('a 5 m spur of 2.5/1.5 from a ring reading 0.35 Ω: 0.35 + 5 × 19.51 mΩ = 0.4476 Ω (IEC 60228 Table 2, series)', () => {
    const result = expectedSpurR1PlusR2({ ringValueOhm: 0.35, lengthM: 5, liveCsaMm2: 2.5, cpcCsaMm2: 1.5 });
    expect(result.ok).toBe(true);
    if (result.ok) expect(result.ohm).toBeCloseTo(0.44755, 12);
  });
});

describe('ringProfile verdicts', () => {
  // r1 0.50, r2 0.82 Ω: (r1+r2)/4 = 0.33 Ω (formula), r1·r2/(r1+r2) = 0.3106 Ω at the ends.
  const r1 = 0.5;
  const r2 = 0.82;

  it('reads a sound ring as consistent, recording the highest reading', () => {
    const profile = ringProfile({ r1, rn: 0.5, r2, readings: [0.31, 0.32, 0.33, 0.33, 0.32, 0.31] });
    expect(profile).toMatchObject({ verdict: 'consistent', recordValue: 0.33, suspects: [] });
    expect(profile.expected).toHaveLength(6);
  });

  it('names the socket well above the rest as a high point (a spur or loose termination)', () => {
    const profile = ringProfile({ r1, r2, readings: [0.31, 0.32, 0.33, 0.52, 0.32, 0.31] });
    expect(profile).toMatchObject({ verdict: 'high-point', recordValue: 0.52, suspects: [3] });
    expect(profile.message).toContain('Socket 4');
  });

  it('names sockets below (r1+r2)/4 as low points (an interconnection)', () => {
    const profile = ringProfile({ r1, r2, readings: [0.31, 0.25, 0.24, 0.33, 0.32, 0.31] });
    expect(profile).toMatchObject({ verdict: 'low-points', suspects: [1, 2] });
  });

  it('reads no reading anywhere as open', () => {
    expect(ringProfile({ r1, r2, readings: [null, Number.NaN, null] })).toMatchObject({ verdict: 'open', recordValue: null });
  });

  it('reads a parabola through zero at the ends as same ends linked (x(1−x)(r1+r2), formula)', () => {
    const readings = [1, 2, 3, 4, 5, 6, 7].map((i) => Math.round((i / 8) * (1 - i / 8) * (r1 + r2) * 100) / 100);
    expect(ringProfile({ r1, r2, readings }).verdict).toBe('same-end-linked');
  });

  it('mentions r1 and rn more than 0.05 Ω apart (common practice) and sockets with no reading', () => {
    const profile = ringProfile({ r1, rn: 0.6, r2, readings: [0.31, null, 0.33, 0.32] });
    expect(profile.message).toContain('0.05 Ω');
    expect(profile.message).toContain('No reading at socket 2');
  });

  it('diagnoses by the readings alone when r1 and r2 are not known', () => {
    const profile = ringProfile({ r1: Number.NaN, r2: Number.NaN, readings: [0.31, 0.32, 0.52, 0.32, 0.31] });
    expect(profile).toMatchObject({ verdict: 'high-point', suspects: [2] });
  });
});
