/**
 * Ring final circuits: what a cross-connected ring reads at each socket, and a diagnosis of a
 * socket-by-socket profile.
 *
 * The model. A ring is two conductors (line, and a second conductor: the cpc for step 3 of the
 * three-step test, the neutral for step 2) run from end A at the board round to end B. Call their
 * end-to-end resistances r1 and r2 (for step 2, pass rn as r2). A socket sits at fraction x of the
 * line's resistance from end A, and at fraction y of the second conductor's (x = y when both
 * conductors run in the same cable and are uniform; the functions accept them apart).
 *
 * Cross-connecting the ends turns the two conductors into ONE loop of resistance r1 + r2:
 * - opposite ends linked (the correct test: line of A to cpc of B, line of B to cpc of A): the loop
 *   runs along the line from A to B, across the link to the cpc at A, along the cpc from A to B and
 *   back across the other link; a line point sits at x·r1 along it, a cpc point at r1 + y·r2;
 * - same ends linked (line A to cpc A, line B to cpc B): the loop runs along the line from A to B,
 *   then back along the cpc from B to A; a cpc point sits at r1 + (1 − y)·r2.
 * A reading between two points a loop-distance d apart is d·(R − d)/R, R = r1 + r2: the two arcs
 * in parallel. For the correct test at x = y this is [r1·r2 + x(1−x)(r1−r2)²]/(r1+r2), peak
 * (r1+r2)/4 at mid-ring; for same-end linking it is x(1−x)(r1+r2), zero at the ends and the same
 * peak in the middle. An interconnection (bridge) adds chords to the loop; that network has at most
 * six nodes and is solved exactly by nodal analysis.
 */

import { formatFixed } from './decimal.ts';

/**
 * Where a socket is on the ring: one fraction (0 at end A, 1 at end B) for both conductors, or the
 * line's and the second conductor's fractions of their own end-to-end resistance.
 */
export type RingPoint = number | { line: number; cpc: number };

/** How the ring's ends were linked for the cross-connected test. */
export type RingLinking = 'opposite-ends' | 'same-ends';

function lineFraction(p: RingPoint): number {
  return typeof p === 'number' ? p : p.line;
}
function cpcFraction(p: RingPoint): number {
  return typeof p === 'number' ? p : p.cpc;
}

function loopPositionOfLine(r1: number, x: number): number {
  return x * r1;
}
function loopPositionOfCpc(r1: number, r2: number, y: number, linking: RingLinking): number {
  return linking === 'opposite-ends' ? r1 + y * r2 : r1 + (1 - y) * r2;
}

function validRing(r1: number, r2: number): boolean {
  return Number.isFinite(r1) && Number.isFinite(r2) && r1 >= 0 && r2 >= 0 && r1 + r2 > 0;
}

/**
 * The line-to-cpc reading at a socket of a cross-connected ring (or line-to-neutral: pass rn as
 * r2). Opposite ends linked (correct): [r1·r2 + x(1−x)(r1−r2)²]/(r1+r2) when both conductors share
 * the fraction x; same ends linked: x(1−x)(r1+r2). NaN for impossible inputs.
 */
export function ringReadingAt(params: { r1: number; r2: number; at: RingPoint; linking?: RingLinking }): number {
  const { r1, r2, at } = params;
  if (!validRing(r1, r2)) return Number.NaN;
  const linking = params.linking ?? 'opposite-ends';
  const total = r1 + r2;
  const d = Math.abs(loopPositionOfCpc(r1, r2, cpcFraction(at), linking) - loopPositionOfLine(r1, lineFraction(at)));
  return (d * (total - d)) / total;
}

/**
 * Closed form of a correct ring at fraction x (both conductors uniform):
 * [r1·r2 + x(1−x)(r1−r2)²]/(r1+r2).
 */
export function correctRingReading(r1: number, r2: number, x: number): number {
  return (r1 * r2 + x * (1 - x) * (r1 - r2) ** 2) / (r1 + r2);
}

/** Closed form of a ring whose same ends were linked, at fraction x: x(1−x)(r1+r2). */
export function sameEndsRingReading(r1: number, r2: number, x: number): number {
  return x * (1 - x) * (r1 + r2);
}

/** An interconnection: a cable joining two points of the ring, line to line and cpc to cpc. */
export interface RingBridge {
  from: RingPoint;
  to: RingPoint;
  /** Resistance of the bridge's line conductor (Ω); 0 for a direct link. */
  lineOhm: number;
  /** Resistance of the bridge's cpc (or neutral) conductor (Ω). */
  cpcOhm: number;
}

/**
 * The reading at a socket of a cross-connected ring with interconnections (bridges) across it:
 * exact, by nodal analysis of the loop reduced to the measured points and the bridge ends.
 */
export function bridgedRingReadingAt(params: {
  r1: number;
  r2: number;
  at: RingPoint;
  bridges: readonly RingBridge[];
  linking?: RingLinking;
}): number {
  const { r1, r2, at, bridges } = params;
  if (!validRing(r1, r2)) return Number.NaN;
  if (bridges.length === 0) return ringReadingAt(params);
  const linking = params.linking ?? 'opposite-ends';
  const total = r1 + r2;
  const positions: number[] = [
    loopPositionOfLine(r1, lineFraction(at)),
    loopPositionOfCpc(r1, r2, cpcFraction(at), linking),
  ];
  const chords: Array<{ a: number; b: number; ohm: number }> = [];
  for (const bridge of bridges) {
    if (!(bridge.lineOhm >= 0) || !(bridge.cpcOhm >= 0)) return Number.NaN;
    const a = positions.push(loopPositionOfLine(r1, lineFraction(bridge.from))) - 1;
    const b = positions.push(loopPositionOfLine(r1, lineFraction(bridge.to))) - 1;
    chords.push({ a, b, ohm: bridge.lineOhm });
    const c = positions.push(loopPositionOfCpc(r1, r2, cpcFraction(bridge.from), linking)) - 1;
    const d = positions.push(loopPositionOfCpc(r1, r2, cpcFraction(bridge.to), linking)) - 1;
    chords.push({ a: c, b: d, ohm: bridge.cpcOhm });
  }
  return loopResistance(total, positions, chords, 0, 1);
}

/**
 * Resistance between points `from` and `to` of a loop of total resistance `total`, the points given
 * by their position along the loop, with extra resistors (chords) between points. Coincident points
 * and zero-ohm chords are merged; the rest is solved by Gaussian elimination.
 */
function loopResistance(
  total: number,
  positions: readonly number[],
  chords: ReadonlyArray<{ a: number; b: number; ohm: number }>,
  from: number,
  to: number,
): number {
  const epsilon = 1e-12 * Math.max(1, total);
  // Wrap positions into [0, total).
  const wrapped = positions.map((p) => ((p % total) + total) % total);
  // Union-find over points: coincident points and zero-ohm chords are one node.
  const parent = wrapped.map((_, i) => i);
  const find = (i: number): number => {
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]!]!;
      i = parent[i]!;
    }
    return i;
  };
  const union = (a: number, b: number) => {
    const ra = find(a);
    const rb = find(b);
    if (ra !== rb) parent[ra] = rb;
  };
  const order = wrapped.map((_, i) => i).sort((a, b) => wrapped[a]! - wrapped[b]!);
  for (let k = 1; k < order.length; k++) {
    if (wrapped[order[k]!]! - wrapped[order[k - 1]!]! <= epsilon) union(order[k]!, order[k - 1]!);
  }
  if (order.length > 1 && total - wrapped[order[order.length - 1]!]! + wrapped[order[0]!]! <= epsilon) {
    union(order[0]!, order[order.length - 1]!);
  }
  for (const chord of chords) if (chord.ohm === 0) union(chord.a, chord.b);

  // Resistors between distinct nodes: the arcs between consecutive distinct positions, and chords.
  const resistors: Array<{ a: number; b: number; ohm: number }> = [];
  const distinct: number[] = [];
  for (const i of order) {
    if (distinct.length === 0 || wrapped[i]! - wrapped[distinct[distinct.length - 1]!]! > epsilon) distinct.push(i);
  }
  if (distinct.length > 1) {
    for (let k = 0; k < distinct.length; k++) {
      const a = distinct[k]!;
      const b = distinct[(k + 1) % distinct.length]!;
      const arc = k + 1 < distinct.length ? wrapped[b]! - wrapped[a]! : total - wrapped[a]! + wrapped[b]!;
      if (arc > epsilon) resistors.push({ a, b, ohm: arc });
    }
  }
  for (const chord of chords) if (chord.ohm > 0) resistors.push(chord);

  const source = find(from);
  const sink = find(to);
  if (source === sink) return 0;
  // Number the nodes other than the sink (the reference).
  const index = new Map<number, number>();
  for (let i = 0; i < wrapped.length; i++) {
    const root = find(i);
    if (root !== sink && !index.has(root)) index.set(root, index.size);
  }
  const n = index.size;
  const g: number[][] = Array.from({ length: n }, () => new Array<number>(n + 1).fill(0));
  for (const r of resistors) {
    const ra = find(r.a);
    const rb = find(r.b);
    if (ra === rb) continue;
    const conductance = 1 / r.ohm;
    const ia = index.get(ra);
    const ib = index.get(rb);
    if (ia !== undefined) g[ia]![ia]! += conductance;
    if (ib !== undefined) g[ib]![ib]! += conductance;
    if (ia !== undefined && ib !== undefined) {
      g[ia]![ib]! -= conductance;
      g[ib]![ia]! -= conductance;
    }
  }
  const s = index.get(source)!;
  g[s]![n] = 1; // inject 1 A at the source; the sink is at 0 V
  const v = solve(g);
  return v[s]!;
}

/** Solves an augmented system [A | b] by Gaussian elimination with partial pivoting. */
function solve(m: number[][]): number[] {
  const n = m.length;
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let row = col + 1; row < n; row++) if (Math.abs(m[row]![col]!) > Math.abs(m[pivot]![col]!)) pivot = row;
    [m[col], m[pivot]] = [m[pivot]!, m[col]!];
    const p = m[col]![col]!;
    if (p === 0) return new Array<number>(n).fill(Number.POSITIVE_INFINITY); // a node cut off: open circuit
    for (let row = col + 1; row < n; row++) {
      const f = m[row]![col]! / p;
      if (f === 0) continue;
      for (let k = col; k <= n; k++) m[row]![k]! -= f * m[col]![k]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let row = n - 1; row >= 0; row--) {
    let sum = m[row]![n]!;
    for (let k = row + 1; k < n; k++) sum -= m[row]![k]! * x[k]!;
    x[row] = sum / m[row]![row]!;
  }
  return x;
}

/**
 * The reading at the far end of a spur from a ring socket: the ring's reading at its origin plus the
 * spur cable's own line and cpc resistance, in series.
 */
export function spurEndReading(params: {
  r1: number;
  r2: number;
  at: RingPoint;
  spurLineOhm: number;
  spurCpcOhm: number;
  linking?: RingLinking;
}): number {
  return ringReadingAt(params) + params.spurLineOhm + params.spurCpcOhm;
}

// ---------------------------------------------------------------------------------------------
// Profile diagnosis
// ---------------------------------------------------------------------------------------------

export type RingVerdict = 'consistent' | 'same-end-linked' | 'open' | 'high-point' | 'low-points';

export interface RingProfileInput {
  /** End-to-end line resistance (Ω). */
  r1: number;
  /** End-to-end neutral resistance (Ω), when measured: only used to mention an r1/rn mismatch. */
  rn?: number | null;
  /** End-to-end cpc resistance (Ω). */
  r2: number;
  /** L-cpc readings at each socket in ring order (Ω); null or NaN where there is no reading. */
  readings: ReadonlyArray<number | null>;
  /**
   * Each socket's fraction along the ring (0..1), when known. Usually it is not (the tester reads
   * the sockets in ring order but does not measure where each one is): then every reading is judged
   * against the range a sound ring can give anywhere, r1·r2/(r1+r2) … (r1+r2)/4, and only a reading
   * that no placement of the sockets explains is called a fault.
   */
  positions?: readonly number[];
  /** How far a reading may stray before it counts (Ω); 0.05 when omitted (common practice). */
  toleranceOhm?: number;
}

export interface RingProfile {
  verdict: RingVerdict;
  /** The highest reading: the value to record as the ring's R1+R2; null when there is none. */
  recordValue: number | null;
  /**
   * The reading a sound, correctly cross-connected ring gives at each position (Ω). Without
   * positions the sockets are drawn evenly spaced, (i+1)/(n+1): a guide for a plot, not a judgement.
   */
  expected: number[];
  /**
   * What a sound ring can read at any socket: r1·r2/(r1+r2) near the ends up to (r1+r2)/4 at
   * mid-ring (Ω); null when r1 and r2 are not known.
   */
  soundRange: { low: number; high: number } | null;
  /** Whether the sockets' positions were given (true) or the readings were judged on the range alone. */
  positionsGiven: boolean;
  /** Zero-based indexes of the sockets the verdict points at. */
  suspects: number[];
  /** One or two lines in the tester's words. */
  message: string;
}

const DEFAULT_RING_TOLERANCE = 0.05;

function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

function ohm(value: number): string {
  return `${formatFixed(value, 2)} Ω`;
}

function socketList(indexes: readonly number[]): string {
  const numbers = indexes.map((i) => String(i + 1));
  return `${indexes.length === 1 ? 'Socket' : 'Sockets'} ${numbers.join(', ')}`;
}

/**
 * Diagnoses a ring from its L-cpc readings at each socket (step 3 of the three-step test):
 * - `open`: no reading anywhere — like conductors were linked (line to line, cpc to cpc), or the
 *   ring is broken;
 * - `same-end-linked`: low near the ends and highest mid-ring, following x(1−x)(r1+r2) — line and
 *   cpc of the same cable end were linked;
 * - `high-point`: one or more sockets well above the rest and above the expected value — a spur
 *   from that point, or a loose termination;
 * - `low-points`: sockets below the sound ring's value — an interconnection (bridge) across it;
 * - `consistent`: every reading within the tolerance of the sound ring's value.
 * The expected values are those of a sound ring at each position; `recordValue` is the highest
 * reading (the one the schedule records as R1+R2).
 */
export function ringProfile(input: RingProfileInput): RingProfile {
  const { r1, r2, readings } = input;
  const count = readings.length;
  const tolerance = input.toleranceOhm ?? DEFAULT_RING_TOLERANCE;
  const placed = input.positions !== undefined;
  const positions = input.positions ?? readings.map((_, i) => (i + 1) / (count + 1));
  const known = validRing(r1, r2);
  const expected = positions.map((x) => (known ? correctRingReading(r1, r2, x) : Number.NaN));
  const soundRange = known ? { low: (r1 * r2) / (r1 + r2), high: (r1 + r2) / 4 } : null;
  const base = { expected, soundRange, positionsGiven: placed };
  const valid: number[] = [];
  const missing: number[] = [];
  readings.forEach((r, i) => (typeof r === 'number' && Number.isFinite(r) ? valid : missing).push(i));
  const quarter = known ? (r1 + r2) / 4 : Number.NaN;
  const rnNote =
    known && typeof input.rn === 'number' && Number.isFinite(input.rn) && Math.abs(r1 - input.rn) > 0.05 + 1e-9
      ? ` r1 ${ohm(r1)} and rn ${ohm(input.rn)} differ by more than 0.05 Ω: check the ends and terminations.`
      : '';

  if (valid.length === 0) {
    return {
      ...base,
      verdict: 'open',
      recordValue: null,
      suspects: [],
      message:
        (count === 0
          ? 'No socket readings.'
          : 'No reading at any socket: the cross-connected ring reads open. Line was probably linked to line and cpc to cpc (two separate loops), or a conductor is broken.') +
        rnNote,
    };
  }

  const value = (i: number) => readings[i] as number;
  const recordValue = Math.max(...valid.map(value));
  const missingNote = missing.length > 0 ? ` No reading at ${socketList(missing).toLowerCase()}: check those points for a break.` : '';
  const values = valid.map(value);
  const spread = Math.max(...values) - Math.min(...values);

  if (!placed && soundRange !== null) {
    return unplacedVerdict({ r1, r2, readings, valid, soundRange, tolerance, recordValue, base, missingNote, rnNote });
  }

  // Same-end linking: a parabola through zero at the ends.
  if (valid.length >= 3 && spread > 2 * tolerance) {
    let sameEnds: boolean;
    if (known) {
      let errorCorrect = 0;
      let errorSameEnds = 0;
      for (const i of valid) {
        errorCorrect += (value(i) - expected[i]!) ** 2;
        errorSameEnds += (value(i) - sameEndsRingReading(r1, r2, positions[i]!)) ** 2;
      }
      // The readings must follow x(1−x)(r1+r2) closely (root-mean-square error within half the
      // tolerance) and at least twice as well as a sound ring: a strong interconnection can also
      // read low towards the ends, but not along that curve.
      const rmsSameEnds = Math.sqrt(errorSameEnds / valid.length);
      sameEnds = errorSameEnds * 4 < errorCorrect && rmsSameEnds <= tolerance / 2;
    } else {
      const ends = valid.filter((i) => positions[i]! <= 0.2 || positions[i]! >= 0.8).map(value);
      const middle = valid.filter((i) => positions[i]! >= 0.3 && positions[i]! <= 0.7).map(value);
      sameEnds = ends.length > 0 && middle.length > 0 && median(ends) < 0.6 * median(middle);
    }
    if (sameEnds) {
      return {
        ...base,
        verdict: 'same-end-linked',
        recordValue,
        suspects: [...valid],
        message:
          'Readings are low near the ends and highest mid-ring: line and cpc of the same cable end were linked. Link opposite ends and measure again before recording R1+R2.' +
          missingNote +
          rnNote,
      };
    }
  }

  const typical = median(values);
  const high: number[] = [];
  const low: number[] = [];
  for (const i of valid) {
    const r = value(i);
    const reference = known ? expected[i]! : typical;
    if (r - reference > tolerance + 1e-9 && r - typical > tolerance + 1e-9) high.push(i);
    else if (reference - r > tolerance + 1e-9) low.push(i);
  }
  const expectedText = known ? `(r1+r2)/4 = ${ohm(quarter)}` : `the other sockets (about ${ohm(typical)})`;

  if (high.length > 0) {
    const readingsText = high.map((i) => ohm(value(i))).join(', ');
    const lowNote = low.length > 0 ? ` ${socketList(low)} read below ${expectedText}: an interconnection as well?` : '';
    return {
      ...base,
      verdict: 'high-point',
      recordValue,
      suspects: high,
      message: `${socketList(high)} ${high.length === 1 ? 'reads' : 'read'} ${readingsText}, well above the rest and ${expectedText}: a spur from that point, or a loose termination.${lowNote}${missingNote}${rnNote}`,
    };
  }
  if (low.length > 0) {
    return {
      ...base,
      verdict: 'low-points',
      recordValue,
      suspects: low,
      message: `${socketList(low)} ${low.length === 1 ? 'reads' : 'read'} below ${expectedText}: an interconnection (bridge) across the ring.${missingNote}${rnNote}`,
    };
  }
  const offset = known ? typical - median(valid.map((i) => expected[i]!)) : 0;
  const offsetNote =
    offset > tolerance + 1e-9
      ? ` All readings are about ${ohm(offset)} above ${expectedText}: check the leads were nulled and the end-to-end readings.`
      : '';
  return {
    ...base,
    verdict: 'consistent',
    recordValue,
    suspects: [],
    message: `Readings agree with a sound ring${known ? ` (about ${ohm(quarter)})` : ''}; record ${ohm(recordValue)} as R1+R2.${offsetNote}${missingNote}${rnNote}`,
  };
}

/**
 * The verdict when the sockets' positions are not known (the usual case). A sound ring reads
 * between r1·r2/(r1+r2) (a socket at an end) and (r1+r2)/4 (mid-ring) wherever its sockets are, so:
 * - above (r1+r2)/4 + tolerance (and above the other sockets): no placement explains it — a spur
 *   or a loose termination;
 * - below r1·r2/(r1+r2) − tolerance: no placement of a sound ring explains it. If the readings fall
 *   towards zero at the first and last sockets, rise to about (r1+r2)/4 in between and never go
 *   above it (the curve x(1−x)(r1+r2) of line and cpc of the same end linked), that is named, with
 *   the caution that an interconnection near the ends (or the ends joined) reads the same; any
 *   other low reading is an interconnection;
 * - otherwise consistent.
 */
function unplacedVerdict(p: {
  r1: number;
  r2: number;
  readings: ReadonlyArray<number | null>;
  valid: readonly number[];
  soundRange: { low: number; high: number };
  tolerance: number;
  recordValue: number;
  base: Pick<RingProfile, 'expected' | 'soundRange' | 'positionsGiven'>;
  missingNote: string;
  rnNote: string;
}): RingProfile {
  const { readings, valid, soundRange, tolerance, recordValue, base, missingNote, rnNote } = p;
  const value = (i: number) => readings[i] as number;
  const values = valid.map(value);
  const typical = median(values);
  const rangeText = `${ohm(soundRange.low)}–${ohm(soundRange.high)}, what a sound ring reads from its ends to mid-ring`;
  const high = valid.filter((i) => value(i) > soundRange.high + tolerance + 1e-9 && value(i) - typical > tolerance + 1e-9);
  const low = valid.filter((i) => value(i) < soundRange.low - tolerance - 1e-9);

  if (high.length === 0 && low.length > 0 && sameEndShape(values, soundRange, tolerance)) {
    return {
      ...base,
      verdict: 'same-end-linked',
      recordValue,
      suspects: [...valid],
      message:
        `Readings fall towards zero at the first and last sockets and reach about (r1+r2)/4 = ${ohm(soundRange.high)} only in between, far below ${ohm(soundRange.low)} at the ends: line and cpc of the same cable end were probably linked. Link opposite ends and measure again before recording R1+R2. ` +
        'An interconnection between points near the two ends (or the two ends joined at the board) reads the same way: if the opposite ends were linked, look for one.' +
        missingNote +
        rnNote,
    };
  }
  if (high.length > 0) {
    const readingsText = high.map((i) => ohm(value(i))).join(', ');
    const lowNote = low.length > 0 ? ` ${socketList(low)} read below ${ohm(soundRange.low)}: an interconnection as well?` : '';
    return {
      ...base,
      verdict: 'high-point',
      recordValue,
      suspects: high,
      message: `${socketList(high)} ${high.length === 1 ? 'reads' : 'read'} ${readingsText}, above the rest and above ${rangeText}, wherever the sockets are: a spur from that point, or a loose termination.${lowNote}${missingNote}${rnNote}`,
    };
  }
  if (low.length > 0) {
    return {
      ...base,
      verdict: 'low-points',
      recordValue,
      suspects: low,
      message: `${socketList(low)} ${low.length === 1 ? 'reads' : 'read'} below ${rangeText}, wherever the sockets are: an interconnection (bridge) across the ring.${
        low.length === valid.length ? ' Every socket reads low: line and cpc of the same cable end may have been linked instead (check the links before looking for a bridge).' : ''
      }${missingNote}${rnNote}`,
    };
  }
  const offsetNote =
    typical > soundRange.high + tolerance + 1e-9
      ? ` All readings are above (r1+r2)/4 = ${ohm(soundRange.high)}: check the leads were nulled and the end-to-end readings.`
      : '';
  return {
    ...base,
    verdict: 'consistent',
    recordValue,
    suspects: [],
    message: `Readings lie within ${rangeText} (± ${ohm(tolerance)}): consistent with a sound ring; record ${ohm(recordValue)} as R1+R2.${offsetNote}${missingNote}${rnNote}`,
  };
}

/**
 * Whether readings in ring order have the shape of line and cpc of the same end linked:
 * x(1−x)(r1+r2), zero at the ends and (r1+r2)/4 mid-ring, placed anywhere. The first and last
 * readings lie below what a sound ring reads at its ends, none is above (r1+r2)/4, the readings
 * rise to one peak and fall again (each step within the tolerance), the peak reaches the sound range,
 * and the spread is well beyond a sound ring's.
 */
function sameEndShape(values: readonly number[], soundRange: { low: number; high: number }, tolerance: number): boolean {
  const n = values.length;
  if (n < 3) return false;
  const first = values[0]!;
  const last = values[n - 1]!;
  const floor = soundRange.low - tolerance - 1e-9;
  if (!(first < floor && last < floor)) return false;
  let peak = 0;
  for (let i = 1; i < n; i++) if (values[i]! > values[peak]!) peak = i;
  const top = values[peak]!;
  if (top > soundRange.high + tolerance + 1e-9 || top < soundRange.low - tolerance - 1e-9) return false;
  for (let i = 1; i <= peak; i++) if (values[i]! < values[i - 1]! - tolerance - 1e-9) return false;
  for (let i = peak + 1; i < n; i++) if (values[i]! > values[i - 1]! + tolerance + 1e-9) return false;
  const soundSpread = soundRange.high - soundRange.low;
  return top - Math.min(first, last) > soundSpread + 2 * tolerance + 1e-9;
}
