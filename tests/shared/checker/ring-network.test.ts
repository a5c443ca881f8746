/**
 * The ring formulas checked against the network itself: a ring of N sockets with random segment
 * resistances on the line and the cpc, cross-connected at the ends, solved by nodal analysis with
 * mathjs (`lusolve`). Expected values come from that independent solution (Kirchhoff's current law,
 * G·v = i), never from the checker.
 */

import fc from 'fast-check';
import { lusolve } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  bridgedRingReadingAt,
  correctRingReading,
  ringProfile,
  ringReadingAt,
  sameEndsRingReading,
  spurEndReading,
  type RingBridge,
} from '../../../shared/checker/index.ts';

type Resistor = [a: number, b: number, ohm: number];

/**
 * Resistance between nodes `from` and `to`: `links` are zero-ohm connections (nodes merged),
 * `resistors` the rest. Infinity when the two nodes are not connected.
 */
function networkResistance(nodeCount: number, resistors: readonly Resistor[], links: ReadonlyArray<[number, number]>, from: number, to: number): number {
  const parent = Array.from({ length: nodeCount }, (_, i) => i);
  const find = (i: number): number => (parent[i] === i ? i : (parent[i] = find(parent[i]!)));
  for (const [a, b] of links) parent[find(a)] = find(b);
  const ground = find(to);
  const source = find(from);
  if (source === ground) return 0;
  // Connectivity (through resistors) from the source.
  const adjacency = new Map<number, number[]>();
  for (const [a, b] of resistors) {
    const ra = find(a);
    const rb = find(b);
    adjacency.set(ra, [...(adjacency.get(ra) ?? []), rb]);
    adjacency.set(rb, [...(adjacency.get(rb) ?? []), ra]);
  }
  const reached = new Set([source]);
  const stack = [source];
  while (stack.length > 0) for (const next of adjacency.get(stack.pop()!) ?? []) if (!reached.has(next)) reached.add(next), stack.push(next);
  if (!reached.has(ground)) return Number.POSITIVE_INFINITY;
  // Nodal equations over the connected nodes other than the ground.
  const nodes = [...reached].filter((n) => n !== ground);
  const index = new Map(nodes.map((n, i) => [n, i]));
  const g = nodes.map(() => nodes.map(() => 0));
  for (const [a, b, ohm] of resistors) {
    if (find(a) === find(b)) continue; // both ends on one node: carries no current
    const ia = index.get(find(a));
    const ib = index.get(find(b));
    const conductance = 1 / ohm;
    if (ia !== undefined) g[ia]![ia]! += conductance;
    if (ib !== undefined) g[ib]![ib]! += conductance;
    if (ia !== undefined && ib !== undefined && ia !== ib) {
      g[ia]![ib]! -= conductance;
      g[ib]![ia]! -= conductance;
    }
  }
  const current = nodes.map((n) => [n === source ? 1 : 0]);
  const v = lusolve(g, current) as number[][];
  return v[index.get(source)!]![0]!;
}

interface Ring {
  n: number;
  line: number[];
  cpc: number[];
  r1: number;
  r2: number;
}

const L = (_ring: Ring, k: number) => k; // line node k: 0 = end A, n+1 = end B
const C = (ring: Ring, k: number) => ring.n + 2 + k; // cpc node k

function ringResistors(ring: Ring): Resistor[] {
  const out: Resistor[] = [];
  for (let k = 0; k <= ring.n; k++) {
    out.push([L(ring, k), L(ring, k + 1), ring.line[k]!]);
    out.push([C(ring, k), C(ring, k + 1), ring.cpc[k]!]);
  }
  return out;
}

function endLinks(ring: Ring, linking: 'opposite-ends' | 'same-ends' | 'like-to-like'): Array<[number, number]> {
  const end = ring.n + 1;
  if (linking === 'opposite-ends') return [[L(ring, 0), C(ring, end)], [L(ring, end), C(ring, 0)]];
  if (linking === 'same-ends') return [[L(ring, 0), C(ring, 0)], [L(ring, end), C(ring, end)]];
  return [[L(ring, 0), L(ring, end)], [C(ring, 0), C(ring, end)]];
}

/** Each socket's fraction along the line and along the cpc. */
function socketPoints(ring: Ring): Array<{ line: number; cpc: number }> {
  const points: Array<{ line: number; cpc: number }> = [];
  let line = 0;
  let cpc = 0;
  for (let k = 1; k <= ring.n; k++) {
    line += ring.line[k - 1]!;
    cpc += ring.cpc[k - 1]!;
    points.push({ line: line / ring.r1, cpc: cpc / ring.r2 });
  }
  return points;
}

const segment = fc.double({ min: 0.005, max: 0.2, noNaN: true });
const ringArbitrary = fc
  .integer({ min: 1, max: 24 })
  .chain((n) => fc.tuple(fc.constant(n), fc.array(segment, { minLength: n + 1, maxLength: n + 1 }), fc.array(segment, { minLength: n + 1, maxLength: n + 1 })))
  .map(([n, line, cpc]): Ring => ({ n, line, cpc, r1: line.reduce((a, b) => a + b, 0), r2: cpc.reduce((a, b) => a + b, 0) }));

/** A ring in one cable: cpc segments a fixed multiple of the line's (the same fraction x for both). */
const uniformRingArbitrary = fc
  .tuple(fc.integer({ min: 1, max: 24 }), fc.double({ min: 0.5, max: 3, noNaN: true }))
  .chain(([n, ratio]) => fc.tuple(fc.constant(n), fc.constant(ratio), fc.array(segment, { minLength: n + 1, maxLength: n + 1 })))
  .map(([n, ratio, line]): Ring => {
    const cpc = line.map((s) => s * ratio);
    return { n, line, cpc, r1: line.reduce((a, b) => a + b, 0), r2: cpc.reduce((a, b) => a + b, 0) };
  });

const TOLERANCE = 1e-9;
const runs = { numRuns: 60 };
/** Each property solves a few thousand small networks; allow for a busy machine. */
const SLOW = 30_000;

describe('ring readings against the network solved by nodal analysis (mathjs lusolve)', () => {
  it('correct ring (opposite ends linked), random segments: matches ringReadingAt at every socket', () => {
    fc.assert(
      fc.property(ringArbitrary, (ring) => {
        const resistors = ringResistors(ring);
        const links = endLinks(ring, 'opposite-ends');
        socketPoints(ring).forEach((at, i) => {
          const network = networkResistance(2 * ring.n + 4, resistors, links, L(ring, i + 1), C(ring, i + 1));
          expect(Math.abs(ringReadingAt({ r1: ring.r1, r2: ring.r2, at }) - network)).toBeLessThan(TOLERANCE);
        });
      }),
      runs,
    );
  }, SLOW);

  it('correct ring in one cable: matches the closed form [r1·r2 + x(1−x)(r1−r2)²]/(r1+r2), peak (r1+r2)/4', () => {
    fc.assert(
      fc.property(uniformRingArbitrary, (ring) => {
        const resistors = ringResistors(ring);
        const links = endLinks(ring, 'opposite-ends');
        socketPoints(ring).forEach((at, i) => {
          expect(Math.abs(at.line - at.cpc)).toBeLessThan(1e-12);
          const network = networkResistance(2 * ring.n + 4, resistors, links, L(ring, i + 1), C(ring, i + 1));
          expect(Math.abs(correctRingReading(ring.r1, ring.r2, at.line) - network)).toBeLessThan(TOLERANCE);
          expect(network).toBeLessThanOrEqual((ring.r1 + ring.r2) / 4 + TOLERANCE);
        });
      }),
      runs,
    );
  }, SLOW);

  it('same ends linked, random segments: matches ringReadingAt with linking "same-ends"; in one cable x(1−x)(r1+r2)', () => {
    fc.assert(
      fc.property(ringArbitrary, uniformRingArbitrary, (ring, uniform) => {
        for (const r of [ring, uniform]) {
          const resistors = ringResistors(r);
          const links = endLinks(r, 'same-ends');
          socketPoints(r).forEach((at, i) => {
            const network = networkResistance(2 * r.n + 4, resistors, links, L(r, i + 1), C(r, i + 1));
            expect(Math.abs(ringReadingAt({ r1: r.r1, r2: r.r2, at, linking: 'same-ends' }) - network)).toBeLessThan(TOLERANCE);
            if (r === uniform) expect(Math.abs(sameEndsRingReading(r.r1, r.r2, at.line) - network)).toBeLessThan(TOLERANCE);
          });
        }
      }),
      runs,
    );
  }, SLOW);

  it('an interconnection (one or two bridges, line to line and cpc to cpc): matches bridgedRingReadingAt', () => {
    const bridgeArbitrary = fc.record({
      i: fc.nat(),
      j: fc.nat(),
      lineOhm: fc.oneof(fc.constant(0), fc.double({ min: 0.001, max: 0.5, noNaN: true })),
      cpcOhm: fc.double({ min: 0.001, max: 0.8, noNaN: true }),
    });
    fc.assert(
      fc.property(
        ringArbitrary.filter((r) => r.n >= 2),
        fc.array(bridgeArbitrary, { minLength: 1, maxLength: 2 }),
        fc.constantFrom('opposite-ends' as const, 'same-ends' as const),
        (ring, bridgeSpecs, linking) => {
          const points = socketPoints(ring);
          const resistors = ringResistors(ring);
          const links = endLinks(ring, linking);
          const bridges: RingBridge[] = [];
          for (const spec of bridgeSpecs) {
            const a = (spec.i % ring.n) + 1;
            const b = (spec.j % ring.n) + 1;
            bridges.push({ from: points[a - 1]!, to: points[b - 1]!, lineOhm: spec.lineOhm, cpcOhm: spec.cpcOhm });
            if (spec.lineOhm === 0) links.push([L(ring, a), L(ring, b)]);
            else resistors.push([L(ring, a), L(ring, b), spec.lineOhm]);
            resistors.push([C(ring, a), C(ring, b), spec.cpcOhm]);
          }
          points.forEach((at, i) => {
            const network = networkResistance(2 * ring.n + 4, resistors, links, L(ring, i + 1), C(ring, i + 1));
            const checker = bridgedRingReadingAt({ r1: ring.r1, r2: ring.r2, at, bridges, linking });
            expect(Math.abs(checker - network)).toBeLessThan(TOLERANCE);
          });
        },
      ),
      runs,
    );
  }, SLOW);

  it('a spur from a socket: ring value at its origin + spur line + spur cpc (series)', () => {
    fc.assert(
      fc.property(ringArbitrary, fc.nat(), segment, segment, (ring, pick, spurLine, spurCpc) => {
        const k = (pick % ring.n) + 1;
        const at = socketPoints(ring)[k - 1]!;
        const spurL = 2 * ring.n + 4;
        const spurC = spurL + 1;
        const resistors = [...ringResistors(ring), [L(ring, k), spurL, spurLine], [C(ring, k), spurC, spurCpc]] as Resistor[];
        const network = networkResistance(2 * ring.n + 6, resistors, endLinks(ring, 'opposite-ends'), spurL, spurC);
        expect(Math.abs(spurEndReading({ r1: ring.r1, r2: ring.r2, at, spurLineOhm: spurLine, spurCpcOhm: spurCpc }) - network)).toBeLessThan(TOLERANCE);
      }),
      runs,
    );
  }, SLOW);
});

describe('ringProfile on readings taken from the solved network', () => {
  // A 10-socket ring of 2.5/1.5 cable, 5 m between points: line 5 × 7.41 mΩ, cpc 5 × 12.1 mΩ per
  // segment (IEC 60228 Table 2), r1 = 0.4076 Ω, r2 = 0.6655 Ω.
  const n = 10;
  const ring: Ring = { n, line: Array(n + 1).fill(0.03705), cpc: Array(n + 1).fill(0.0605), r1: 0.03705 * (n + 1), r2: 0.0605 * (n + 1) };
  const nodes = 2 * n + 4;
  const read = (resistors: Resistor[], links: Array<[number, number]>) =>
    Array.from({ length: n }, (_, i) => {
      const r = networkResistance(nodes + 2, resistors, links, L(ring, i + 1), C(ring, i + 1));
      return Number.isFinite(r) ? r : null;
    });

  it('a sound ring is consistent and records its highest reading ≈ (r1+r2)/4 (network solution)', () => {
    const readings = read(ringResistors(ring), endLinks(ring, 'opposite-ends'));
    const profile = ringProfile({ r1: ring.r1, rn: ring.r1, r2: ring.r2, readings });
    expect(profile.verdict).toBe('consistent');
    expect(profile.recordValue).toBeCloseTo(Math.max(...(readings as number[])), 12);
    profile.expected.forEach((e, i) => expect(Math.abs(e - readings[i]!)).toBeLessThan(TOLERANCE));
  });

  it('same ends linked reads low at the ends and peaks mid-ring (network solution)', () => {
    const profile = ringProfile({ r1: ring.r1, r2: ring.r2, readings: read(ringResistors(ring), endLinks(ring, 'same-ends')) });
    expect(profile.verdict).toBe('same-end-linked');
  });

  it('like conductors linked (line to line, cpc to cpc) reads open everywhere (network solution)', () => {
    const profile = ringProfile({ r1: ring.r1, r2: ring.r2, readings: read(ringResistors(ring), endLinks(ring, 'like-to-like')) });
    expect(profile.verdict).toBe('open');
    expect(profile.recordValue).toBeNull();
  });

  it('a bridge of 4 m of 2.5/1.5 between sockets 3 and 7 shows as low points (network solution)', () => {
    // 4 m × 7.41 and 4 m × 12.1 mΩ/m (IEC 60228 Table 2).
    const resistors = [...ringResistors(ring), [L(ring, 3), L(ring, 7), 0.02964], [C(ring, 3), C(ring, 7), 0.0484]] as Resistor[];
    const profile = ringProfile({ r1: ring.r1, r2: ring.r2, readings: read(resistors, endLinks(ring, 'opposite-ends')) });
    expect(profile.verdict).toBe('low-points');
    expect(profile.suspects.length).toBeGreaterThan(0);
  });

  it('a 6 m spur of 2.5/1.5 read at socket 4 shows as a high point there (network solution)', () => {
    // 6 m × 7.41 and 6 m × 12.1 mΩ/m (IEC 60228 Table 2): 0.117 Ω added in series.
    const spurL = nodes;
    const spurC = nodes + 1;
    const resistors = [...ringResistors(ring), [L(ring, 4), spurL, 0.04446], [C(ring, 4), spurC, 0.0726]] as Resistor[];
    const links = endLinks(ring, 'opposite-ends');
    const readings = read(resistors, links);
    readings[3] = networkResistance(nodes + 2, resistors, links, spurL, spurC); // socket 4's reading taken at the spur's end
    const profile = ringProfile({ r1: ring.r1, r2: ring.r2, readings });
    expect(profile.verdict).toBe('high-point');
    expect(profile.suspects).toEqual([3]);
    expect(profile.recordValue).toBeCloseTo(readings[3]!, 12);
  });
});

describe('ringProfile without socket positions (the usual case): judged on the range a sound ring can read', () => {
  /**
   * A ring in one cable with sockets at uneven distances: `gaps` are the cable lengths (m) between
   * the board, each socket and back. Resistances from IEC 60228 Table 2 (mΩ/m at 20 °C): line
   * `lineMilliohm`, cpc `cpcMilliohm`.
   */
  function cableRing(gaps: readonly number[], lineMilliohm: number, cpcMilliohm: number): Ring {
    const line = gaps.map((m) => (m * lineMilliohm) / 1000);
    const cpc = gaps.map((m) => (m * cpcMilliohm) / 1000);
    return { n: gaps.length - 1, line, cpc, r1: line.reduce((a, b) => a + b, 0), r2: cpc.reduce((a, b) => a + b, 0) };
  }
  function readingsOf(ring: Ring, resistors: Resistor[], links: Array<[number, number]>, extraNodes = 0): Array<number | null> {
    return Array.from({ length: ring.n }, (_, i) => {
      const r = networkResistance(2 * ring.n + 4 + extraNodes, resistors, links, L(ring, i + 1), C(ring, i + 1));
      return Number.isFinite(r) ? r : null;
    });
  }

  // 2.5/1.0 cable: 7.41 and 18.1 mΩ/m (IEC 60228 Table 2), r2/r1 = 2.44. Eight sockets in two rooms,
  // four near each end of an 88 m ring, the long run between them out of reach.
  const twoRooms = cableRing([1, 1, 1, 1, 80, 1, 1, 1, 1], 7.41, 18.1);
  // Seven sockets: two near the board, four in a far room, one on the way back (66 m).
  const ring25_10 = cableRing([5, 3, 28, 2, 2, 2, 20, 4], 7.41, 18.1);

  it('a sound 2.5/1.0 ring with its sockets in two rooms is consistent (network solved with mathjs), though even spacing would misjudge it', () => {
    const ring = twoRooms;
    const readings = readingsOf(ring, ringResistors(ring), endLinks(ring, 'opposite-ends'));
    const profile = ringProfile({ r1: ring.r1, r2: ring.r2, readings });
    expect(profile.verdict).toBe('consistent');
    expect(profile.positionsGiven).toBe(false);
    // The range: r1·r2/(r1+r2) … (r1+r2)/4 (closed form of two parallel paths), about 17 % apart for r2/r1 = 2.44.
    expect(profile.soundRange!.low).toBeCloseTo((ring.r1 * ring.r2) / (ring.r1 + ring.r2), 12);
    expect(profile.soundRange!.high).toBeCloseTo((ring.r1 + ring.r2) / 4, 12);
    // low/high = 4k/(1+k)² with k = r2/r1 = 18.1/7.41 (IEC 60228): 0.824, the readings about 17 % apart.
    const k = 18.1 / 7.41;
    expect(profile.soundRange!.low / profile.soundRange!.high).toBeCloseTo((4 * k) / (1 + k) ** 2, 9);
    // The same readings forced onto evenly spaced positions read as a fault: why positions are not assumed.
    const evenly = readings.map((_, i) => (i + 1) / (readings.length + 1));
    expect(ringProfile({ r1: ring.r1, r2: ring.r2, readings, positions: evenly }).verdict).toBe('low-points');
  });

  it('any sound uniform ring, any placement, any cpc/line ratio 0.5–3: consistent without positions (mathjs network)', () => {
    fc.assert(
      fc.property(uniformRingArbitrary, (ring) => {
        const readings = readingsOf(ring, ringResistors(ring), endLinks(ring, 'opposite-ends'));
        expect(ringProfile({ r1: ring.r1, r2: ring.r2, readings }).verdict).toBe('consistent');
      }),
      runs,
    );
  }, SLOW);

  it('same ends linked with no socket near mid-ring: the shape is not clear, so it is reported low everywhere with both causes named (mathjs network)', () => {
    const ring = twoRooms;
    const profile = ringProfile({ r1: ring.r1, r2: ring.r2, readings: readingsOf(ring, ringResistors(ring), endLinks(ring, 'same-ends')) });
    expect(profile.verdict).toBe('low-points');
    expect(profile.message).toContain('same cable end');
  });

  it('same ends linked on the uneven 2.5/1.0 ring is named, with the interconnection that would read alike (mathjs network)', () => {
    const readings = readingsOf(ring25_10, ringResistors(ring25_10), endLinks(ring25_10, 'same-ends'));
    const profile = ringProfile({ r1: ring25_10.r1, r2: ring25_10.r2, readings });
    expect(profile.verdict).toBe('same-end-linked');
    expect(profile.message).toContain('same cable end');
    expect(profile.message).toContain('interconnection');
    // The closed form x(1−x)(r1+r2) agrees with the network at each socket (formula).
    socketPoints(ring25_10).forEach((at, i) => expect(Math.abs(sameEndsRingReading(ring25_10.r1, ring25_10.r2, at.line) - readings[i]!)).toBeLessThan(TOLERANCE));
  });

  it('the two ends joined at the board (opposite ends linked) reads exactly like same-end linking: the message says so (mathjs network)', () => {
    const ring = ring25_10;
    const resistors = ringResistors(ring);
    const end = ring.n + 1;
    const joined: Array<[number, number]> = [...endLinks(ring, 'opposite-ends'), [L(ring, 0), L(ring, end)], [C(ring, 0), C(ring, end)]];
    const bridged = readingsOf(ring, resistors, joined);
    const sameEnds = readingsOf(ring, resistors, endLinks(ring, 'same-ends'));
    bridged.forEach((r, i) => expect(Math.abs(r! - sameEnds[i]!)).toBeLessThan(TOLERANCE));
    expect(ringProfile({ r1: ring.r1, r2: ring.r2, readings: bridged }).message).toContain('two ends joined');
  });

  it('a spur of 6 m of 2.5/1.5 read at socket 5 of the uneven ring is still a high point without positions (mathjs network)', () => {
    // 6 m × 7.41 and 6 m × 12.1 mΩ/m (IEC 60228 Table 2) = 0.117 Ω in series, above (r1+r2)/4 + 0.05 Ω.
    const ring = ring25_10;
    const spurL = 2 * ring.n + 4;
    const spurC = spurL + 1;
    const resistors = [...ringResistors(ring), [L(ring, 5), spurL, 0.04446], [C(ring, 5), spurC, 0.0726]] as Resistor[];
    const links = endLinks(ring, 'opposite-ends');
    const readings = readingsOf(ring, resistors, links, 2);
    readings[4] = networkResistance(2 * ring.n + 6, resistors, links, spurL, spurC);
    const profile = ringProfile({ r1: ring.r1, r2: ring.r2, readings });
    expect(profile.verdict).toBe('high-point');
    expect(profile.suspects).toEqual([4]);
  });

  it('a bridge between sockets 2 and 5 of the uneven ring reads below the sound range: an interconnection (mathjs network)', () => {
    // 1 m of 2.5/1.0 between them: 7.41 and 18.1 mΩ (IEC 60228 Table 2), across 34 m of ring.
    const ring = ring25_10;
    const resistors = [...ringResistors(ring), [L(ring, 2), L(ring, 5), 0.00741], [C(ring, 2), C(ring, 5), 0.0181]] as Resistor[];
    const readings = readingsOf(ring, resistors, endLinks(ring, 'opposite-ends'));
    const profile = ringProfile({ r1: ring.r1, r2: ring.r2, readings });
    expect(profile.verdict).toBe('low-points');
  });
});

describe('one cross-connection missing (why R1+R2 ≈ (r1+r2)/2 points at the links)', () => {
  it('with only line A linked to cpc B, a socket mid-ring reads (r1+r2)/2: a series path (mathjs network)', () => {
    // 9 sockets, 5 m apart, 2.5/1.5 (IEC 60228 Table 2: 7.41 and 12.1 mΩ/m): socket 5 is mid-ring; x·r1 + (1−x)·r2 at x = ½.
    const n = 9;
    const ring: Ring = { n, line: Array(n + 1).fill(0.03705), cpc: Array(n + 1).fill(0.0605), r1: 0.03705 * (n + 1), r2: 0.0605 * (n + 1) };
    const oneLink: Array<[number, number]> = [[L(ring, 0), C(ring, n + 1)]];
    const mid = networkResistance(2 * n + 4, ringResistors(ring), oneLink, L(ring, 5), C(ring, 5));
    expect(mid).toBeCloseTo((ring.r1 + ring.r2) / 2, 9);
  });
});
