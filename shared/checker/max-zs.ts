/**
 * Maximum earth fault loop impedance for a protective device (BS 7671:2018 Tables 41.2–41.4).
 */

import { divideRoundHalfUp, multiplyDecimal, toDecimal } from './decimal.ts';
import { deviceShortName, normaliseBreakerType, normaliseDeviceStandard, type DeviceFamily } from './devices.ts';
import {
  BREAKER_TRIP_SOURCE,
  breakerTripMultiples,
  RCBO_TRIP_SOURCE,
  C_MIN,
  fuseTables,
  RCD_TT_SOURCE,
  RCD_TT_TOUCH_VOLTAGE_V,
  UK_U0,
  type FuseFamily,
} from './reference-data.ts';

/** What `maxZs` needs: the device as written on the schedule and the disconnection time. */
export interface MaxZsQuery {
  /** Device standard as written: "60898", "BS EN 61009", "88-2", "3036", "1362"… */
  standard: string;
  /** Device type: B, C or D for circuit-breakers and RCBOs; ignored for fuses. */
  type?: string | null;
  /** Rated current In (A). */
  ratingA: number;
  /** Maximum disconnection time (s): 0.4 or 5 for the tables (0.2 and 1 for TT circuit-breakers). */
  disconnectionTimeS: number;
  /** Nominal voltage to earth U0 (V); 230 when omitted. */
  u0?: number | null;
}

export type MaxZsResult =
  | {
      ok: true;
      /** The maximum Zs (Ω) for the device, as the table gives it. */
      limitOhm: number;
      /** Table and formula behind the value. */
      source: string;
      /** The device as the trade names it, e.g. "B32". */
      device: string;
      /** The device family; `rcd` for the TT limit set by an RCD; `by-hand` for a limit the tester entered. */
      family: DeviceFamily | 'rcd' | 'by-hand';
    }
  | { ok: false; reason: string };

/**
 * Results by standard text → type text → rating → time → U0. A board asks for the same few devices
 * hundreds of times; nested maps answer without building a key string each time.
 */
type Level<K, V> = Map<K, V>;
const cache: Level<string, Level<string, Level<number, Level<number, Level<number, MaxZsResult>>>>> = new Map();
let cached = 0;

function level<K, V>(map: Map<K, V>, key: K, make: () => V): V {
  let value = map.get(key);
  if (value === undefined) {
    value = make();
    map.set(key, value);
  }
  return value;
}

/**
 * Maximum Zs for a device, with its source; or, when the device is not in the tables, the reason in
 * words (the tester may then enter the limit by hand).
 *
 * - Circuit-breakers (BS EN 60898) and RCBOs (BS EN 61009) of types B, C, D: Cmin·U0/Ia with
 *   Cmin 0.95 and Ia = 5, 10, 20 × In (type D at 5 s: 10 × In), rounded half-up to two decimals in
 *   exact decimal arithmetic (B32 → 1.37, C20 → 1.09, D50 → 0.22). Their trip is instantaneous, so
 *   any time from 0.1 s to 5 s uses the same Ia (D below 5 s uses 20 In).
 * - Fuses (BS 88-2 gG, BS 88-3, BS 3036, BS 1362): Table 41.2 at 0.4 s, Table 41.4 at 5 s; other
 *   times have no table. For U0 other than 230 V the tabulated value is scaled by U0 / 230.
 */
export function maxZs(query: MaxZsQuery): MaxZsResult {
  const u0 = query.u0 ?? UK_U0;
  if (cached > 10_000) {
    cache.clear();
    cached = 0;
  }
  const byU0 = level(
    level(level(level(cache, query.standard, () => new Map()), query.type ?? '', () => new Map()), query.ratingA, () => new Map()),
    query.disconnectionTimeS,
    () => new Map(),
  );
  let result = byU0.get(u0);
  if (result === undefined) {
    result = computeMaxZs(query, u0);
    byU0.set(u0, result);
    cached++;
  }
  return result;
}

function computeMaxZs(query: MaxZsQuery, u0: number): MaxZsResult {
  const standard = normaliseDeviceStandard(query.standard);
  if (!standard.ok) return standard;
  const { ratingA, disconnectionTimeS: time } = query;
  if (!Number.isFinite(ratingA) || ratingA <= 0) return { ok: false, reason: 'The device rating In is not recorded.' };
  if (!Number.isFinite(time) || time <= 0) return { ok: false, reason: 'The maximum disconnection time is not recorded.' };
  if (!Number.isFinite(u0) || u0 <= 0) return { ok: false, reason: 'The nominal voltage U0 is not known.' };
  const family = standard.family;
  if (family === 'bs-en-60898' || family === 'bs-en-61009') return breakerMaxZs(family, query.type ?? '', ratingA, time, u0);
  return fuseMaxZs(family, ratingA, time, u0);
}

function breakerMaxZs(family: 'bs-en-60898' | 'bs-en-61009', typeText: string, ratingA: number, time: number, u0: number): MaxZsResult {
  const type = normaliseBreakerType(typeText);
  const what = family === 'bs-en-60898' ? 'circuit-breaker' : 'RCBO';
  if (type === null) {
    return {
      ok: false,
      reason: typeText.trim() === '' ? `The ${what} type (B, C or D) is not recorded.` : `"${typeText.trim()}" is not a ${what} type the tables hold (B, C or D).`,
    };
  }
  if (time < 0.1) return { ok: false, reason: `No table covers a disconnection time of ${time} s (the tables start at 0.1 s).` };
  if (time > 5) return { ok: false, reason: `No table covers a disconnection time of ${time} s (the longest is 5 s).` };
  const multiple = time >= 5 ? breakerTripMultiples[type].fiveSeconds : breakerTripMultiples[type].instantaneous;
  const iaA = multiple * ratingA;
  const numerator = multiplyDecimal(toDecimal(C_MIN)!, toDecimal(u0)!);
  const denominator = toDecimal(iaA)!;
  const limitOhm = divideRoundHalfUp(numerator, denominator, 2);
  const table = time >= 5 ? 'BS 7671:2018 Table 41.4' : 'BS 7671:2018 Table 41.3';
  const trip = family === 'bs-en-61009' ? RCBO_TRIP_SOURCE : BREAKER_TRIP_SOURCE;
  const source = `${table}: Cmin·U0/Ia = 0.95 × ${u0} V / ${iaA} A (Ia = ${multiple} In, ${trip}), rounded half-up to 2 decimals`;
  return { ok: true, limitOhm, source, device: deviceShortName(family, type, ratingA), family };
}

function fuseMaxZs(family: FuseFamily, ratingA: number, time: number, u0: number): MaxZsResult {
  const table = fuseTables[family];
  const row = table.rows.find((r) => r.ratingA === ratingA);
  if (!row) {
    const held = table.rows.map((r) => r.ratingA).join(', ');
    return { ok: false, reason: `No ${table.label} of ${ratingA} A in the tables held (${held} A); enter its maximum Zs by hand.` };
  }
  let tabulated: number;
  let source: string;
  if (time === 0.4) {
    tabulated = row.maxZs04;
    source = table.source04;
  } else if (time === 5) {
    tabulated = row.maxZs5;
    source = table.source5;
  } else {
    return { ok: false, reason: `Fuse tables give 0.4 s and 5 s only, not ${time} s; enter the maximum Zs by hand.` };
  }
  const device = deviceShortName(family, null, ratingA);
  if (u0 === UK_U0) return { ok: true, limitOhm: tabulated, source, device, family };
  const scaled = divideRoundHalfUp(multiplyDecimal(toDecimal(tabulated)!, toDecimal(u0)!), toDecimal(UK_U0)!, 2);
  return { ok: true, limitOhm: scaled, source: `${source}, scaled by U0/230 V = ${u0}/230`, device, family };
}

/**
 * Maximum Zs where an RCD gives fault protection in a TT system: 50 V / IΔn, rounded half-up to a
 * whole ohm (30 mA → 1667 Ω).
 */
export function rcdMaxZsTT(ratedResidualMa: number): MaxZsResult {
  if (!Number.isFinite(ratedResidualMa) || ratedResidualMa <= 0) {
    return { ok: false, reason: 'The RCD rated residual current IΔn is not recorded.' };
  }
  // 50 V / (IΔn mA / 1000) = 50 000 / IΔn mA
  const limitOhm = divideRoundHalfUp(toDecimal(RCD_TT_TOUCH_VOLTAGE_V * 1000)!, toDecimal(ratedResidualMa)!, 0);
  return {
    ok: true,
    limitOhm,
    source: `${RCD_TT_SOURCE}: 50 V / ${ratedResidualMa} mA`,
    device: `${ratedResidualMa} mA RCD`,
    family: 'rcd',
  };
}
