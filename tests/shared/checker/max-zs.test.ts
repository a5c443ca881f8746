import { describe, expect, it } from 'vitest';
import { maxZs, normaliseDeviceStandard, rcdMaxZsTT } from '../../../shared/checker/index.ts';

/**
 * Circuit-breakers: Zs = Cmin·U0/Ia = 0.95 × 230 / (k·In) = 218.5 / (k·In), rounded half-up to two
 * decimals. The expected values below were worked out by hand with exact decimals (218.5 / 160 =
 * 1.365625 → 1.37; 218.5 / 1000 = 0.2185 → 0.22) and agree with BS 7671:2018 Table 41.3 (0.4 s) and
 * Table 41.4 (5 s) [the tables from memory].
 */
const ratings = [6, 10, 16, 20, 25, 32, 40, 50, 63, 80, 100, 125] as const;
const FORMULA = 'formula Cmin·U0/Ia, Cmin 0.95, U0 230 V, half-up; BS 7671:2018 Table 41.3 / 41.4';

// Type B, Ia = 5 In, the same at 0.4 s and 5 s.
const typeB = [7.28, 4.37, 2.73, 2.19, 1.75, 1.37, 1.09, 0.87, 0.69, 0.55, 0.44, 0.35];
// Type C, Ia = 10 In, the same at 0.4 s and 5 s.
const typeC = [3.64, 2.19, 1.37, 1.09, 0.87, 0.68, 0.55, 0.44, 0.35, 0.27, 0.22, 0.17];
// Type D at 0.4 s, Ia = 20 In.
const typeD04 = [1.82, 1.09, 0.68, 0.55, 0.44, 0.34, 0.27, 0.22, 0.17, 0.14, 0.11, 0.09];
// Type D at 5 s, Ia = 10 In (BS 7671:2018 Table 41.4: same values as type C).
const typeD5 = typeC;

const breakerRows = ratings.flatMap((ratingA, i) => [
  { type: 'B', ratingA, time: 0.4, expected: typeB[i]!, source: `${FORMULA} (Ia = 5 In)` },
  { type: 'B', ratingA, time: 5, expected: typeB[i]!, source: `${FORMULA} (Ia = 5 In)` },
  { type: 'C', ratingA, time: 0.4, expected: typeC[i]!, source: `${FORMULA} (Ia = 10 In)` },
  { type: 'C', ratingA, time: 5, expected: typeC[i]!, source: `${FORMULA} (Ia = 10 In)` },
  { type: 'D', ratingA, time: 0.4, expected: typeD04[i]!, source: `${FORMULA} (Ia = 20 In)` },
  { type: 'D', ratingA, time: 5, expected: typeD5[i]!, source: `${FORMULA} (Ia = 10 In at 5 s, Table 41.4)` },
]);

describe('maxZs for BS EN 60898 circuit-breakers and BS EN 61009 RCBOs', () => {
  it.each(breakerRows)('$type$ratingA at $time s → $expected Ω ($source)', ({ type, ratingA, time, expected }) => {
    for (const standard of ['60898', 'BS EN 61009-1']) {
      const result = maxZs({ standard, type, ratingA, disconnectionTimeS: time });
      expect(result).toMatchObject({ ok: true, limitOhm: expected });
      if (result.ok) expect(result.source).toContain(time === 5 ? 'Table 41.4' : 'Table 41.3');
    }
  });

  it('names the standard of the device: an RCBO cites BS EN 61009-1, a circuit-breaker BS EN 60898-1', () => {
    const rcbo = maxZs({ standard: 'BS EN 61009-1', type: 'B', ratingA: 32, disconnectionTimeS: 0.4 });
    const mcb = maxZs({ standard: '60898', type: 'B', ratingA: 32, disconnectionTimeS: 0.4 });
    expect(rcbo.ok && rcbo.source).toContain('BS EN 61009-1');
    expect(rcbo.ok && rcbo.source).not.toContain('60898');
    expect(mcb.ok && mcb.source).toContain('BS EN 60898-1');
  });

  it('rounds half-up in exact decimals where binary floats round down', () => {
    // 0.95 × 230 / (5 × 76) is exactly 0.575 on paper; in doubles it rounds to 0.57.
    expect(Math.round(((0.95 * 230) / 380) * 100) / 100).toBe(0.57);
    expect(maxZs({ standard: '60898', type: 'B', ratingA: 76, disconnectionTimeS: 0.4 })).toMatchObject({ limitOhm: 0.58 }); // formula 218.5 / 380 = 0.575, half-up
    expect(maxZs({ standard: '60898', type: 'D', ratingA: 50, disconnectionTimeS: 0.4 })).toMatchObject({ limitOhm: 0.22 }); // formula 0.2185, half-up (domain table example)
    expect(maxZs({ standard: '60898', type: 'B', ratingA: 20, disconnectionTimeS: 0.4 })).toMatchObject({ limitOhm: 2.19 }); // formula 2.185, half-up (domain table example)
  });

  it('uses the site U0 in the formula (240 V: 0.95 × 240 / 160 = 1.425 → 1.43, formula half-up)', () => {
    expect(maxZs({ standard: '60898', type: 'B', ratingA: 32, disconnectionTimeS: 0.4, u0: 240 })).toMatchObject({ ok: true, limitOhm: 1.43 });
  });

  it('says why when the type is missing or unknown, or the time is beyond the tables', () => {
    expect(maxZs({ standard: '60898', type: '', ratingA: 32, disconnectionTimeS: 0.4 })).toMatchObject({ ok: false, reason: expect.stringContaining('type (B, C or D)') });
    expect(maxZs({ standard: '60898', type: 'K', ratingA: 32, disconnectionTimeS: 0.4 })).toMatchObject({ ok: false, reason: expect.stringContaining('"K"') });
    expect(maxZs({ standard: '60898', type: 'B', ratingA: 32, disconnectionTimeS: 10 })).toMatchObject({ ok: false, reason: expect.stringContaining('5 s') });
  });
});

/**
 * Fuses: BS 7671:2018 Table 41.2 (0.4 s) and Table 41.4 (5 s), U0 230 V, as reproduced on public
 * reference pages of the 2018 tables (medium confidence; each is the 2008 value × 0.95).
 */
const fuseRows: Array<{ standard: string; ratingA: number; at04: number; at5: number; source: string }> = [
  ...(
    [
      [6, 7.8, 12.0],
      [10, 4.65, 6.8],
      [16, 2.43, 4.0],
      [20, 1.68, 2.8],
      [25, 1.29, 2.2],
      [32, 0.99, 1.7],
      [40, 0.75, 1.3],
      [50, 0.57, 0.99],
      [63, 0.44, 0.78],
    ] as const
  ).map(([ratingA, at04, at5]) => ({ standard: '88-2', ratingA, at04, at5, source: 'BS 7671:2018 Tables 41.2 / 41.4, BS 88-2 gG (public reference pages)' })),
  ...(
    [
      [5, 9.93, 14.6],
      [16, 2.3, 3.9],
      [20, 1.93, 3.2],
      [32, 0.87, 1.6], // 0.87: the pre-2018 0.91 × Cmin 0.95 [from memory], see reference-data.ts
      [45, 0.57, 1.0],
    ] as const
  ).map(([ratingA, at04, at5]) => ({ standard: 'BS 88-3', ratingA, at04, at5, source: 'BS 7671:2018 Tables 41.2 / 41.4, BS 88-3 (public reference pages)' })),
  ...(
    [
      [5, 9.1, 16.8],
      [15, 2.43, 5.08],
      [20, 1.68, 3.64],
      [30, 1.04, 2.51],
    ] as const
  ).map(([ratingA, at04, at5]) => ({ standard: '3036', ratingA, at04, at5, source: 'BS 7671:2018 Tables 41.2 / 41.4, BS 3036 (public reference pages)' })),
  ...(
    [
      [3, 15.6, 22.0],
      [13, 2.3, 3.64],
    ] as const
  ).map(([ratingA, at04, at5]) => ({ standard: 'BS1362', ratingA, at04, at5, source: 'BS 7671:2018 Tables 41.2 / 41.4, BS 1362 (public reference pages)' })),
];

describe('maxZs for fuses', () => {
  it.each(fuseRows)('$standard $ratingA A → $at04 Ω at 0.4 s, $at5 Ω at 5 s ($source)', ({ standard, ratingA, at04, at5 }) => {
    const short = maxZs({ standard, type: 'gG', ratingA, disconnectionTimeS: 0.4 });
    const long = maxZs({ standard, type: 'gG', ratingA, disconnectionTimeS: 5 });
    expect(short).toMatchObject({ ok: true, limitOhm: at04, source: expect.stringContaining('Table 41.2') });
    expect(long).toMatchObject({ ok: true, limitOhm: at5, source: expect.stringContaining('Table 41.4') });
  });

  it('has no value for a fuse at 0.2 s or a rating the tables do not hold', () => {
    expect(maxZs({ standard: '88-2', ratingA: 32, disconnectionTimeS: 0.2 })).toMatchObject({ ok: false, reason: expect.stringContaining('0.4 s and 5 s only') });
    expect(maxZs({ standard: '88-2', ratingA: 35, disconnectionTimeS: 0.4 })).toMatchObject({ ok: false, reason: expect.stringContaining('35 A') });
  });

  it('scales a tabulated fuse value by U0/230 (BS 88-2 32 A at 240 V: 0.99 × 240/230 = 1.033 → 1.03, formula)', () => {
    expect(maxZs({ standard: '88-2', ratingA: 32, disconnectionTimeS: 0.4, u0: 240 })).toMatchObject({ ok: true, limitOhm: 1.03 });
  });
});

describe('device standards as testers write them', () => {
  it.each([
    ['60898', 'bs-en-60898'],
    ['BS EN 60898', 'bs-en-60898'],
    ['bs en 60898-1', 'bs-en-60898'],
    ['EN60898', 'bs-en-60898'],
    ['61009', 'bs-en-61009'],
    ['BS EN 61009-1', 'bs-en-61009'],
    ['88-2', 'bs-88-2'],
    ['BS 88-2', 'bs-88-2'],
    ['BS88 pt 2', 'bs-88-2'],
    ['88-3', 'bs-88-3'],
    ['1361', 'bs-88-3'],
    ['3036', 'bs-3036'],
    ['BS 3036', 'bs-3036'],
    ['1362', 'bs-1362'],
  ])('"%s" is %s (common practice)', (text, family) => {
    expect(normaliseDeviceStandard(text)).toEqual({ ok: true, family });
  });

  it('refuses an unknown device with a reason in words', () => {
    expect(normaliseDeviceStandard('60947-2')).toMatchObject({ ok: false, reason: expect.stringContaining('by hand') });
    expect(normaliseDeviceStandard('BS 88')).toMatchObject({ ok: false, reason: expect.stringContaining('88-2') });
    expect(normaliseDeviceStandard('  ')).toMatchObject({ ok: false });
    expect(maxZs({ standard: 'MCCB', type: 'B', ratingA: 32, disconnectionTimeS: 0.4 })).toMatchObject({ ok: false, reason: expect.stringContaining('"MCCB"') });
  });
});

describe('TT with an RCD for fault protection', () => {
  it.each([
    [30, 1667],
    [100, 500],
    [300, 167],
    [500, 100],
  ])('IΔn %i mA → %i Ω (BS 7671:2018 Table 41.5, 50 V / IΔn [from memory])', (ma, expected) => {
    expect(rcdMaxZsTT(ma)).toMatchObject({ ok: true, limitOhm: expected });
  });
});
