/**
 * The calculators a tester reaches for: expected R1+R2 of a radial, the longest cable a device and
 * cable allow, a ring's expected cross-connected readings, and a spur's expected R1+R2.
 */

import { maxZs, type MaxZsQuery } from './max-zs.ts';
import { IEC_60228_SOURCE, r1PlusR2PerMetre, tradeTemperatureFactors, ZS_RULE_OF_THUMB_FACTOR, ZS_RULE_OF_THUMB_SOURCE } from './reference-data.ts';

/** A calculator's answer: the value with how it was worked out, or why it cannot be. */
export type Calculation<T> = ({ ok: true; source: string } & T) | { ok: false; reason: string };

function positive(value: number): boolean {
  return Number.isFinite(value) && value > 0;
}

/**
 * Expected R1+R2 of a radial circuit (a series path): length × (line + cpc resistance per metre) ×
 * temperature factor. The factor defaults to 1 (20 °C, what a cold continuity test reads); pass 1.20
 * for 70 °C thermoplastic at its operating temperature (IET Guidance Note 3 [from memory]) or
 * `iec60228FactorFrom20C(t)`.
 */
export function expectedRadialR1PlusR2(params: {
  lengthM: number;
  liveCsaMm2: number;
  cpcCsaMm2: number;
  temperatureFactor?: number;
}): Calculation<{ ohm: number; milliohmPerMetre: number }> {
  const factor = params.temperatureFactor ?? 1;
  if (!(params.lengthM >= 0) || !Number.isFinite(params.lengthM)) return { ok: false, reason: 'Give the cable length in metres.' };
  if (!positive(factor)) return { ok: false, reason: 'The temperature factor must be a positive number.' };
  const perMetre = r1PlusR2PerMetre(params.liveCsaMm2, params.cpcCsaMm2);
  if (!perMetre.ok) return perMetre;
  const ohm = (params.lengthM * perMetre.milliohmPerMetre * factor) / 1000;
  const factorText = factor === 1 ? 'at 20 °C' : `× ${factor}`;
  return {
    ok: true,
    ohm,
    milliohmPerMetre: perMetre.milliohmPerMetre,
    source: `${params.lengthM} m × ${perMetre.milliohmPerMetre} mΩ/m ${factorText} (${IEC_60228_SOURCE})`,
  };
}

/**
 * The longest run of a cable a device allows: (maximum Zs − Ze) ÷ (R1+R2 per metre × factor).
 *
 * Two bases:
 * - `operating-temperature` (default): the tabulated maximum against the conductors at operating
 *   temperature, factor 1.20 (70 °C thermoplastic, IET Guidance Note 3 [from memory]) unless given;
 * - `measured-0.8`: 0.8 × the tabulated maximum against cold (20 °C) conductors, the rule of thumb
 *   used to judge a measured Zs.
 * `zeOhm` is the loop impedance where the circuit starts: Ze at the origin, or Zdb at a board.
 */
export function maxCableLength(
  params: MaxZsQuery & {
    zeOhm: number;
    liveCsaMm2: number;
    cpcCsaMm2: number;
    basis?: 'operating-temperature' | 'measured-0.8';
    temperatureFactor?: number;
  },
): Calculation<{ lengthM: number; maxZsOhm: number; usedLimitOhm: number }> {
  const limit = maxZs(params);
  if (!limit.ok) return limit;
  if (!(params.zeOhm >= 0) || !Number.isFinite(params.zeOhm)) return { ok: false, reason: 'Give Ze (or Zdb) in ohms.' };
  const perMetre = r1PlusR2PerMetre(params.liveCsaMm2, params.cpcCsaMm2);
  if (!perMetre.ok) return perMetre;
  const basis = params.basis ?? 'operating-temperature';
  const factor = basis === 'measured-0.8' ? 1 : (params.temperatureFactor ?? tradeTemperatureFactors.thermoplastic70.factor);
  if (!positive(factor)) return { ok: false, reason: 'The temperature factor must be a positive number.' };
  const usedLimitOhm = basis === 'measured-0.8' ? limit.limitOhm * ZS_RULE_OF_THUMB_FACTOR : limit.limitOhm;
  const headroom = usedLimitOhm - params.zeOhm;
  if (headroom <= 0) {
    return { ok: false, reason: `Ze ${params.zeOhm} Ω already reaches the limit ${usedLimitOhm.toFixed(2)} Ω for a ${limit.device}: no length of cable is allowed.` };
  }
  const lengthM = headroom / ((perMetre.milliohmPerMetre * factor) / 1000);
  const basisText =
    basis === 'measured-0.8'
      ? `0.8 × ${limit.limitOhm} Ω (${ZS_RULE_OF_THUMB_SOURCE})`
      : `${limit.limitOhm} Ω with conductors × ${factor}`;
  return {
    ok: true,
    lengthM,
    maxZsOhm: limit.limitOhm,
    usedLimitOhm,
    source: `(${basisText} − Ze ${params.zeOhm} Ω) ÷ ${perMetre.milliohmPerMetre} mΩ/m; ${limit.source}; ${IEC_60228_SOURCE}`,
  };
}

/**
 * A ring's expected cross-connected readings from its end-to-end readings: L-cpc (r1+r2)/4 (the
 * value to record as R1+R2), L-N (r1+rn)/4, and the L-cpc reading at a socket beside the board,
 * r1·r2/(r1+r2), the lowest a sound ring gives.
 */
export function expectedRingReading(params: { r1: number; rn?: number | null; r2: number }): Calculation<{
  lineCpcOhm: number;
  lineNeutralOhm: number | null;
  lineCpcAtEndsOhm: number;
}> {
  const { r1, r2 } = params;
  if (!positive(r1) || !positive(r2)) return { ok: false, reason: 'Give r1 and r2 (end to end) in ohms.' };
  const rn = params.rn ?? null;
  if (rn !== null && !positive(rn)) return { ok: false, reason: 'rn must be a positive number of ohms.' };
  return {
    ok: true,
    lineCpcOhm: (r1 + r2) / 4,
    lineNeutralOhm: rn === null ? null : (r1 + rn) / 4,
    lineCpcAtEndsOhm: (r1 * r2) / (r1 + r2),
    source: 'formula: two halves of the cross-connected ring in parallel, (r1+r2)/4 at mid-ring, r1·r2/(r1+r2) at the ends',
  };
}

/**
 * A spur's expected R1+R2: the ring's reading at the spur's origin plus the spur cable's own R1+R2
 * (length × resistance per metre of line plus cpc, × temperature factor, 1 by default).
 */
export function expectedSpurR1PlusR2(params: {
  ringValueOhm: number;
  lengthM: number;
  liveCsaMm2: number;
  cpcCsaMm2: number;
  temperatureFactor?: number;
}): Calculation<{ ohm: number; spurCableOhm: number }> {
  if (!(params.ringValueOhm >= 0) || !Number.isFinite(params.ringValueOhm)) {
    return { ok: false, reason: "Give the ring's R1+R2 at the spur's origin in ohms." };
  }
  const cable = expectedRadialR1PlusR2(params);
  if (!cable.ok) return cable;
  return {
    ok: true,
    ohm: params.ringValueOhm + cable.ohm,
    spurCableOhm: cable.ohm,
    source: `ring ${params.ringValueOhm} Ω at the origin + ${cable.source}`,
  };
}
