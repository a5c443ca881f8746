/**
 * Checker benchmark (`npm run bench:checker`): a generated 1,000-circuit board, timed three ways in
 * the same run:
 * - a full `checkBoard`;
 * - a re-check after one cell edit, with the caching checker (`createBoardChecker`);
 * - `JSON.parse` of the same board's JSON, the yardstick: the full check should cost no more than
 *   three parses of the board it checks;
 * - and the board as a report started from an earlier job shapes it (`boardToCheckInput` with last
 *   time's readings on every circuit), timed alternately with the same board without them.
 * Each figure is the median of many runs after a warm-up. Targets are printed with pass/miss; the
 * script never fails the build.
 */

import { checkBoard, createBoardChecker, type ParsedCell } from '../../shared/checker/index.ts';
import { boardToCheckInput, type CheckCircuit, type CheckInput } from '../../shared/schemas/check.ts';

const CIRCUITS = 1000;
const WARM_UP = 60;
const RUNS = 300;

/** A small deterministic generator so every run checks the same board. */
function random(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

// R1+R2 per metre, IEC 60228 Table 2 (mΩ/m): 2.5/1.5 → 19.51, 1.5/1.0 → 30.2, 6/2.5 → 10.49, 16/6 → 4.23.
const cables = [
  { live: 2.5, cpc: 1.5, perMetre: 19.51 },
  { live: 1.5, cpc: 1, perMetre: 30.2 },
  { live: 6, cpc: 2.5, perMetre: 10.49 },
  { live: 16, cpc: 6, perMetre: 4.23 },
];

function generateBoard(count: number): CheckInput {
  const next = random(2026);
  const zdb = 0.22;
  const circuits: CheckCircuit[] = [];
  const rings: Array<{ id: number; r1: number; r2: number }> = [];
  const phases = ['L1', 'L2', 'L3'] as const;
  for (let i = 0; i < count; i++) {
    const id = i + 1;
    const roll = next();
    const kind = roll < 0.2 ? 'ring' : roll < 0.28 && rings.length > 0 ? 'spur' : roll < 0.9 ? 'radial' : 'distribution';
    const cable = kind === 'ring' || kind === 'spur' ? cables[0]! : kind === 'distribution' ? cables[3]! : cables[Math.floor(next() * 3)]!;
    const lengthM = 5 + next() * 40;
    const fmt = (v: number) => v.toFixed(2);
    let cells: CheckCircuit['cells'];
    let r1PlusR2: number;
    const spurRing = kind === 'spur' ? rings[Math.floor(next() * rings.length)]! : null;
    if (kind === 'ring') {
      // The ring's length is twice the one-way run; readings as written, to two decimals.
      const r1 = Number(fmt((lengthM * 2 * 7.41) / 1000));
      const r2 = Number(fmt((lengthM * 2 * 12.1) / 1000));
      r1PlusR2 = (r1 + r2) / 4;
      cells = {
        ringR1: { text: fmt(r1), reason: null },
        ringRn: { text: fmt(r1 + 0.01), reason: null },
        ringR2: { text: fmt(r2), reason: null },
        r1PlusR2: { text: fmt(r1PlusR2), reason: null },
      };
      rings.push({ id, r1, r2 });
    } else if (spurRing) {
      // 4 m of 2.5/1.5 from socket 4 of 10: ring value there + 4 × 19.51 mΩ.
      const x = 4 / 11;
      const atOrigin = (spurRing.r1 * spurRing.r2 + x * (1 - x) * (spurRing.r1 - spurRing.r2) ** 2) / (spurRing.r1 + spurRing.r2);
      r1PlusR2 = atOrigin + (4 * 19.51) / 1000;
      cells = { r1PlusR2: { text: fmt(r1PlusR2), reason: null } };
    } else {
      r1PlusR2 = (lengthM * cable.perMetre) / 1000;
      cells = { r1PlusR2: { text: fmt(r1PlusR2), reason: null } };
    }
    cells.irTestVoltage = { text: '500', reason: null };
    cells.irLiveLive = { text: next() < 0.9 ? '>200' : String(Math.round(20 + next() * 150)), reason: null };
    cells.irLiveEarth = { text: next() < 0.9 ? '>200' : String(Math.round(20 + next() * 150)), reason: null };
    cells.polarity = { text: '✓', reason: null };
    // A planted fault now and then: a high Zs, a low IR, a LIM without a reason.
    const fault = next();
    const zs = zdb + r1PlusR2 - 0.02 - next() * 0.03 + (fault < 0.01 ? 2 : 0);
    cells.zs = { text: fmt(zs), reason: null };
    if (fault > 0.99) cells.irLiveEarth = { text: '0.6', reason: null };
    if (fault > 0.985 && fault <= 0.99) cells.zs = { text: 'LIM', reason: null };
    const rcd = kind !== 'distribution';
    if (rcd) {
      cells.rcdTimeMs = { text: String(Math.round(15 + next() * 25)), reason: null };
      cells.rcdButton = { text: '✓', reason: null };
    }
    circuits.push({
      id,
      number: `${Math.floor(i / 3) + 1}${phases[i % 3]}`,
      phase: phases[i % 3]!,
      description: kind === 'ring' ? 'Sockets' : kind === 'distribution' ? 'Sub-main' : 'Lighting',
      kind,
      wiringType: 'A',
      referenceMethod: 'C',
      points: kind === 'ring' ? 10 : 6,
      liveCsaMm2: cable.live,
      cpcCsaMm2: cable.cpc,
      maxDisconnectionS: kind === 'distribution' ? 5 : 0.4,
      // Radials carry their length, so the length rule runs on every one of them.
      cableLengthM: kind === 'radial' ? Number(lengthM.toFixed(1)) : null,
      deviceStandard: kind === 'distribution' ? '88-2' : '60898',
      deviceType: kind === 'distribution' ? 'gG' : 'B',
      ratingA: kind === 'ring' ? 32 : kind === 'distribution' ? 63 : kind === 'spur' ? 20 : 16,
      breakingKa: 10,
      rcdType: rcd ? 'A' : null,
      rcdRatedResidualMa: rcd ? 30 : null,
      afdd: null,
      remarks: '',
      spurRingId: spurRing ? spurRing.id : null,
      spurOriginPoint: kind === 'spur' ? 'socket 4' : null,
      spurLengthM: kind === 'spur' ? 4 : null,
      maxZsByHandOhm: null,
      cells,
    });
  }
  return {
    board: { phases: 3, zdbOhm: zdb, ipfKa: 6, polarityConfirmed: true },
    site: { earthing: 'TN-C-S', nominalVoltageV: 230 },
    circuits,
  };
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

function time(run: () => unknown, before?: () => void): number {
  const samples: number[] = [];
  for (let i = 0; i < WARM_UP + RUNS; i++) {
    before?.();
    const start = performance.now();
    run();
    const elapsed = performance.now() - start;
    if (i >= WARM_UP) samples.push(elapsed);
  }
  return median(samples);
}

/** Medians of two functions timed in alternation (same warm-up and runs as `time`). */
function timePair(a: () => unknown, b: () => unknown): [number, number] {
  const samples: [number[], number[]] = [[], []];
  for (let i = 0; i < WARM_UP + RUNS; i++) {
    for (const [k, run] of [a, b].entries()) {
      const start = performance.now();
      run();
      const elapsed = performance.now() - start;
      if (i >= WARM_UP) samples[k]!.push(elapsed);
    }
  }
  return [median(samples[0]), median(samples[1])];
}

const input = generateBoard(CIRCUITS);
const json = JSON.stringify(input);
let sink: unknown;

const findings = checkBoard(input);
const parseMs = time(() => (sink = JSON.parse(json)));
const fullMs = time(() => (sink = checkBoard(input)));

// Re-check after one cell edit: each round replaces one circuit (a new object, as an immutable
// update does) with a different Zs, and the caching checker re-checks the board.
const check = createBoardChecker();
check(input);
let edited = input;
let round = 0;
const editMs = time(
  () => (sink = check(edited)),
  () => {
    round++;
    const index = (round * 37) % CIRCUITS;
    const circuits = edited.circuits.slice();
    const circuit = circuits[index]!;
    circuits[index] = { ...circuit, cells: { ...circuit.cells, zs: { text: (0.3 + (round % 50) / 100).toFixed(2), reason: null } } };
    edited = { ...edited, circuits };
  },
);
const parseAgainMs = time(() => (sink = JSON.parse(json)));

// A board started from an earlier job, shaped as the server and the console shape a fetched board
// (`boardToCheckInput`): every circuit carries last time's cells, every 50th with a Zs that has
// since risen (0.10 Ω then), so the comparison with last time runs on every circuit.
const withPrevious = boardToCheckInput({
  ...input,
  previousReadings: input.circuits.map((c, i) => ({
    circuitId: c.id,
    cells: i % 50 === 0 ? { ...c.cells, zs: { text: '0.10', reason: null } } : c.cells,
  })),
});
const withoutPrevious = boardToCheckInput(input);
const previousFindings = checkBoard(withPrevious).length - findings.length;
// Timed in alternation with the same board without last time's readings, so both see the same
// load on a shared machine and their ratio is what the comparison with last time costs.
const [previousMs, withoutPreviousMs] = timePair(
  () => (sink = checkBoard(withPrevious)),
  () => (sink = checkBoard(withoutPrevious)),
);
void (sink as ParsedCell | undefined);

const parse = Math.min(parseMs, parseAgainMs);
const ratio = fullMs / parse;
const verdict = (ok: boolean) => (ok ? 'pass' : 'miss');
const counts = findings.reduce<Record<string, number>>((acc, f) => ((acc[f.severity] = (acc[f.severity] ?? 0) + 1), acc), {});

console.log(`Checker benchmark: ${CIRCUITS} circuits, ${(json.length / 1024).toFixed(0)} kB of JSON, ${findings.length} findings (${Object.entries(counts).map(([k, v]) => `${v} ${k}`).join(', ')})`);
console.log(`  median of ${RUNS} runs after ${WARM_UP} warm-up runs, Node ${process.version}`);
console.log(`  JSON.parse of the board       ${parse.toFixed(3)} ms`);
console.log(`  full check                    ${fullMs.toFixed(3)} ms   target ≤ 5 ms: ${verdict(fullMs <= 5)}`);
console.log(`  re-check after one cell edit  ${editMs.toFixed(3)} ms`);
console.log(`  full check ÷ JSON.parse       ${ratio.toFixed(2)}      target ≤ 3: ${verdict(ratio <= 3)}`);
console.log(
  `  full check, last time's readings on every circuit  ${previousMs.toFixed(3)} ms (+${previousFindings} notes)   target ≤ 5 ms: ${verdict(previousMs <= 5)}; ${(previousMs / withoutPreviousMs).toFixed(2)} × the same board without them (${withoutPreviousMs.toFixed(3)} ms, timed alternately)`,
);
