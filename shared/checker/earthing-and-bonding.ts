/**
 * Limits at the origin of an installation that the job rules compare against: the size of the main
 * protective bonding conductors and the TT earth electrode. Every value carries where it was read;
 * those written from memory say so.
 */

import type { earthingArrangements } from '../schemas/sites.ts';

type EarthingArrangement = (typeof earthingArrangements)[number];

export const REG_544_1_1_SOURCE =
  'BS 7671:2018 Regulation 544.1.1: main protective bonding at least half the csa of the earthing conductor, not less than 6 mm², need not exceed 25 mm² (copper) [memory]';
export const TABLE_54_8_SOURCE =
  'BS 7671:2018 Regulation 544.1.1 and Table 54.8: where PME conditions apply, main protective bonding by the csa of the supply neutral (copper) [memory]';

/**
 * Table 54.8 (PME): minimum copper main protective bonding conductor by the copper-equivalent csa of
 * the supply neutral. `neutralUpToMm2` null is "over 150 mm²". [memory]
 */
export const pmeBondingTable: ReadonlyArray<{ neutralUpToMm2: number | null; bondingMm2: number }> = [
  { neutralUpToMm2: 35, bondingMm2: 10 },
  { neutralUpToMm2: 50, bondingMm2: 16 },
  { neutralUpToMm2: 95, bondingMm2: 25 },
  { neutralUpToMm2: 150, bondingMm2: 35 },
  { neutralUpToMm2: null, bondingMm2: 50 },
];

export interface MainBondingQuery {
  earthing: EarthingArrangement | null;
  /** Csa of the installation's earthing conductor (mm²), when recorded. */
  earthingConductorCsaMm2: number | null;
  /** Csa of the supply's neutral (mm²), when known. */
  supplyNeutralCsaMm2: number | null;
}

export interface MainBondingMinimum {
  /** The smallest copper csa that satisfies every rule that applies (mm²). */
  minMm2: number;
  /** How it was reached, in words, e.g. "10 mm² for a 25 mm² supply neutral (PME)". */
  basis: string;
  source: string;
}

/**
 * The smallest main protective bonding conductor (copper) for an installation.
 *
 * - Every system: at least half the earthing conductor's csa and not less than 6 mm²; it need not
 *   exceed 25 mm² (544.1.1). The earthing conductor as installed stands for the one required.
 * - PME (taken as TN-C-S, as UK supplies are): Table 54.8 by the supply neutral's csa, and not less
 *   than the rule above. With the neutral's csa unknown, the table's smallest entry (10 mm², for a
 *   neutral up to 35 mm², the usual domestic supply) is the floor, and the basis says so.
 */
export function mainBondingMinimum(q: MainBondingQuery): MainBondingMinimum {
  const halfEarthing = q.earthingConductorCsaMm2 !== null ? q.earthingConductorCsaMm2 / 2 : null;
  const general = Math.min(25, Math.max(6, halfEarthing ?? 0));
  const generalBasis =
    halfEarthing === null
      ? 'at least 6 mm² (earthing conductor csa not recorded)'
      : halfEarthing > 25
        ? `25 mm² (half of the ${q.earthingConductorCsaMm2} mm² earthing conductor, capped at 25 mm²)`
        : halfEarthing < 6
          ? `6 mm² (half of the ${q.earthingConductorCsaMm2} mm² earthing conductor is less than the 6 mm² minimum)`
          : `half of the ${q.earthingConductorCsaMm2} mm² earthing conductor`;
  if (q.earthing !== 'TN-C-S') return { minMm2: general, basis: generalBasis, source: REG_544_1_1_SOURCE };

  const neutral = q.supplyNeutralCsaMm2;
  const row = neutral === null ? pmeBondingTable[0]! : pmeBondingTable.find((r) => r.neutralUpToMm2 === null || neutral <= r.neutralUpToMm2)!;
  const tableBasis =
    neutral === null
      ? `${row.bondingMm2} mm² for PME (supply neutral csa not recorded: its smallest entry, for a neutral up to 35 mm², used)`
      : `${row.bondingMm2} mm² for PME with a ${neutral} mm² supply neutral`;
  if (general > row.bondingMm2) {
    return { minMm2: general, basis: `${generalBasis} (more than the ${tableBasis})`, source: `${REG_544_1_1_SOURCE}; ${TABLE_54_8_SOURCE}` };
  }
  return { minMm2: row.bondingMm2, basis: tableBasis, source: TABLE_54_8_SOURCE };
}

/** TT: the touch voltage an RCD must hold down, RA × IΔn ≤ 50 V. */
export const TT_TOUCH_VOLTAGE_V = 50;
export const REG_411_5_3_SOURCE = 'BS 7671:2018 Regulation 411.5.3: RA × IΔn ≤ 50 V (RA: earth electrode plus protective conductor resistance)';
/** Above this an electrode's resistance may not be stable (soil drying or freezing). */
export const ELECTRODE_STABLE_MAX_OHM = 200;
export const ELECTRODE_STABILITY_SOURCE = 'BS 7671:2018 note to Table 41.5: an electrode resistance above 200 Ω may not be stable [memory] — common practice';
