/**
 * The rules over a whole board: every reading against the standard and against the circuit's other
 * readings. `checkBoard` is pure and deterministic; its output does not depend on the order of the
 * circuits (findings are sorted by circuit id, then code, columns and message).
 *
 * The work is split in two so a board can be re-checked cheaply after one edit:
 * 1. per circuit (`circuitFacts`): parse the cells and run every rule that needs only the circuit
 *    and the board's own details; the result can be cached per circuit object;
 * 2. across circuits (`crossCircuitFindings`): spurs against their rings, duplicate numbers, and the
 *    patterns that only show on a whole board (readings that look calculated).
 */

import type { CheckCircuit, CheckInput } from '../schemas/check.ts';
import { readingKeys, type ReadingKey } from '../schemas/columns.ts';
import type { Finding, Severity } from '../schemas/findings.ts';
import { cellGrammars, cellNumber, isRecorded, parseWithGrammar, plausibleRange, type ParsedCell } from './cell-grammar.ts';
import { formatFixed } from './decimal.ts';
import { normaliseBreakerType, normaliseDeviceStandard } from './devices.ts';
import { megohmText, ohmReading, ohmText, readingText } from './format.ts';
import { maxZs, rcdMaxZsTT, type MaxZsResult } from './max-zs.ts';
import {
  BREAKING_CAPACITY_SOURCE,
  conductorResistance,
  defaultDisconnectionTimeS,
  IPF_BELOW_EARTH_FAULT_FRACTION,
  isTimeDelayedRcd,
  IPF_CONSISTENCY_SOURCE,
  rcdFiveTimesDelayedLimit,
  rcdFiveTimesLimit,
  REDUCED_TEST_VOLTAGE_MINIMUM_MEGOHM,
  REDUCED_TEST_VOLTAGE_SOURCE,
  RING_CAPACITY_FRACTION,
  RING_CAPACITY_SOURCE,
  SOCKET_RCD_MAX_MA,
  SOCKET_RCD_MAX_RATING_A,
  SOCKET_RCD_SOURCE,
  tradeTemperatureFactors,
  TT_ELECTRODE_STABLE_SOURCE,
  TT_ELECTRODE_STABLE_UP_TO_OHM,
  TWIN_AND_EARTH_CAPACITY_SOURCE,
  twinAndEarthCapacityMethodC,
  ZERO_READING_SOURCE,
  IEC_60228_SOURCE,
  insulationMinimum,
  IR_INVESTIGATE_BELOW_MEGOHM,
  IR_INVESTIGATE_SOURCE,
  POLARITY_SOURCE,
  r1PlusR2PerMetre,
  rcdTimeLimit,
  RING_R1_RN_SOURCE,
  RING_R1_RN_TOLERANCE_OHM,
  ringLengthGuidance,
  TABLE_41_1_SOURCE,
  TABLE_64_SOURCE,
  unfusedSpurGuidance,
  ZS_RULE_OF_THUMB_FACTOR,
  ZS_RULE_OF_THUMB_SOURCE,
} from './reference-data.ts';
import { previousReadingCodes, pushPreviousReadingFindings } from './previous-readings.ts';
import { correctRingReading } from './ring.ts';

// ---------------------------------------------------------------------------------------------
// Codes
// ---------------------------------------------------------------------------------------------

/** Every finding code the checker emits, with its severity. */
export const findingCodes = {
  'cell-invalid': 'error',
  'lim-without-reason': 'error',
  'na-where-required': 'error',
  // Readings not recorded yet: to do, not a fault (they still block locking).
  'cells-missing': 'todo',
  'zs-over-max': 'error',
  'zs-over-80-percent': 'warning',
  'zs-limit-unknown': 'warning',
  'zs-above-expected': 'warning',
  'zs-below-expected': 'note',
  'zs-tt-electrode-unstable': 'note',
  'reading-zero': 'error',
  'ring-r1-rn-mismatch': 'warning',
  'ring-r2-ratio': 'warning',
  'ring-r1r2-inconsistent': 'warning',
  'ring-length-beyond-guidance': 'warning',
  'ring-spurs-exceed-points': 'note',
  'ring-readings-look-calculated': 'note',
  'spur-ring-missing': 'error',
  'spur-ring-unknown': 'error',
  'spur-below-ring': 'warning',
  'spur-r1r2-unexpected': 'warning',
  'ir-below-minimum': 'error',
  'ir-below-2-megohm': 'note',
  'polarity-wrong': 'error',
  'board-polarity-not-confirmed': 'warning',
  'rcd-time-over-limit': 'error',
  'rcd-time-below-delay': 'warning',
  'rcd-time-missing': 'todo',
  'rcd-5x-over-limit': 'error',
  'rcd-5x-below-delay': 'warning',
  'socket-circuit-without-rcd': 'warning',
  'csa-small-for-device': 'warning',
  'ipf-below-earth-fault-current': 'warning',
  'radial-r1r2-vs-length': 'warning',
  'rcd-type-missing': 'warning',
  'rcd-button-fail': 'error',
  'afdd-button-fail': 'error',
  'ipf-over-breaking-capacity': 'error',
  'circuit-untested': 'warning',
  'circuit-number-duplicate': 'warning',
  'readings-look-calculated': 'note',
  // A value in a detail column that the checker does not use (typed there by a slip, most often).
  'max-zs-given-unused': 'warning',
  ...previousReadingCodes,
} as const satisfies Record<string, Severity>;

export type FindingCode = keyof typeof findingCodes;

// ---------------------------------------------------------------------------------------------
// Tolerances (common practice; the checker's own choices are said in the sources)
// ---------------------------------------------------------------------------------------------

const EPS = 1e-9;
/** Zs against Zdb + R1+R2: allowed difference, the larger of 0.10 Ω and 15 %. */
const ZS_SUM_ALLOWANCE_OHM = 0.1;
const ZS_SUM_ALLOWANCE_FRACTION = 0.15;
const ZS_SUM_SOURCE = 'Zs ≈ Zdb + (R1+R2), allowance ± the larger of 0.10 Ω and 15 % — common practice';
/** r2 against r1 × the conductors' resistance ratio: ±10 %, plus 0.02 Ω for the readings' resolution. */
const RING_RATIO_FRACTION = 0.1;
const RING_RATIO_RESOLUTION_OHM = 0.02;
/** The ring's R1+R2 against (r1+r2)/4, and a spur against its ring. */
const RING_R1R2_ALLOWANCE_OHM = 0.05;
const SPUR_ALLOWANCE_OHM = 0.05;
const SPUR_ALLOWANCE_FRACTION = 0.1;
const REQUIRED_SOURCE = 'required on the schedule of test results for this kind of circuit — common practice';
const LIM_SOURCE = 'a limitation (LIM) is recorded with its reason — common practice';

// ---------------------------------------------------------------------------------------------
// Board context and per-circuit facts
// ---------------------------------------------------------------------------------------------

interface BoardContext {
  zdb: number | null;
  ipf: number | null;
  earthing: CheckInput['site']['earthing'];
  u0: number;
  /** Identifies the context: a cached circuit result is valid only under the same key. */
  key: string;
}

/** What the cross-circuit rules need to know of a circuit, and its own findings. */
interface CircuitFacts {
  circuit: CheckCircuit;
  parsed: Readonly<Record<ReadingKey, ParsedCell>>;
  /** The circuit's own findings, sorted. */
  local: readonly Finding[];
  /** Plain numbers (not ">N") of the readings the cross rules compare, else null. */
  ringR1: number | null;
  ringRn: number | null;
  ringR2: number | null;
  r1PlusR2: number | null;
  zs: number | null;
  /** Zs − Zdb equals R1+R2 to the hundredth. */
  zsIsZdbPlusR1R2: boolean;
  /** Whether Zs, R1+R2 and Zdb were all there to compare. */
  zsComparable: boolean;
  /** Ring readings in exact textbook proportion; null when not a ring or a reading is missing. */
  ringTextbook: boolean | null;
  /** The circuit number as compared for duplicates (trimmed, upper case, with its phase). */
  numberKey: string;
}

function contextOf(input: CheckInput): BoardContext {
  const zdb = input.board.zdbOhm;
  const ipf = input.board.ipfKa;
  const { earthing, nominalVoltageV } = input.site;
  return { zdb, ipf, earthing, u0: nominalVoltageV, key: `${zdb}|${ipf}|${earthing}|${nominalVoltageV}` };
}

function finding(
  code: FindingCode,
  circuitId: number | null,
  columns: string[],
  message: string,
  limit: string | null,
  source: string | null,
): Finding {
  return { code, severity: findingCodes[code], circuitId, columns, message, limit, source };
}

const EMPTY_CELL: ParsedCell = { kind: 'empty' };
// Module-level copies for the inner loop.
const KEYS: readonly ReadingKey[] = [...readingKeys];
const KEY_COUNT = KEYS.length;
const GRAMMARS = KEYS.map((key) => cellGrammars[key]);

function plainNumber(cell: ParsedCell): number | null {
  return cell.kind === 'number' ? cell.value : null;
}

function labelOf(key: ReadingKey): string {
  return cellGrammars[key].label;
}

function show(parsed: Readonly<Record<ReadingKey, ParsedCell>>, key: ReadingKey): string {
  return readingText(parsed[key], cellGrammars[key].unit);
}

function hundredths(value: number): number {
  return Math.round(value * 100);
}

/**
 * The reading columns a circuit of this kind needs for the schedule to be complete. For circuits
 * other than rings, R1+R2 may be given as R2 (measured with a long lead) instead.
 */
export function requiredColumns(circuit: Pick<CheckCircuit, 'kind' | 'rcdType' | 'afdd'>): ReadingKey[] {
  return [...requiredColumnsOf(circuit)];
}

const FINAL_COLUMNS: readonly ReadingKey[] = ['r1PlusR2', 'irTestVoltage', 'irLiveLive', 'irLiveEarth', 'polarity', 'zs'];
const RING_COLUMNS: readonly ReadingKey[] = ['ringR1', 'ringRn', 'ringR2', ...FINAL_COLUMNS];
/** The eight combinations of ring or not, RCD or not, AFDD or not, built once. */
const requiredByCase: ReadonlyArray<readonly ReadingKey[]> = [0, 1, 2, 3, 4, 5, 6, 7].map((bits) => {
  const columns = [...(bits & 1 ? RING_COLUMNS : FINAL_COLUMNS)];
  if (bits & 2) columns.push('rcdTimeMs', 'rcdButton');
  if (bits & 4) columns.push('afddButton');
  return columns;
});

function requiredColumnsOf(circuit: Pick<CheckCircuit, 'kind' | 'rcdType' | 'afdd'>): readonly ReadingKey[] {
  return requiredByCase[(circuit.kind === 'ring' ? 1 : 0) | (circuit.rcdType ? 2 : 0) | (circuit.afdd === 'yes' ? 4 : 0)]!;
}

/** The Zs limit of a circuit, with how it was chosen. */
interface ZsLimit {
  result: MaxZsResult;
  timeS: number | null;
  timeAssumed: boolean;
  /** Where an assumed time comes from (the Table 41.1 row for the site's U0). */
  timeSource: string;
  /** True when the limit is the TT RCD one (50 V / IΔn), to which the 0.8 rule does not apply. */
  rcdBased: boolean;
}

function zsLimitOf(c: CheckCircuit, ctx: BoardContext): ZsLimit {
  if (ctx.earthing === 'TT' && c.rcdType && c.rcdRatedResidualMa !== null) {
    return { result: rcdMaxZsTT(c.rcdRatedResidualMa), timeS: null, timeAssumed: false, timeSource: '', rcdBased: true };
  }
  const timeAssumed = c.maxDisconnectionS === null;
  const assumed = timeAssumed ? defaultDisconnectionTimeS({ earthing: ctx.earthing, kind: c.kind, ratingA: c.ratingA, u0: ctx.u0 }) : null;
  const timeS = c.maxDisconnectionS ?? assumed!.seconds;
  const timeSource = assumed?.source ?? TABLE_41_1_SOURCE;
  if (c.maxZsByHandOhm != null && (c.deviceStandard.trim() === '' || c.ratingA === null)) {
    return byHand(c, c.maxZsByHandOhm, 'the device is not fully recorded', timeS, timeAssumed, timeSource);
  }
  if (c.deviceStandard.trim() === '') {
    return { result: { ok: false, reason: 'no protective device is recorded' }, timeS, timeAssumed, timeSource, rcdBased: false };
  }
  if (c.ratingA === null) {
    return { result: { ok: false, reason: 'the device rating In is not recorded' }, timeS, timeAssumed, timeSource, rcdBased: false };
  }
  const result = maxZs({ standard: c.deviceStandard, type: c.deviceType, ratingA: c.ratingA, disconnectionTimeS: timeS, u0: ctx.u0 });
  if (!result.ok && c.maxZsByHandOhm != null) return byHand(c, c.maxZsByHandOhm, result.reason, timeS, timeAssumed, timeSource);
  if (!result.ok && timeAssumed) {
    return { result: { ok: false, reason: `${result.reason} (${timeS} s assumed from ${timeSource})` }, timeS, timeAssumed, timeSource, rcdBased: false };
  }
  return { result, timeS, timeAssumed, timeSource, rcdBased: false };
}

/**
 * A limit the tester entered by hand because the tables do not cover the device: used, and
 * labelled as such so a reviewer sees it was not looked up.
 */
function byHand(c: CheckCircuit, limitOhm: number, why: string, timeS: number, timeAssumed: boolean, timeSource: string): ZsLimit {
  const device = [c.deviceStandard.trim(), c.deviceType.trim(), c.ratingA === null ? '' : `${c.ratingA} A`].filter(Boolean).join(' ') || 'device';
  return {
    result: {
      ok: true,
      limitOhm,
      source: `entered by hand on this schedule (not in the published tables: ${why})`,
      device: `${device} (limit given by hand)`,
      family: 'by-hand',
    },
    timeS,
    timeAssumed,
    timeSource,
    rcdBased: false,
  };
}

function kindText(c: CheckCircuit): string {
  return c.kind === 'ring' ? 'a ring final' : c.kind === 'distribution' ? 'a distribution circuit' : `a ${c.kind}`;
}

/**
 * Imported functions used in the inner loop, held locally: some module loaders (tsx's CommonJS
 * interop among them) reach an imported binding through a getter on every call.
 */
const parse = parseWithGrammar;
const recorded = isRecorded;
const numberOf = cellNumber;

/** Runs every rule that needs only one circuit and the board's details. */
function circuitFacts(c: CheckCircuit, ctx: BoardContext): CircuitFacts {
  const out: Finding[] = [];
  const id = c.id;
  // Every key present from the start: one object shape for all circuits.
  const parsed: Record<ReadingKey, ParsedCell> = {
    ringR1: EMPTY_CELL,
    ringRn: EMPTY_CELL,
    ringR2: EMPTY_CELL,
    r1PlusR2: EMPTY_CELL,
    r2: EMPTY_CELL,
    irTestVoltage: EMPTY_CELL,
    irLiveLive: EMPTY_CELL,
    irLiveEarth: EMPTY_CELL,
    polarity: EMPTY_CELL,
    zs: EMPTY_CELL,
    rcdTimeMs: EMPTY_CELL,
    rcdTime5Ms: EMPTY_CELL,
    rcdButton: EMPTY_CELL,
    afddButton: EMPTY_CELL,
  };
  const cells = c.cells;
  let naOrLim = 0;
  let taken = 0;

  // Cell grammar and LIM reasons.
  for (let k = 0; k < KEY_COUNT; k++) {
    const key = KEYS[k]!;
    const cell = cells[key];
    if (cell === undefined) continue;
    const p = parse(GRAMMARS[k]!, cell.text);
    parsed[key] = p;
    switch (p.kind) {
      case 'invalid': {
        const limit = p.problem === 'range' || p.problem === 'test-voltage' ? plausibleRange(key) : null;
        const source = p.problem === 'test-voltage' ? TABLE_64_SOURCE : p.problem === 'range' ? 'plausible range of the column — common practice' : null;
        out.push(finding('cell-invalid', id, [key], p.message, limit, source));
        break;
      }
      case 'lim':
        naOrLim++;
        if (!cell.reason || cell.reason.trim() === '') {
          out.push(finding('lim-without-reason', id, [key], `LIM in ${labelOf(key)} without a reason: record why the test could not be done.`, null, LIM_SOURCE));
        }
        break;
      case 'na':
        naOrLim++;
        break;
      case 'empty':
        break;
      default:
        taken++;
    }
  }

  // Completeness and N/A where a reading is required.
  let missing: ReadingKey[] | null = null;
  for (const key of requiredColumnsOf(c)) {
    if (key === 'rcdTimeMs') continue; // the RCD rule says it in its own words
    const p = parsed[key];
    if (key === 'r1PlusR2' && c.kind !== 'ring') {
      const alternative = parsed.r2;
      if (recorded(p) || recorded(alternative) || p.kind === 'invalid' || alternative.kind === 'invalid') continue;
      const na = (['r1PlusR2', 'r2'] as const).filter((k) => parsed[k].kind === 'na');
      if (na.length > 0) {
        out.push(finding('na-where-required', id, [...na], `R1+R2 (or R2) is N/A, but ${kindText(c)} needs its continuity measured (or LIM with a reason).`, null, REQUIRED_SOURCE));
      } else {
        (missing ??= []).push(key);
      }
      continue;
    }
    if (p.kind === 'empty') (missing ??= []).push(key);
    else if (p.kind === 'na') {
      out.push(finding('na-where-required', id, [key], `${labelOf(key)} is N/A, but ${kindText(c)} needs it (or LIM with a reason).`, null, REQUIRED_SOURCE));
    }
  }
  if (missing !== null) {
    out.push(finding('cells-missing', id, missing, `Not recorded yet: ${missing.map(labelOf).join(', ')}.`, null, REQUIRED_SOURCE));
  }
  if (naOrLim >= 3 && taken === 0) {
    const naOrLimKeys = KEYS.filter((key) => parsed[key].kind === 'na' || parsed[key].kind === 'lim');
    out.push(
      finding('circuit-untested', id, naOrLimKeys, 'Every reading on this circuit is N/A or LIM: test it, or say why in the remarks.', null, 'a circuit on the schedule is tested, or the reason it was not is given — common practice'),
    );
  }

  const zsCell = parsed.zs;
  const zsValue = plainNumber(zsCell);
  // A Zs of 0 is not a measurement (said by its own finding): nothing to compare.
  const zs = zsValue === 0 ? null : zsValue;
  const r1PlusR2 = plainNumber(parsed.r1PlusR2);

  zsRules(c, ctx, parsed, out);
  if (c.maxZsByHandOhm != null) givenMaxZsRule(c, ctx, out);

  // Zs against Zdb + R1+R2.
  let zsIsZdbPlusR1R2 = false;
  const zsComparable = zs !== null && r1PlusR2 !== null && ctx.zdb !== null;
  if (zsComparable) {
    const zdb = ctx.zdb!;
    const expected = zdb + r1PlusR2!;
    const allowance = Math.max(ZS_SUM_ALLOWANCE_OHM, ZS_SUM_ALLOWANCE_FRACTION * expected);
    const difference = zs! - expected;
    if (Math.abs(difference) > allowance + EPS) {
      const sumText = `Zdb + R1+R2 = ${ohmReading(zdb)} + ${ohmReading(r1PlusR2!)} = ${ohmText(expected)} Ω`;
      const limit = `≈ ${ohmText(expected)} Ω (± ${formatFixed(allowance, 2)} Ω)`;
      if (difference > 0) {
        out.push(finding('zs-above-expected', id, ['zs', 'r1PlusR2'], `Zs ${ohmReading(zs!)} Ω is well above ${sumText}: a poor joint or connection in the loop?`, limit, ZS_SUM_SOURCE));
      } else {
        out.push(
          finding('zs-below-expected', id, ['zs', 'r1PlusR2'], `Zs ${ohmReading(zs!)} Ω is well below ${sumText}: parallel earth paths (bonding, pipework) are likely; the cpc itself is proven by R1+R2.`, limit, ZS_SUM_SOURCE),
        );
      }
    }
    zsIsZdbPlusR1R2 = hundredths(zs!) - hundredths(zdb) === hundredths(r1PlusR2!);
  }

  insulationRules(id, parsed, out);

  if (parsed.polarity.kind === 'fail') {
    out.push(finding('polarity-wrong', id, ['polarity'], 'Polarity is marked ✗ (not correct): put it right, or raise an observation.', '✓ (correct)', POLARITY_SOURCE));
  }

  rcdRules(c, parsed, out);

  if (ctx.ipf !== null && c.breakingKa !== null && ctx.ipf > c.breakingKa + EPS) {
    out.push(
      finding(
        'ipf-over-breaking-capacity',
        id,
        ['breakingKa'],
        `Ipf at the board ${ctx.ipf} kA is above the device's breaking capacity ${c.breakingKa} kA (unless an upstream device backs it up).`,
        `≤ ${c.breakingKa} kA`,
        BREAKING_CAPACITY_SOURCE,
      ),
    );
  }

  designRules(c, out);
  radialLengthRule(c, r1PlusR2, out);

  const ringR1 = plainNumber(parsed.ringR1);
  const ringRn = plainNumber(parsed.ringRn);
  const ringR2 = plainNumber(parsed.ringR2);
  let ringTextbook: boolean | null = null;
  if (c.kind === 'ring') ringTextbook = ringRules(c, ringR1, ringRn, ringR2, r1PlusR2, out);
  if (c.previous !== undefined) pushPreviousReadingFindings(c, parsed, out);

  out.sort(compareFindings);
  const numberKey = c.phase === null ? c.number.trim().toUpperCase() : `${c.number.trim().toUpperCase()}|${c.phase}`;
  return { circuit: c, parsed, local: out, ringR1, ringRn, ringR2, r1PlusR2, zs, zsIsZdbPlusR1R2, zsComparable, ringTextbook, numberKey };
}

function zsRules(c: CheckCircuit, ctx: BoardContext, parsed: Readonly<Record<ReadingKey, ParsedCell>>, out: Finding[]): void {
  const cell = parsed.zs;
  const value = numberOf(cell);
  if (value === null) return;
  if (cell.kind === 'number' && value === 0) {
    out.push(finding('reading-zero', c.id, ['zs'], 'Zs 0 Ω is not a measurement (every loop has some impedance): write the meter\'s reading, or LIM with a reason.', '> 0 Ω', ZERO_READING_SOURCE));
    return;
  }
  // ">200" is more than 200: beyond the stable range for certain.
  if (ctx.earthing === 'TT' && (cell.kind === 'over-range' ? value >= TT_ELECTRODE_STABLE_UP_TO_OHM - EPS : value > TT_ELECTRODE_STABLE_UP_TO_OHM + EPS)) {
    out.push(
      finding(
        'zs-tt-electrode-unstable',
        c.id,
        ['zs'],
        `Zs ${show(parsed, 'zs')} on a TT system: above ${TT_ELECTRODE_STABLE_UP_TO_OHM} Ω the earth electrode's resistance may not be stable (dry or frozen ground); worth a remark or a second electrode.`,
        `≤ ${TT_ELECTRODE_STABLE_UP_TO_OHM} Ω (for a stable electrode)`,
        TT_ELECTRODE_STABLE_SOURCE,
      ),
    );
  }
  const { result, timeS, timeAssumed, timeSource, rcdBased } = zsLimitOf(c, ctx);
  if (!result.ok) {
    out.push(finding('zs-limit-unknown', c.id, ['zs', 'deviceStandard'], `Zs ${show(parsed, 'zs')} not checked: ${lowerFirst(result.reason)}`, null, null));
    return;
  }
  const limit = result.limitOhm;
  // ">N" is more than N: over the limit for certain only when N already reaches it.
  const over = cell.kind === 'number' ? value > limit + EPS : value >= limit - EPS;
  const ruleLimit = limit * ZS_RULE_OF_THUMB_FACTOR;
  const overRule = !rcdBased && (cell.kind === 'number' ? value > ruleLimit + EPS : value >= ruleLimit - EPS);
  if (!over && !overRule) return;
  const shown = show(parsed, 'zs');
  const timeText = timeS === null ? '' : ` at ${timeS} s`;
  const assumedNote = timeAssumed ? ` (${timeS} s assumed from ${timeSource})` : '';
  const source = timeAssumed ? `${result.source}; ${timeS} s from ${timeSource}` : result.source;
  if (over) {
    out.push(finding('zs-over-max', c.id, ['zs'], `Zs ${shown} is over the maximum ${ohmText(limit)} Ω for a ${result.device}${timeText}${assumedNote}.`, `≤ ${ohmText(limit)} Ω`, source));
    return;
  }
  if (overRule) {
    out.push(
      finding(
        'zs-over-80-percent',
        c.id,
        ['zs'],
        `Zs ${shown} is above 0.8 × the maximum for a ${result.device}${timeText}: it may exceed ${ohmText(limit)} Ω when the conductors are hot.`,
        `≤ ${formatFixed(ruleLimit, 2)} Ω (0.8 × ${ohmText(limit)} Ω)`,
        `${ZS_RULE_OF_THUMB_SOURCE}; maximum from ${source}`,
      ),
    );
  }
}

/**
 * A maximum Zs given by hand is used only where the published tables do not cover the device. One
 * given where they do is ignored by every rule; that is said, because it is most often a reading
 * typed into the wrong column (the "Max Zs given" column sits beside Zs).
 */
function givenMaxZsRule(c: CheckCircuit, ctx: BoardContext, out: Finding[]): void {
  const { result, rcdBased } = zsLimitOf(c, ctx);
  if (!result.ok || result.family === 'by-hand') return;
  const used = rcdBased ? `the TT limit 50 V / IΔn (${ohmText(result.limitOhm)} Ω)` : `${ohmText(result.limitOhm)} Ω from ${result.source}`;
  out.push(
    finding(
      'max-zs-given-unused',
      c.id,
      ['maxZsByHandOhm'],
      `Max Zs given ${c.maxZsByHandOhm} Ω is not used: the limit is ${used}. Clear it, or was it a reading meant for another column (Zs)?`,
      `${ohmText(result.limitOhm)} Ω`,
      `limit from ${result.source}; a maximum Zs given by hand is used only for a device the published tables do not cover (Boardwalk’s rule)`,
    ),
  );
}

function lowerFirst(text: string): string {
  return text.length > 0 && text[0] !== '"' ? text[0]!.toLowerCase() + text.slice(1) : text;
}

function insulationRules(id: number, parsed: Readonly<Record<ReadingKey, ParsedCell>>, out: Finding[]): void {
  const voltageCell = parsed.irTestVoltage;
  const recordedVoltage = voltageCell.kind === 'number' ? voltageCell.value : null;
  const voltage = recordedVoltage ?? 500;
  const table = insulationMinimum(voltage);
  if (!table.ok) return;
  // A 250 V test on an ordinary circuit (equipment that could not be disconnected) keeps the
  // 1.0 MΩ minimum; Table 64's 0.5 MΩ at 250 V is for SELV and PELV circuits, which the schedule
  // does not mark, so the stricter value is used and the message says when 0.5 MΩ would apply.
  const reduced = voltage === 250;
  const minimum = reduced
    ? { ...table, minMegohm: REDUCED_TEST_VOLTAGE_MINIMUM_MEGOHM, source: REDUCED_TEST_VOLTAGE_SOURCE, circuits: `circuits up to 500 V tested at 250 V; SELV and PELV circuits ${megohmText(table.minMegohm)} MΩ (${table.source})` }
    : table;
  const assumed = recordedVoltage === null ? ' (test voltage not recorded: 500 V assumed)' : '';
  const selvNote = reduced ? ` (a circuit up to 500 V tested at 250 V; if this is a SELV or PELV circuit, ${megohmText(table.minMegohm)} MΩ applies: accept the finding with that reason)` : '';
  for (const key of ['irLiveLive', 'irLiveEarth'] as const) {
    const cell = parsed[key];
    if (cell.kind !== 'number') continue; // ">N" is at least N: the meter's range is above every minimum
    const value = cell.value;
    if (value < minimum.minMegohm - EPS) {
      out.push(
        finding(
          'ir-below-minimum',
          id,
          [key, 'irTestVoltage'],
          `${labelOf(key)} ${value} MΩ is below the minimum ${megohmText(minimum.minMegohm)} MΩ for a ${voltage} V test${assumed}${value >= table.minMegohm - EPS ? selvNote : ''}.`,
          `≥ ${megohmText(minimum.minMegohm)} MΩ at ${voltage} V`,
          `${minimum.source} (${voltage} V DC test: ${minimum.circuits})`,
        ),
      );
    } else if (value < IR_INVESTIGATE_BELOW_MEGOHM - EPS) {
      out.push(
        finding('ir-below-2-megohm', id, [key], `${labelOf(key)} ${value} MΩ passes but is low: worth investigating (a damp accessory, a connected load?).`, `≥ ${IR_INVESTIGATE_BELOW_MEGOHM} MΩ`, IR_INVESTIGATE_SOURCE),
      );
    }
  }
}

function rcdDescription(c: CheckCircuit): string {
  return `type ${c.rcdType}${c.rcdRatedResidualMa !== null ? `, ${c.rcdRatedResidualMa} mA` : ''}`;
}

function rcdRules(c: CheckCircuit, parsed: Readonly<Record<ReadingKey, ParsedCell>>, out: Finding[]): void {
  const id = c.id;
  const time = parsed.rcdTimeMs;
  if (c.rcdType) {
    const limits = rcdTimeLimit(c.rcdType);
    const limitText = limits.minMs === null ? limits.maxText : `${limits.minMs}–${limits.maxMs} ms`;

    if (time.kind === 'empty') {
      out.push(finding('rcd-time-missing', id, ['rcdTimeMs'], `Not recorded yet: the operating time of the RCD (${rcdDescription(c)}) at IΔn.`, limitText, limits.source));
    } else if (time.kind === 'na') {
      out.push(
        finding('na-where-required', id, ['rcdTimeMs'], `RCD time is N/A, but an RCD (${rcdDescription(c)}) is fitted: test it at IΔn (or LIM with a reason).`, limitText, limits.source),
      );
    }
    const value = numberOf(time);
    if (time.kind === 'number' && value === 0) {
      out.push(finding('reading-zero', id, ['rcdTimeMs'], 'RCD time 0 ms is not a measurement (no RCD operates in no time): write the meter\'s reading, or LIM with a reason.', '> 0 ms', ZERO_READING_SOURCE));
    } else if (value !== null) {
      const shown = show(parsed, 'rcdTimeMs');
      const over = time.kind === 'number' ? value > limits.maxMs + EPS : value >= limits.maxMs - EPS;
      if (over) {
        out.push(finding('rcd-time-over-limit', id, ['rcdTimeMs'], `RCD time ${shown} is over ${limits.maxMs} ms for a ${limits.label} (${rcdDescription(c)}).`, limitText, limits.source));
      } else if (limits.minMs !== null && time.kind === 'number' && value < limits.minMs - EPS) {
        out.push(
          finding(
            'rcd-time-below-delay',
            id,
            ['rcdTimeMs'],
            `RCD time ${shown} is faster than a ${limits.label} operates (${limitText}): check the device really is the S type recorded.`,
            limitText,
            limits.source,
          ),
        );
      }
    }
    rcdFiveTimesRules(c, parsed, out);
    if (parsed.rcdButton.kind === 'fail') {
      out.push(finding('rcd-button-fail', id, ['rcdButton'], 'The RCD test button did not operate the RCD (✗).', '✓ (operates)', limits.source));
    }
  } else if (numberOf(time) !== null || numberOf(parsed.rcdTime5Ms) !== null) {
    const columns = numberOf(time) !== null ? ['rcdTimeMs', 'rcdType'] : ['rcdTime5Ms', 'rcdType'];
    out.push(finding('rcd-type-missing', id, columns, 'An RCD time is recorded but no RCD type: record the type and IΔn so the time can be checked.', null, null));
  }
  if (parsed.afddButton.kind === 'fail') {
    out.push(finding('afdd-button-fail', id, ['afddButton'], 'The AFDD test button did not operate the device (✗).', '✓ (operates)', 'BS 7671:2018+A2 model forms: AFDD test button [from memory]'));
  }
}

const SOCKET_WORDS = /\b(sockets?|skts?|socket-outlets?)\b/i;

/**
 * Whether a circuit feeds socket-outlets: a ring final (in UK practice rings feed sockets), or a
 * radial or spur whose description says so.
 */
function feedsSockets(c: CheckCircuit): boolean {
  return c.kind === 'ring' || (c.kind !== 'distribution' && SOCKET_WORDS.test(c.description));
}

/** Design checks on what the circuit is: they say "check the design", never that it is wrong. */
function designRules(c: CheckCircuit, out: Finding[]): void {
  const id = c.id;
  if (feedsSockets(c) && (c.ratingA === null || c.ratingA <= SOCKET_RCD_MAX_RATING_A + EPS)) {
    const noRcd = !c.rcdType;
    const tooInsensitive = !noRcd && c.rcdRatedResidualMa !== null && c.rcdRatedResidualMa > SOCKET_RCD_MAX_MA + EPS;
    if (noRcd || tooInsensitive) {
      out.push(
        finding(
          'socket-circuit-without-rcd',
          id,
          noRcd ? ['rcdType'] : ['rcdRatedResidualMa'],
          `${c.kind === 'ring' ? 'A ring final' : 'A socket-outlet circuit'}${c.ratingA === null ? '' : ` on ${c.ratingA} A`} ${
            noRcd ? 'has no RCD' : `has a ${c.rcdRatedResidualMa} mA RCD`
          }: socket-outlets up to ${SOCKET_RCD_MAX_RATING_A} A need additional protection by an RCD of ${SOCKET_RCD_MAX_MA} mA or less (outside a dwelling a documented risk assessment may omit it).`,
          `RCD, IΔn ≤ ${SOCKET_RCD_MAX_MA} mA`,
          SOCKET_RCD_SOURCE,
        ),
      );
    }
  }
  // Spurs take the ring's device, so their cable is judged with the ring's rules, not here.
  if (c.kind !== 'spur' && c.liveCsaMm2 !== null && c.ratingA !== null) {
    const capacity = twinAndEarthCapacityMethodC.get(c.liveCsaMm2);
    if (capacity !== undefined) {
      const ring = c.kind === 'ring';
      const needed = ring ? RING_CAPACITY_FRACTION * c.ratingA : c.ratingA;
      if (capacity < needed - EPS) {
        out.push(
          finding(
            'csa-small-for-device',
            id,
            ['liveCsaMm2', 'ratingA'],
            `${c.liveCsaMm2} mm² looks small for a ${c.ratingA} A device${ring ? ' on a ring' : ''}: flat twin-and-earth carries about ${capacity} A even clipped direct, and less in walls, insulation or bunched. Check the design (it depends on the installation method).`,
            ring ? `Iz ≥ ${formatFixed(needed, 1)} A (0.67 × In, ring)` : `Iz ≥ ${c.ratingA} A (In)`,
            ring ? `${RING_CAPACITY_SOURCE}; Iz from ${TWIN_AND_EARTH_CAPACITY_SOURCE}` : TWIN_AND_EARTH_CAPACITY_SOURCE,
          ),
        );
      }
    }
  }
}

/** How far a radial's R1+R2 may stray from its length's values: the larger of 0.05 Ω and 15 %. */
const LENGTH_ALLOWANCE_OHM = 0.05;
const LENGTH_ALLOWANCE_FRACTION = 0.15;

/**
 * A radial (or distribution circuit) whose cable length is recorded: R1+R2 is a series path, so it
 * should lie between the length's value at 20 °C (a cold cable) and at 70 °C (× 1.20, a cable warm
 * from use), with an allowance for a length that is usually estimated.
 */
function radialLengthRule(c: CheckCircuit, r1PlusR2: number | null, out: Finding[]): void {
  const lengthM = c.cableLengthM;
  if (lengthM == null || r1PlusR2 === null || (c.kind !== 'radial' && c.kind !== 'distribution')) return;
  if (c.liveCsaMm2 === null || c.cpcCsaMm2 === null) return;
  const perMetre = r1PlusR2PerMetre(c.liveCsaMm2, c.cpcCsaMm2);
  if (!perMetre.ok) return;
  const factor = tradeTemperatureFactors.thermoplastic70.factor;
  const cold = (lengthM * perMetre.milliohmPerMetre) / 1000;
  const warm = cold * factor;
  const allowance = Math.max(LENGTH_ALLOWANCE_OHM, LENGTH_ALLOWANCE_FRACTION * cold);
  const low = cold - allowance;
  const high = warm + allowance;
  if (r1PlusR2 >= low - EPS && r1PlusR2 <= high + EPS) return;
  const why = r1PlusR2 > high ? 'a poor joint or termination, a longer run than recorded, or a smaller cpc?' : 'a shorter run than recorded, a larger cable, or parallel paths?';
  out.push(
    finding(
      'radial-r1r2-vs-length',
      c.id,
      ['r1PlusR2', 'cableLengthM'],
      `R1+R2 ${ohmReading(r1PlusR2)} Ω does not fit ${lengthM} m of ${c.liveCsaMm2}/${c.cpcCsaMm2} (${formatFixed(cold, 2)} Ω at 20 °C, ${formatFixed(warm, 2)} Ω at 70 °C): ${why}`,
      `${formatFixed(Math.max(0, low), 2)}–${formatFixed(high, 2)} Ω`,
      `length × ${perMetre.milliohmPerMetre} mΩ/m (${IEC_60228_SOURCE}), × 1 to × ${factor} for 20–70 °C (${tradeTemperatureFactors.thermoplastic70.source}); allowance ± the larger of 0.05 Ω and 15 % of the 20 °C value — common practice`,
    ),
  );
}

/** The optional test at 5 × IΔn: ≤ 40 ms (general type), 50–150 ms (time-delayed). */
function rcdFiveTimesRules(c: CheckCircuit, parsed: Readonly<Record<ReadingKey, ParsedCell>>, out: Finding[]): void {
  const cell = parsed.rcdTime5Ms;
  const value = numberOf(cell);
  if (value === null) return;
  const id = c.id;
  if (cell.kind === 'number' && value === 0) {
    out.push(finding('reading-zero', id, ['rcdTime5Ms'], 'RCD time at 5 × IΔn 0 ms is not a measurement: write the meter\'s reading, or leave the optional test blank.', '> 0 ms', ZERO_READING_SOURCE));
    return;
  }
  const delayed = isTimeDelayedRcd(c.rcdType ?? '');
  const maxMs = delayed ? rcdFiveTimesDelayedLimit.maxMs : rcdFiveTimesLimit.maxMs;
  const limitText = delayed ? `${rcdFiveTimesDelayedLimit.minMs}–${rcdFiveTimesDelayedLimit.maxMs} ms` : `≤ ${rcdFiveTimesLimit.maxMs} ms`;
  const source = delayed ? rcdFiveTimesDelayedLimit.source : rcdFiveTimesLimit.source;
  const shown = show(parsed, 'rcdTime5Ms');
  const over = cell.kind === 'number' ? value > maxMs + EPS : value >= maxMs - EPS;
  if (over) {
    out.push(finding('rcd-5x-over-limit', id, ['rcdTime5Ms'], `RCD time at 5 × IΔn ${shown} is over ${maxMs} ms for a ${delayed ? 'time-delayed (S)' : 'general'} type (${rcdDescription(c)}).`, limitText, source));
  } else if (delayed && cell.kind === 'number' && value < rcdFiveTimesDelayedLimit.minMs - EPS) {
    out.push(
      finding('rcd-5x-below-delay', id, ['rcdTime5Ms'], `RCD time at 5 × IΔn ${shown} is faster than a time-delayed (S) type operates (${limitText}): check the type recorded.`, limitText, source),
    );
  }
}

/** The ring rules; returns whether the ring's readings are in exact textbook proportion. */
function ringRules(c: CheckCircuit, r1: number | null, rn: number | null, r2: number | null, r1PlusR2: number | null, out: Finding[]): boolean | null {
  const id = c.id;
  if (r1 !== null && rn !== null && Math.abs(r1 - rn) > RING_R1_RN_TOLERANCE_OHM + EPS) {
    out.push(
      finding(
        'ring-r1-rn-mismatch',
        id,
        ['ringR1', 'ringRn'],
        `r1 ${ohmReading(r1)} Ω and rn ${ohmReading(rn)} Ω differ by ${formatFixed(Math.abs(r1 - rn), 2)} Ω: a loose or broken conductor, or the wrong cable ends.`,
        `≤ ${RING_R1_RN_TOLERANCE_OHM} Ω apart`,
        RING_R1_RN_SOURCE,
      ),
    );
  }

  const live = c.liveCsaMm2 !== null ? conductorResistance(c.liveCsaMm2) : null;
  const cpc = c.cpcCsaMm2 !== null ? conductorResistance(c.cpcCsaMm2) : null;
  const liveMilliohm = live !== null && live.ok ? live.milliohmPerMetre : null;
  const cpcMilliohm = cpc !== null && cpc.ok ? cpc.milliohmPerMetre : null;
  const resistanceRatio = liveMilliohm !== null && cpcMilliohm !== null ? cpcMilliohm / liveMilliohm : null;

  if (r1 !== null && r2 !== null && r1 > 0 && resistanceRatio !== null) {
    const expectedR2 = resistanceRatio * r1;
    const allowance = RING_RATIO_FRACTION * expectedR2 + RING_RATIO_RESOLUTION_OHM;
    if (Math.abs(r2 - expectedR2) > allowance + EPS) {
      const sizes = `${c.liveCsaMm2}/${c.cpcCsaMm2}`;
      out.push(
        finding(
          'ring-r2-ratio',
          id,
          ['ringR1', 'ringR2'],
          `r2/r1 = ${formatFixed(r2 / r1, 2)} (r1 ${ohmReading(r1)} Ω, r2 ${ohmReading(r2)} Ω), but ${sizes} cable gives ${formatFixed(resistanceRatio, 2)}: wrong pairing of ends, or a poor joint?`,
          `r2 ≈ ${formatFixed(resistanceRatio, 2)} × r1 = ${formatFixed(expectedR2, 2)} Ω (± 10 %)`,
          `${IEC_60228_SOURCE}: ${cpcMilliohm} / ${liveMilliohm} = ${formatFixed(resistanceRatio, 2)}; ± 10 % — common practice`,
        ),
      );
    }
  }

  if (r1 !== null && r2 !== null && r1PlusR2 !== null && r1 + r2 > 0) {
    const quarter = (r1 + r2) / 4;
    const ends = (r1 * r2) / (r1 + r2);
    const source = 'formula: cross-connected ring, (r1+r2)/4 at mid-ring, r1·r2/(r1+r2) at the ends; ± 0.05 Ω — common practice';
    if (r1PlusR2 > quarter + RING_R1R2_ALLOWANCE_OHM + EPS) {
      // About (r1+r2)/2 — twice the sound value — is what a wrongly linked cross-connection gives.
      const half = (r1 + r2) / 2;
      const why =
        Math.abs(r1PlusR2 - half) <= RING_R1R2_ALLOWANCE_OHM + EPS
          ? `about (r1+r2)/2 = ${formatFixed(half, 2)} Ω, twice the most a correctly cross-connected ring reads. With only one of the two cross-connections made (or one loose) the ring is a single path and a socket mid-ring reads (r1+r2)/2: were both ends linked, line to the opposite cpc, at step 3?`
          : 'a spur, a loose termination, or a reading at the wrong point.';
      out.push(
        finding('ring-r1r2-inconsistent', id, ['r1PlusR2', 'ringR1', 'ringR2'], `R1+R2 ${ohmReading(r1PlusR2)} Ω is above (r1+r2)/4 = ${formatFixed(quarter, 2)} Ω: ${why}`, quarterLimit(quarter), source),
      );
    } else if (r1PlusR2 < ends - RING_R1R2_ALLOWANCE_OHM - EPS) {
      out.push(
        finding(
          'ring-r1r2-inconsistent',
          id,
          ['r1PlusR2', 'ringR1', 'ringR2'],
          `R1+R2 ${ohmReading(r1PlusR2)} Ω is below what any socket of this ring can read (${formatFixed(ends, 2)}–${formatFixed(quarter, 2)} Ω): an interconnection, or the ends linked wrongly.`,
          quarterLimit(quarter),
          source,
        ),
      );
    }
  }

  if (r1 !== null && c.liveCsaMm2 === ringLengthGuidance.liveCsaMm2 && c.cpcCsaMm2 === ringLengthGuidance.cpcCsaMm2 && isGuidanceDevice(c)) {
    const lineResistance = conductorResistance(ringLengthGuidance.liveCsaMm2);
    if (lineResistance.ok) {
      const lengthM = r1 / (lineResistance.milliohmPerMetre / 1000);
      if (lengthM > ringLengthGuidance.maxLengthM + EPS) {
        out.push(
          finding(
            'ring-length-beyond-guidance',
            id,
            ['ringR1'],
            `r1 ${ohmReading(r1)} Ω means about ${Math.round(lengthM)} m of 2.5 mm² cable, beyond the ~${ringLengthGuidance.maxLengthM} m guidance for 2.5/1.5 on a B32: check Zs and voltage drop, or the ends measured.`,
            `≤ ${ringLengthGuidance.maxLengthM} m (r1 ≤ ${formatFixed((ringLengthGuidance.maxLengthM * lineResistance.milliohmPerMetre) / 1000, 2)} Ω)`,
            `${ringLengthGuidance.source}; length = r1 ÷ ${lineResistance.milliohmPerMetre} mΩ/m (${IEC_60228_SOURCE})`,
          ),
        );
      }
    }
  }

  if (r1 === null || rn === null || r2 === null || r1PlusR2 === null) return null;
  // Textbook proportion: rn = r1, r2 = r1 × (area ratio or resistance ratio), R1+R2 = (r1+r2)/4, each
  // to the hundredth the readings are written in.
  const areaRatio = c.liveCsaMm2 !== null && c.cpcCsaMm2 !== null ? c.liveCsaMm2 / c.cpcCsaMm2 : 2.5 / 1.5;
  const ratio = resistanceRatio ?? 12.1 / 7.41;
  const r2Textbook = Math.abs(r2 - r1 * areaRatio) <= 0.005 + EPS || Math.abs(r2 - r1 * ratio) <= 0.005 + EPS;
  return hundredths(rn) === hundredths(r1) && r2Textbook && Math.abs(r1PlusR2 - (r1 + r2) / 4) <= 0.005 + EPS;
}

function quarterLimit(quarter: number): string {
  return `≈ ${formatFixed(quarter, 2)} Ω ((r1+r2)/4), ± ${RING_R1R2_ALLOWANCE_OHM} Ω`;
}

function isGuidanceDevice(c: CheckCircuit): boolean {
  if (c.ratingA !== ringLengthGuidance.ratingA) return false;
  const standard = normaliseDeviceStandard(c.deviceStandard);
  if (!standard.ok || (standard.family !== 'bs-en-60898' && standard.family !== 'bs-en-61009')) return false;
  return normaliseBreakerType(c.deviceType) === ringLengthGuidance.deviceType;
}

// ---------------------------------------------------------------------------------------------
// Across circuits
// ---------------------------------------------------------------------------------------------

/**
 * Where on its ring a spur starts, as a fraction: "0.4", "40%", "1/2", or "socket 4" / "4" with the
 * ring's number of points. Null when it cannot be read.
 */
export function spurOriginFraction(origin: string | null, ringPoints: number | null): number | null {
  if (origin === null) return null;
  const text = origin.trim().toLowerCase();
  const percent = /^(\d+(?:\.\d+)?)\s*%$/.exec(text);
  if (percent) return fractionOrNull(Number(percent[1]) / 100);
  const ratio = /^(\d+)\s*\/\s*(\d+)$/.exec(text);
  if (ratio) return fractionOrNull(Number(ratio[1]) / Number(ratio[2]));
  if (/^0?\.\d+$/.test(text)) return fractionOrNull(Number(text));
  const socket = /^(?:socket|skt|point|pt|no\.?|#)?\s*(\d+)$/.exec(text);
  if (socket && ringPoints !== null && ringPoints > 0) {
    const k = Number(socket[1]);
    return k >= 1 && k <= ringPoints ? k / (ringPoints + 1) : null;
  }
  return null;
}

/** Whether a spur's origin names a socket by number ("socket 4", "4") rather than a fraction. */
function isSocketNumber(origin: string | null): boolean {
  return origin !== null && /^(?:socket|skt|point|pt|no\.?|#)?\s*\d+$/.test(origin.trim().toLowerCase());
}

function fractionOrNull(x: number): number | null {
  return Number.isFinite(x) && x >= 0 && x <= 1 ? x : null;
}

function circuitName(c: CheckCircuit): string {
  return `circuit ${c.number}`;
}

/** Rules that compare circuits with each other, and the board's own details. */
function crossCircuitFindings(input: CheckInput, facts: readonly CircuitFacts[]): Finding[] {
  const out: Finding[] = [];
  const { zdbOhm, ipfKa } = input.board;
  if (zdbOhm !== null && ipfKa !== null && zdbOhm > 0) {
    const earthFaultKa = input.site.nominalVoltageV / zdbOhm / 1000;
    const floor = IPF_BELOW_EARTH_FAULT_FRACTION * earthFaultKa;
    if (ipfKa < floor - EPS) {
      out.push(
        finding(
          'ipf-below-earth-fault-current',
          null,
          [],
          `Ipf ${ipfKa} kA is far below U0 / Zdb = ${input.site.nominalVoltageV} V / ${ohmReading(zdbOhm)} Ω = ${formatFixed(earthFaultKa, 2)} kA: one of the two is probably written wrongly (a slipped decimal point, or A for kA).`,
          `≥ ${formatFixed(floor, 2)} kA (half of U0 / Zdb)`,
          IPF_CONSISTENCY_SOURCE,
        ),
      );
    }
  }
  if (!input.board.polarityConfirmed && facts.length > 0) {
    out.push(finding('board-polarity-not-confirmed', null, [], 'Polarity at the board is not confirmed.', '✓ (confirmed)', POLARITY_SOURCE));
  }

  // Duplicate circuit numbers (per phase on three-phase boards).
  const byNumber = new Map<string, CircuitFacts>();
  const duplicates = new Map<string, CircuitFacts[]>();
  const byId = new Map<number, CircuitFacts | 'ambiguous'>();
  for (const f of facts) {
    const first = byNumber.get(f.numberKey);
    if (first === undefined) byNumber.set(f.numberKey, f);
    else {
      const list = duplicates.get(f.numberKey);
      if (list) list.push(f);
      else duplicates.set(f.numberKey, [first, f]);
    }
    const id = f.circuit.id;
    const known = byId.get(id);
    byId.set(id, known === undefined ? f : 'ambiguous');
  }
  for (const list of duplicates.values()) {
    for (const f of list) {
      out.push(
        finding('circuit-number-duplicate', f.circuit.id, [], `Circuit number ${f.circuit.number.trim()}${f.circuit.phase ? ` (${f.circuit.phase})` : ''} is used by ${list.length} circuits on this board.`, null, null),
      );
    }
  }

  // Spurs against their rings.
  const spursPerRing = new Map<number, number>();
  for (const f of facts) {
    const spur = f.circuit;
    if (spur.kind !== 'spur') continue;
    if (spur.spurRingId === null) {
      out.push(finding('spur-ring-missing', spur.id, [], 'A spur must name the ring final it hangs from (link it to its ring).', null, 'a spur is checked against its ring — common practice'));
      continue;
    }
    const target = byId.get(spur.spurRingId);
    if (target === undefined || target === 'ambiguous' || target.circuit.kind !== 'ring') {
      const why =
        target === undefined
          ? 'which is not on this board'
          : target === 'ambiguous'
            ? 'an id used by more than one circuit'
            : `${circuitName(target.circuit)}, a ${target.circuit.kind === 'distribution' ? 'distribution circuit' : target.circuit.kind}, not a ring final`;
      out.push(finding('spur-ring-unknown', spur.id, [], `This spur hangs from ${target === undefined || target === 'ambiguous' ? `circuit id ${spur.spurRingId}, ` : ''}${why}.`, null, null));
      continue;
    }
    const ring = target;
    spursPerRing.set(ring.circuit.id, (spursPerRing.get(ring.circuit.id) ?? 0) + 1);
    spurRules(f, ring, out);
  }
  for (const [ringId, count] of spursPerRing) {
    const ring = byId.get(ringId) as CircuitFacts;
    const points = ring.circuit.points;
    if (points !== null && count > points) {
      out.push(
        finding('ring-spurs-exceed-points', ringId, ['points'], `${count} spurs hang from this ring, more than its ${points} points: check which are fused.`, `≤ ${points} spurs (points on the ring)`, unfusedSpurGuidance.source),
      );
    }
  }

  // Readings that look calculated rather than measured.
  let comparable = 0;
  const calculated: CircuitFacts[] = [];
  for (const f of facts) {
    if (!f.zsComparable) continue;
    comparable++;
    if (f.zsIsZdbPlusR1R2) calculated.push(f);
  }
  // Three or more circuits, and at least a third of those that can be compared: an exact match now
  // and then happens by chance on a big board.
  if (calculated.length >= 3 && calculated.length * 3 >= comparable) {
    for (const f of calculated) {
      out.push(
        finding(
          'readings-look-calculated',
          f.circuit.id,
          ['zs', 'r1PlusR2'],
          `Zs equals Zdb + R1+R2 exactly here and on ${calculated.length - 1} other circuits: please confirm these were measured.`,
          null,
          'a measured Zs is usually a little off Zdb + R1+R2 — common practice',
        ),
      );
    }
  }
  const rings = facts.filter((f) => f.ringTextbook !== null);
  if (rings.length >= 2 && rings.every((f) => f.ringTextbook === true)) {
    for (const f of rings) {
      out.push(
        finding(
          'ring-readings-look-calculated',
          f.circuit.id,
          ['ringR1', 'ringRn', 'ringR2', 'r1PlusR2'],
          `r1, rn, r2 and R1+R2 are in exact textbook proportion on all ${rings.length} rings: please confirm these were measured.`,
          null,
          'measured rings rarely match the conductor ratio and (r1+r2)/4 exactly — common practice',
        ),
      );
    }
  }
  return out;
}

function spurRules(spurFacts: CircuitFacts, ring: CircuitFacts, out: Finding[]): void {
  const spur = spurFacts.circuit;
  const measured = spurFacts.r1PlusR2;
  if (measured === null) return;
  const ringRecorded = ring.r1PlusR2;
  const ringName = circuitName(ring.circuit);
  if (ringRecorded !== null && measured < ringRecorded - SPUR_ALLOWANCE_OHM - EPS) {
    out.push(
      finding(
        'spur-below-ring',
        spur.id,
        ['r1PlusR2'],
        `Spur R1+R2 ${ohmReading(measured)} Ω is below its ring's ${ohmReading(ringRecorded)} Ω (${ringName}): a spur adds to the ring's value, so one of them is wrong.`,
        `≥ ${formatFixed(ringRecorded - SPUR_ALLOWANCE_OHM, 2)} Ω (ring ${ohmReading(ringRecorded)} Ω less ${SPUR_ALLOWANCE_OHM} Ω)`,
        'spur in series with the ring: R1+R2 = ring value at its origin + spur cable — common practice',
      ),
    );
    return;
  }
  if (spur.spurLengthM === null || spur.liveCsaMm2 === null || spur.cpcCsaMm2 === null) return;
  const perMetre = r1PlusR2PerMetre(spur.liveCsaMm2, spur.cpcCsaMm2);
  if (!perMetre.ok) return;
  const x = spurOriginFraction(spur.spurOriginPoint, ring.circuit.points);
  const cableOhm = (spur.spurLengthM * perMetre.milliohmPerMetre) / 1000;
  // "socket 4" says which socket, not where it is along the ring: the ring's value there is anywhere
  // in the sound range r1·r2/(r1+r2) … (r1+r2)/4, so the spur is judged against that range.
  if (x !== null && isSocketNumber(spur.spurOriginPoint) && ring.ringR1 !== null && ring.ringR2 !== null && ring.ringR1 + ring.ringR2 > 0) {
    const r1 = ring.ringR1;
    const r2 = ring.ringR2;
    const low = (r1 * r2) / (r1 + r2) + cableOhm;
    const high = (r1 + r2) / 4 + cableOhm;
    const allowance = Math.max(SPUR_ALLOWANCE_OHM, SPUR_ALLOWANCE_FRACTION * high);
    if (measured < low - allowance - EPS || measured > high + allowance + EPS) {
      out.push(
        finding(
          'spur-r1r2-unexpected',
          spur.id,
          ['r1PlusR2'],
          `Spur R1+R2 ${ohmReading(measured)} Ω; expected ${formatFixed(low, 2)}–${formatFixed(high, 2)} Ω: the ring reads ${formatFixed(low - cableOhm, 2)}–${formatFixed(high - cableOhm, 2)} Ω at a socket (from r1 and r2, wherever ${spur.spurOriginPoint!.trim()} is) + ${spur.spurLengthM} m of ${spur.liveCsaMm2}/${spur.cpcCsaMm2} at ${perMetre.milliohmPerMetre} mΩ/m.`,
          `${formatFixed(Math.max(0, low - allowance), 2)}–${formatFixed(high + allowance, 2)} Ω`,
          `ring range r1·r2/(r1+r2) … (r1+r2)/4 + length × R1+R2 per metre (${IEC_60228_SOURCE}); allowance ± the larger of 0.05 Ω and 10 % — common practice`,
        ),
      );
    }
    return;
  }
  let ringValue: number | null = null;
  let basis: 'origin' | 'recorded' | 'quarter' = 'recorded';
  if (x !== null && ring.ringR1 !== null && ring.ringR2 !== null && ring.ringR1 + ring.ringR2 > 0) {
    ringValue = correctRingReading(ring.ringR1, ring.ringR2, x);
    basis = 'origin';
  } else if (ringRecorded !== null) {
    ringValue = ringRecorded;
  } else if (ring.ringR1 !== null && ring.ringR2 !== null) {
    ringValue = (ring.ringR1 + ring.ringR2) / 4;
    basis = 'quarter';
  }
  if (ringValue === null) return;
  const expected = ringValue + cableOhm;
  const allowance = Math.max(SPUR_ALLOWANCE_OHM, SPUR_ALLOWANCE_FRACTION * expected);
  if (Math.abs(measured - expected) > allowance + EPS) {
    const ringValueText =
      basis === 'origin'
        ? `ring ${formatFixed(ringValue, 2)} Ω at its origin (${spur.spurOriginPoint!.trim()}, from r1 and r2)`
        : basis === 'recorded'
          ? `ring ${ohmReading(ringValue)} Ω (its R1+R2)`
          : `ring ${formatFixed(ringValue, 2)} Ω ((r1+r2)/4)`;
    out.push(
      finding(
        'spur-r1r2-unexpected',
        spur.id,
        ['r1PlusR2'],
        `Spur R1+R2 ${ohmReading(measured)} Ω; expected about ${formatFixed(expected, 2)} Ω: ${ringValueText} + ${spur.spurLengthM} m of ${spur.liveCsaMm2}/${spur.cpcCsaMm2} at ${perMetre.milliohmPerMetre} mΩ/m.`,
        `≈ ${formatFixed(expected, 2)} Ω (± ${formatFixed(allowance, 2)} Ω)`,
        `ring value at the origin + length × R1+R2 per metre (${IEC_60228_SOURCE}); allowance ± the larger of 0.05 Ω and 10 % — common practice`,
      ),
    );
  }
}

// ---------------------------------------------------------------------------------------------
// Ordering and the whole board
// ---------------------------------------------------------------------------------------------

function compareText(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/** The stable order of findings within one circuit: code, columns, message, then the rest. */
export function compareFindings(a: Finding, b: Finding): number {
  return (
    compareText(a.code, b.code) ||
    compareText(a.columns.join(','), b.columns.join(',')) ||
    compareText(a.message, b.message) ||
    compareText(a.severity, b.severity) ||
    compareText(a.limit ?? '', b.limit ?? '') ||
    compareText(a.source ?? '', b.source ?? '')
  );
}

/** Puts findings in the board's stable order: board-wide first, then by circuit id. */
function assemble(facts: readonly CircuitFacts[], cross: readonly Finding[]): Finding[] {
  const byCircuit = new Map<number, Finding[][]>();
  const boardWide: Finding[] = [];
  for (const f of facts) {
    if (f.local.length === 0) continue;
    const lists = byCircuit.get(f.circuit.id);
    if (lists) lists.push(f.local as Finding[]);
    else byCircuit.set(f.circuit.id, [f.local as Finding[]]);
  }
  for (const x of cross) {
    if (x.circuitId === null) {
      boardWide.push(x);
      continue;
    }
    const lists = byCircuit.get(x.circuitId);
    if (lists) lists.push([x]);
    else byCircuit.set(x.circuitId, [[x]]);
  }
  boardWide.sort(compareFindings);
  const ids = [...byCircuit.keys()].sort((a, b) => a - b);
  const out = boardWide;
  for (const id of ids) {
    const lists = byCircuit.get(id)!;
    if (lists.length === 1) {
      for (const x of lists[0]!) out.push(x);
      continue;
    }
    // Several lists for one id: a circuit with findings across circuits, or an id used twice.
    const merged = lists.flat().sort(compareFindings);
    for (const x of merged) out.push(x);
  }
  return out;
}

/**
 * Checks a whole board: every circuit's readings against the limits and against each other.
 * Deterministic; independent of the order of the circuits.
 */
export function checkBoard(input: CheckInput): Finding[] {
  const ctx = contextOf(input);
  const facts = input.circuits.map((c) => circuitFacts(c, ctx));
  return assemble(facts, crossCircuitFindings(input, facts));
}

/**
 * A checker that remembers each circuit's own findings between calls, for re-checking a board after
 * an edit. Circuits are recognised by object identity: replace a circuit object when it changes
 * (as an immutable update does) and never mutate one in place. The rules across circuits run on
 * every call; the result equals `checkBoard(input)`.
 */
export function createBoardChecker(): (input: CheckInput) => Finding[] {
  const cache = new WeakMap<CheckCircuit, CircuitFacts & { contextKey: string }>();
  return (input) => {
    const ctx = contextOf(input);
    const facts = input.circuits.map((c) => {
      const hit = cache.get(c);
      if (hit && hit.contextKey === ctx.key) return hit;
      const fresh = { ...circuitFacts(c, ctx), contextKey: ctx.key };
      cache.set(c, fresh);
      return fresh;
    });
    return assemble(facts, crossCircuitFindings(input, facts));
  };
}
