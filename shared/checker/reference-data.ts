/**
 * Published values the checker compares readings against, each beside the name of its source.
 *
 * Where a value was written from general knowledge of the trade rather than read from the
 * publication, its source says "[from memory]"; where it rests on a secondary reference,
 * "[secondary]". The fuse tables are the BS 7671:2018 values as reproduced on public reference pages
 * (medium confidence: each agrees with the 2008 value × 0.95, the change the 2018 edition made by
 * introducing Cmin).
 */

import { ELECTRODE_STABILITY_SOURCE, ELECTRODE_STABLE_MAX_OHM } from './earthing-and-bonding.ts';

// ---------------------------------------------------------------------------------------------
// Conductors
// ---------------------------------------------------------------------------------------------

export const IEC_60228_SOURCE = 'IEC 60228 Table 2 (plain copper, class 2, at 20 °C)';

/** Resistance of a plain copper conductor at 20 °C, in mΩ per metre (the same number as Ω/km). */
export interface ConductorResistance {
  csaMm2: number;
  milliohmPerMetre: number;
  source: string;
}

export const copperConductorResistances: readonly ConductorResistance[] = [
  { csaMm2: 1, milliohmPerMetre: 18.1, source: IEC_60228_SOURCE },
  { csaMm2: 1.5, milliohmPerMetre: 12.1, source: IEC_60228_SOURCE },
  { csaMm2: 2.5, milliohmPerMetre: 7.41, source: IEC_60228_SOURCE },
  { csaMm2: 4, milliohmPerMetre: 4.61, source: IEC_60228_SOURCE },
  { csaMm2: 6, milliohmPerMetre: 3.08, source: IEC_60228_SOURCE },
  { csaMm2: 10, milliohmPerMetre: 1.83, source: IEC_60228_SOURCE },
  { csaMm2: 16, milliohmPerMetre: 1.15, source: IEC_60228_SOURCE },
  { csaMm2: 25, milliohmPerMetre: 0.727, source: IEC_60228_SOURCE },
  { csaMm2: 35, milliohmPerMetre: 0.524, source: IEC_60228_SOURCE },
];

const resistanceByCsa = new Map(copperConductorResistances.map((r) => [r.csaMm2, r]));

export type Lookup<T> = ({ ok: true } & T) | { ok: false; reason: string };

/** The IEC 60228 resistance of a copper conductor of the given csa, or why there is none. */
export function conductorResistance(csaMm2: number): Lookup<{ milliohmPerMetre: number; source: string }> {
  const row = resistanceByCsa.get(csaMm2);
  if (!row) {
    const held = copperConductorResistances.map((r) => r.csaMm2).join(', ');
    return { ok: false, reason: `No resistance held for ${csaMm2} mm² copper (held: ${held} mm²).` };
  }
  return { ok: true, milliohmPerMetre: row.milliohmPerMetre, source: row.source };
}

/**
 * R1+R2 per metre at 20 °C: the line conductor's resistance plus the cpc's (2.5/1.5: 7.41 + 12.1 =
 * 19.51 mΩ/m). Follows from IEC 60228.
 */
export function r1PlusR2PerMetre(liveCsaMm2: number, cpcCsaMm2: number): Lookup<{ milliohmPerMetre: number; source: string }> {
  const live = conductorResistance(liveCsaMm2);
  if (!live.ok) return live;
  const cpc = conductorResistance(cpcCsaMm2);
  if (!cpc.ok) return cpc;
  // Sum in hundredths of a milliohm so 7.41 + 12.1 prints as 19.51, not 19.509999….
  const milliohmPerMetre = Math.round((live.milliohmPerMetre + cpc.milliohmPerMetre) * 1000) / 1000;
  return { ok: true, milliohmPerMetre, source: `${IEC_60228_SOURCE}: ${live.milliohmPerMetre} + ${cpc.milliohmPerMetre} mΩ/m` };
}

// ---------------------------------------------------------------------------------------------
// Temperature
// ---------------------------------------------------------------------------------------------

/**
 * Convention: conductor resistances are held at 20 °C. Measured continuity readings are compared
 * with them as they are (a test is done cold, near 20 °C). For a conductor at its operating
 * temperature the trade multiplies by 1.20 (70 °C thermoplastic) or 1.28 (90 °C thermosetting):
 * these are the defaults of the calculators that work at operating temperature. The IEC 60228
 * Annex B factor is available for anyone who wants the exact copper law instead.
 */
export const tradeTemperatureFactors = {
  thermoplastic70: {
    factor: 1.2,
    operatingC: 70,
    source: 'IET Guidance Note 3 [from memory]: 20 °C → 70 °C thermoplastic, 1 + 0.004 × 50',
  },
  thermosetting90: {
    factor: 1.28,
    operatingC: 90,
    source: 'IET Guidance Note 3 [from memory]: 20 °C → 90 °C thermosetting',
  },
} as const;

/** Copper's temperature coefficient of resistance at 20 °C, per °C (IEC 60228 Annex B). */
export const COPPER_ALPHA_20 = 0.00393;

/**
 * IEC 60228 Annex B: kt = 254.5 / (234.5 + t) corrects a copper resistance measured at t °C to
 * 20 °C (R20 = Rt × kt).
 */
export function iec60228Kt(temperatureC: number): number {
  return 254.5 / (234.5 + temperatureC);
}

/**
 * Factor that takes a 20 °C copper resistance to `temperatureC` by IEC 60228 Annex B (1 / kt);
 * 70 °C gives 1.196, the exact law behind the trade's 1.20.
 */
export function iec60228FactorFrom20C(temperatureC: number): number {
  return (234.5 + temperatureC) / 254.5;
}

// ---------------------------------------------------------------------------------------------
// Earth fault loop impedance
// ---------------------------------------------------------------------------------------------

/** Cmin, the minimum voltage factor (BS 7671:2018 Appendix 3 / Regulation 411.4.4). */
export const C_MIN = 0.95;
/** Nominal voltage to earth in the UK (V). */
export const UK_U0 = 230;

/**
 * Ia as a multiple of In for circuit-breakers (BS EN 60898) and RCBOs (BS EN 61009): the top of
 * each type's instantaneous trip range (B 3–5, C 5–10, D 10–20 In). At 5 s a type D may use
 * 10 In (BS 7671:2018 Table 41.4).
 */
export const breakerTripMultiples = {
  B: { instantaneous: 5, fiveSeconds: 5 },
  C: { instantaneous: 10, fiveSeconds: 10 },
  D: { instantaneous: 20, fiveSeconds: 10 },
} as const;
export const BREAKER_TRIP_SOURCE = 'BS EN 60898-1 instantaneous trip ranges (B 3–5, C 5–10, D 10–20 In)';
/** RCBOs take the same trip ranges from their own standard. */
export const RCBO_TRIP_SOURCE = 'BS EN 61009-1 instantaneous trip ranges (B 3–5, C 5–10, D 10–20 In)';

/** The rounding the tables use for the breaker limits. */
export const TABLE_ROUNDING = 'rounded half-up to 2 decimals';

export type FuseFamily = 'bs-88-2' | 'bs-88-3' | 'bs-3036' | 'bs-1362';

/** A fuse's maximum Zs (Ω) at 0.4 s and 5 s for U0 = 230 V. */
export interface FuseRow {
  ratingA: number;
  maxZs04: number;
  maxZs5: number;
}

export interface FuseTable {
  family: FuseFamily;
  label: string;
  rows: readonly FuseRow[];
  /** Table holding the 0.4 s values. */
  source04: string;
  /** Table holding the 5 s values. */
  source5: string;
}

const FUSE_NOTE = 'values as reproduced on public reference pages of the 2018 tables';

export const fuseTables: Readonly<Record<FuseFamily, FuseTable>> = {
  'bs-88-2': {
    family: 'bs-88-2',
    label: 'BS 88-2 gG fuse',
    rows: [
      { ratingA: 6, maxZs04: 7.8, maxZs5: 12.0 },
      { ratingA: 10, maxZs04: 4.65, maxZs5: 6.8 },
      { ratingA: 16, maxZs04: 2.43, maxZs5: 4.0 },
      { ratingA: 20, maxZs04: 1.68, maxZs5: 2.8 },
      { ratingA: 25, maxZs04: 1.29, maxZs5: 2.2 },
      { ratingA: 32, maxZs04: 0.99, maxZs5: 1.7 },
      { ratingA: 40, maxZs04: 0.75, maxZs5: 1.3 },
      { ratingA: 50, maxZs04: 0.57, maxZs5: 0.99 },
      { ratingA: 63, maxZs04: 0.44, maxZs5: 0.78 },
    ],
    source04: `BS 7671:2018 Table 41.2 (BS 88-2 gG; ${FUSE_NOTE})`,
    source5: `BS 7671:2018 Table 41.4 (BS 88-2 gG; ${FUSE_NOTE})`,
  },
  'bs-88-3': {
    family: 'bs-88-3',
    label: 'BS 88-3 fuse',
    rows: [
      { ratingA: 5, maxZs04: 9.93, maxZs5: 14.6 },
      { ratingA: 16, maxZs04: 2.3, maxZs5: 3.9 },
      { ratingA: 20, maxZs04: 1.93, maxZs5: 3.2 },
      // 32 A at 0.4 s: 0.87, not 0.91. 0.91 is the pre-2018 value (a trade article of 2015 gives
      // 0.72 Ω as its 0.8 × limit), and the 2018 edition multiplied every fuse value by Cmin 0.95:
      // 0.91 × 0.95 = 0.86–0.87; 0.87 is the value remembered from the 2018 table [from memory].
      { ratingA: 32, maxZs04: 0.87, maxZs5: 1.6 },
      { ratingA: 45, maxZs04: 0.57, maxZs5: 1.0 },
    ],
    source04: `BS 7671:2018 Table 41.2 (BS 88-3; ${FUSE_NOTE}; 32 A rechecked as the 2008 value × 0.95 [from memory])`,
    source5: `BS 7671:2018 Table 41.4 (BS 88-3; ${FUSE_NOTE})`,
  },
  'bs-3036': {
    family: 'bs-3036',
    label: 'BS 3036 semi-enclosed fuse',
    rows: [
      { ratingA: 5, maxZs04: 9.1, maxZs5: 16.8 },
      { ratingA: 15, maxZs04: 2.43, maxZs5: 5.08 },
      { ratingA: 20, maxZs04: 1.68, maxZs5: 3.64 },
      { ratingA: 30, maxZs04: 1.04, maxZs5: 2.51 },
    ],
    source04: `BS 7671:2018 Table 41.2 (BS 3036; ${FUSE_NOTE})`,
    source5: `BS 7671:2018 Table 41.4 (BS 3036; ${FUSE_NOTE})`,
  },
  'bs-1362': {
    family: 'bs-1362',
    label: 'BS 1362 fuse',
    rows: [
      { ratingA: 3, maxZs04: 15.6, maxZs5: 22.0 },
      { ratingA: 13, maxZs04: 2.3, maxZs5: 3.64 },
    ],
    source04: `BS 7671:2018 Table 41.2 (BS 1362; ${FUSE_NOTE})`,
    source5: `BS 7671:2018 Table 41.4 (BS 1362; ${FUSE_NOTE})`,
  },
};

/**
 * TT systems with the RCD giving fault protection: Zs ≤ 50 V / IΔn (30 mA → 1667 Ω, 100 mA → 500 Ω,
 * 300 mA → 167 Ω, 500 mA → 100 Ω).
 */
export const RCD_TT_TOUCH_VOLTAGE_V = 50;
export const RCD_TT_SOURCE = 'BS 7671:2018 411.5.3 and Table 41.5 (Zs ≤ 50 V / IΔn) [from memory]';

/**
 * On TT a loop impedance of hundreds of ohms is normal (the earth electrode is in the loop); above
 * 200 Ω the electrode's resistance may not be stable (soil drying out or freezing). A remark, not a
 * fault.
 */
export const TT_ELECTRODE_STABLE_UP_TO_OHM = ELECTRODE_STABLE_MAX_OHM;
export const TT_ELECTRODE_STABLE_SOURCE = ELECTRODE_STABILITY_SOURCE;

/** Measured Zs (at room temperature) against a tabulated maximum: measured ≤ 0.8 × tabulated. */
export const ZS_RULE_OF_THUMB_FACTOR = 0.8;
export const ZS_RULE_OF_THUMB_SOURCE =
  'rule of thumb 0.8 × tabulated maximum, conductors heat up under fault (IET Guidance Note 3 [from memory]) — common practice';

// ---------------------------------------------------------------------------------------------
// Disconnection times (Table 41.1)
// ---------------------------------------------------------------------------------------------

export const TABLE_41_1_SOURCE = 'BS 7671:2018 Table 41.1 / 411.3.2';

export interface DisconnectionTimeRow {
  earthing: 'TN' | 'TT';
  circuits: string;
  seconds: number;
  source: string;
}

/** Maximum disconnection times for U0 = 230 V. */
export const disconnectionTimes: readonly DisconnectionTimeRow[] = [
  { earthing: 'TN', circuits: 'final circuits ≤ 63 A with sockets, ≤ 32 A fixed', seconds: 0.4, source: TABLE_41_1_SOURCE },
  { earthing: 'TT', circuits: 'final circuits ≤ 63 A with sockets, ≤ 32 A fixed', seconds: 0.2, source: TABLE_41_1_SOURCE },
  { earthing: 'TN', circuits: 'distribution circuits and larger final circuits', seconds: 5, source: TABLE_41_1_SOURCE },
  { earthing: 'TT', circuits: 'distribution circuits and larger final circuits', seconds: 1, source: TABLE_41_1_SOURCE },
];

/**
 * Table 41.1 (a.c.) for final circuits up to 63 A with socket-outlets or 32 A fixed, by U0: the
 * time shortens as the voltage rises. Distribution circuits keep 5 s (TN) and 1 s (TT) at any U0
 * (411.3.2.3, 411.3.2.4).
 */
export interface FinalCircuitTimeRow {
  /** The row applies for U0 above `aboveV` up to and including `upToV`. */
  aboveV: number;
  upToV: number;
  tnSeconds: number;
  ttSeconds: number;
  source: string;
}

export const finalCircuitTimesByU0: readonly FinalCircuitTimeRow[] = [
  { aboveV: 50, upToV: 120, tnSeconds: 0.8, ttSeconds: 0.3, source: `${TABLE_41_1_SOURCE} (50 V < U0 ≤ 120 V) [from memory]` },
  { aboveV: 120, upToV: 230, tnSeconds: 0.4, ttSeconds: 0.2, source: `${TABLE_41_1_SOURCE} (120 V < U0 ≤ 230 V)` },
  { aboveV: 230, upToV: 400, tnSeconds: 0.2, ttSeconds: 0.07, source: `${TABLE_41_1_SOURCE} (230 V < U0 ≤ 400 V)` },
  { aboveV: 400, upToV: Number.POSITIVE_INFINITY, tnSeconds: 0.1, ttSeconds: 0.04, source: `${TABLE_41_1_SOURCE} (U0 > 400 V) [from memory]` },
];

/**
 * The disconnection time to assume when the schedule does not give one. A final circuit up to 63 A
 * takes the short time (the socket-outlet limit, which is the stricter reading when it is not known
 * whether the circuit feeds sockets); a distribution circuit or a larger final circuit the long one.
 */
export function defaultDisconnectionTimeS(params: {
  earthing: 'TN-S' | 'TN-C-S' | 'TT';
  kind: 'ring' | 'radial' | 'spur' | 'distribution';
  ratingA: number | null;
  /** Nominal voltage to earth (V); 230 when omitted. The final-circuit time follows it. */
  u0?: number | null;
}): { seconds: number; source: string } {
  const tt = params.earthing === 'TT';
  const longTime = params.kind === 'distribution' || (params.ratingA !== null && params.ratingA > 63);
  if (longTime) {
    const row = disconnectionTimes.find((r) => r.earthing === (tt ? 'TT' : 'TN') && r.seconds >= 1)!;
    return { seconds: row.seconds, source: row.source };
  }
  const u0 = params.u0 ?? UK_U0;
  const row = finalCircuitTimesByU0.find((r) => u0 > r.aboveV && u0 <= r.upToV) ?? finalCircuitTimesByU0[0]!;
  return { seconds: tt ? row.ttSeconds : row.tnSeconds, source: row.source };
}

// ---------------------------------------------------------------------------------------------
// Insulation resistance (Table 64)
// ---------------------------------------------------------------------------------------------

export const TABLE_64_SOURCE = 'BS 7671:2018 Table 64';

export interface InsulationMinimum {
  testVoltageV: number;
  minMegohm: number;
  circuits: string;
  source: string;
}

export const insulationMinima: readonly InsulationMinimum[] = [
  { testVoltageV: 250, minMegohm: 0.5, circuits: 'SELV and PELV', source: TABLE_64_SOURCE },
  { testVoltageV: 500, minMegohm: 1.0, circuits: 'up to and including 500 V, including FELV', source: TABLE_64_SOURCE },
  { testVoltageV: 1000, minMegohm: 1.0, circuits: 'above 500 V', source: TABLE_64_SOURCE },
];

/**
 * A 250 V DC test on a circuit of up to 500 V, made because surge protection or other equipment
 * could not be disconnected, still needs at least 1.0 MΩ; only SELV and PELV circuits take 0.5 MΩ.
 */
export const REDUCED_TEST_VOLTAGE_MINIMUM_MEGOHM = 1.0;
export const REDUCED_TEST_VOLTAGE_SOURCE =
  'BS 7671:2018 643.3.3: where SPDs or other equipment cannot be disconnected, a 250 V DC test may be used but the insulation resistance shall be at least 1 MΩ [from memory of the regulation\'s text; regulation number as remembered]';

/** The Table 64 minimum for a test voltage, or why there is none. */
export function insulationMinimum(testVoltageV: number): Lookup<InsulationMinimum> {
  const row = insulationMinima.find((r) => r.testVoltageV === testVoltageV);
  if (!row) return { ok: false, reason: `Table 64 has no row for ${testVoltageV} V; the test voltages are 250, 500 and 1000 V DC.` };
  return { ok: true, ...row };
}

/** Below this an insulation reading is worth investigating even though it passes (common practice). */
export const IR_INVESTIGATE_BELOW_MEGOHM = 2;
export const IR_INVESTIGATE_SOURCE = 'investigate below 2 MΩ (IET Guidance Note 3 [from memory]) — common practice';

// ---------------------------------------------------------------------------------------------
// RCDs
// ---------------------------------------------------------------------------------------------

export const RCD_TIME_SOURCE = 'BS EN 61008-1 / 61009-1; BS 7671:2018+A2 643.7 [regulation number from memory]';

export interface RcdTimeLimit {
  /** Shortest operating time allowed (time-delayed types only), ms. */
  minMs: number | null;
  /** Longest operating time allowed at IΔn, ms. */
  maxMs: number;
  /** The upper limit as text, "≤ 300 ms". */
  maxText: string;
  label: string;
  source: string;
}

export const rcdTimeLimits = {
  general: { minMs: null, maxMs: 300, maxText: '≤ 300 ms', label: 'general (non-delay) type', source: RCD_TIME_SOURCE },
  timeDelayed: { minMs: 130, maxMs: 500, maxText: '≤ 500 ms', label: 'time-delayed (S) type', source: RCD_TIME_SOURCE },
} as const satisfies Record<string, RcdTimeLimit>;

/** At 5 × IΔn, where recorded (additional protection): ≤ 40 ms. */
export const rcdFiveTimesLimit = { maxMs: 40, source: 'BS EN 61008-1 / 61009-1' } as const;

/** At 5 × IΔn, a time-delayed (S) type operates between 50 and 150 ms [from memory]. */
export const rcdFiveTimesDelayedLimit = { minMs: 50, maxMs: 150, source: 'BS EN 61008-1 / 61009-1, time-delayed (S) type at 5 × IΔn: 50–150 ms [from memory]' } as const;

/** Whether an RCD type as recorded ("S-AC", "S-A") is time-delayed. */
export function isTimeDelayedRcd(rcdType: string): boolean {
  return rcdType.trim().toUpperCase().startsWith('S');
}

/** Operating-time limits at IΔn for an RCD type as recorded on the schedule. */
export function rcdTimeLimit(rcdType: string): RcdTimeLimit {
  return isTimeDelayedRcd(rcdType) ? rcdTimeLimits.timeDelayed : rcdTimeLimits.general;
}

// ---------------------------------------------------------------------------------------------
// Breaking capacity, rings, spurs, polarity
// ---------------------------------------------------------------------------------------------

export const BREAKING_CAPACITY_SOURCE = 'BS 7671:2018 434.5.1';

export const POLARITY_SOURCE = 'BS 7671:2018 643.6 [from memory]';

/**
 * Additional protection by an RCD of IΔn ≤ 30 mA for socket-outlets rated up to 32 A
 * (BS 7671:2018 411.3.3; a documented risk assessment may omit it outside dwellings).
 */
export const SOCKET_RCD_MAX_MA = 30;
export const SOCKET_RCD_MAX_RATING_A = 32;
export const SOCKET_RCD_SOURCE = 'BS 7671:2018 411.3.3: socket-outlets up to 32 A have additional protection by an RCD of IΔn ≤ 30 mA';

/**
 * Current-carrying capacity (A) of flat twin-and-earth cable (70 °C thermoplastic, copper), at
 * 30 °C ambient, single circuit, in the most favourable common installation method: clipped direct
 * (reference method C). Any other method carries less, so a device rating above this value is too
 * large for the cable however it is installed; a rating at or below it may still be too large for
 * the method actually used. [from memory]
 */
export const twinAndEarthCapacityMethodC: ReadonlyMap<number, number> = new Map([
  [1, 16],
  [1.5, 20],
  [2.5, 27],
  [4, 37],
  [6, 47],
  [10, 64],
  [16, 85],
]);
export const TWIN_AND_EARTH_CAPACITY_SOURCE =
  'BS 7671:2018 Appendix 4 Table 4D5 (flat twin-and-earth, 70 °C thermoplastic), reference method C clipped direct [from memory]; other methods carry less';
/**
 * A ring final on 2.5 mm² cable may be protected at 30 or 32 A when the cable carries at least 20 A
 * (two legs share the load): Iz ≥ 0.67 × In [from memory: BS 7671:2018 433.1.204].
 */
export const RING_CAPACITY_FRACTION = 0.67;
export const RING_CAPACITY_SOURCE = 'BS 7671:2018 433.1.204: ring final Iz ≥ 0.67 In [from memory]';

/**
 * Ipf at a board is the larger of the prospective short-circuit and earth fault currents, so it is
 * at least the earth fault current U0 / Zdb. An Ipf far below that (under half) means one of the two
 * was written wrongly (common practice).
 */
export const IPF_BELOW_EARTH_FAULT_FRACTION = 0.5;
export const IPF_CONSISTENCY_SOURCE = 'Ipf ≥ prospective earth fault current U0 / Zdb (Ipf is the larger of PSCC and PEFC) — common practice';

/** A measured Zs or RCD operating time of exactly 0 is not a measurement. */
export const ZERO_READING_SOURCE = 'a loop impedance or an operating time is never exactly 0 — common practice';

/** End-to-end line and neutral of a ring should agree this closely (Ω). */
export const RING_R1_RN_TOLERANCE_OHM = 0.05;
export const RING_R1_RN_SOURCE = 'r1 and rn within 0.05 Ω — common practice';

/** Ring length guidance for 2.5/1.5 cable on a 32 A type B device. */
export const ringLengthGuidance = {
  liveCsaMm2: 2.5,
  cpcCsaMm2: 1.5,
  deviceType: 'B',
  ratingA: 32,
  maxLengthM: 106,
  source: 'IET On-Site Guide ring length guidance, about 106 m of 2.5/1.5 on a B32 [from memory / secondary]',
} as const;

export const unfusedSpurGuidance = {
  source: 'IET On-Site Guide: no more unfused spurs than points on the ring [secondary]',
} as const;
