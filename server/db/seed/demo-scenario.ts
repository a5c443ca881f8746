/**
 * The demo scenario: an invented electrical contractor, its three people, two client sites, one EIC
 * and one EICR, and two distribution boards whose readings hang together the way measured readings
 * do. Pure: it builds data and touches no database (see seed-demo.ts for the inserts).
 *
 * Everything here is invented: Kestrel Vale Electrical Ltd, its clients, the addresses, the people
 * and every reading. Readings are derived from cable lengths with the conductor resistances of
 * IEC 60228 (at 20 °C, as a cold installation measures), then given the small scatter a real test
 * shows, drawn from a seeded generator so every run produces the same data.
 *
 * A handful of faults are planted on purpose for the checker to find; `plantedFaults` lists them.
 * The EIC (the house) is being entered; the EICR (the bakery) is complete apart from its planted
 * faults and already submitted for review, signed by its inspector, so the demo reviewer can take
 * it from review to an e-mailed PDF.
 */
import type { CircuitFields } from '../../../shared/schemas/boards.ts';
import { readingKeys, type CircuitKind, type ReadingKey } from '../../../shared/schemas/columns.ts';
import type { Role } from '../../../shared/schemas/common.ts';
import type { Company } from '../../../shared/schemas/company.ts';
import type { Job, Site } from '../../../shared/schemas/sites.ts';
import { bakeryEicrRecord, houseEicRecord, type DemoJobRecord } from './demo-records.ts';

// ---------------------------------------------------------------------------------------------
// Types
// ---------------------------------------------------------------------------------------------

/** A demo sign-in, printed by the server at start so people can try each role. */
export interface DemoAccount {
  email: string;
  role: Role;
  name: string;
}

/** A reading cell as the tester typed it. */
export interface DemoCellValue {
  /** Text exactly as typed: "0.44", ">200", "N/A", "LIM", "✓". */
  text: string;
  /** The reason recorded with a LIM; null otherwise (and null on a LIM whose reason was forgotten). */
  reason: string | null;
}

/** A seeded reading cell: its value and when the tester typed it (ISO time). */
export interface DemoCell extends DemoCellValue {
  updatedAt: string;
}

export type DemoCells = Partial<Record<ReadingKey, DemoCell>>;

/**
 * A circuit row of the scenario. Spurs name their ring by circuit number (the database id is not
 * known until the ring is inserted); the seed resolves it to `spur_ring_id`.
 */
export type DemoCircuit = Omit<CircuitFields, 'spurRingId'> & {
  /** For a spur: the number of the ring final circuit on the same board it hangs from. */
  spurRingNumber: string | null;
  cells: DemoCells;
};

export interface DemoBoard {
  reference: string;
  location: string;
  suppliedFrom: string;
  phases: 1 | 3;
  /** Earth fault loop impedance at the board (Ω). */
  zdbOhm: number;
  /** Prospective fault current at the board (kA). */
  ipfKa: number;
  polarityConfirmed: boolean;
  phaseSequenceConfirmed: boolean;
  instruments: string;
  /** In schedule order; the seed gives them positions 1..n. */
  circuits: DemoCircuit[];
}

/** A demo job: its boards and its record (everything around the schedules, see demo-records.ts). */
/**
 * A job the tester has already submitted for review: it is seeded ready for review, with the
 * submission in the job's history and the inspector's signature (drawn in code, see
 * signature-image.ts), so the demo reviewer starts where a reviewer's day starts.
 */
export interface DemoSubmission {
  /** When the tester submitted it (ISO); the inspector signed at the same moment. */
  at: string;
  /** The tester's note to the reviewer. */
  note: string;
  /** Email of the demo account that submitted and signed as inspector. */
  byEmail: string;
  /** The name typed under the inspector's signature. */
  inspectorName: string;
}

export type DemoJob = Pick<Job, 'kind' | 'reference' | 'visitDate' | 'limitations'> & {
  boards: DemoBoard[];
  record: DemoJobRecord;
  /** Null: the job is being entered (a tester is still typing it). */
  submitted: DemoSubmission | null;
};

export type DemoSite = Omit<Site, 'id' | 'version'> & { jobs: DemoJob[] };

export interface DemoScenario {
  /** The contractor the demo people work for. */
  contractor: string;
  /** The contractor's details as the company of the demo database (app_settings `company`). */
  company: Company;
  users: DemoAccount[];
  /** Email of the account recorded as having typed every seeded reading. */
  typistEmail: string;
  sites: DemoSite[];
}

/** What a planted fault is, so tests and the checker's authors can name them. */
export type PlantedFaultId =
  | 'zs-over-max'
  | 'ring-ends-linked-wrongly'
  | 'insulation-below-minimum'
  | 'lim-without-reason'
  | 'lim-with-reason';

/** A fault planted in the demo data on purpose, for the checker to find. */
export interface PlantedFault {
  id: PlantedFaultId;
  /** Reference of the board (unique within the demo). */
  boardReference: string;
  circuitNumber: string;
  /** The reading columns a finding should point at. */
  columns: readonly ReadingKey[];
  /** The planted cells, exactly as seeded (the seed writes these over the computed values). */
  cells: Partial<Record<ReadingKey, DemoCellValue>>;
  /** What is wrong, in the tester's words. */
  what: string;
  /** The limit the readings break, with its unit; null when there is no numeric limit. */
  limit: string | null;
  /** Where the limit comes from. */
  source: string;
  /**
   * True when the checker must report a finding on these columns. False for the control case
   * (a LIM recorded *with* its reason), where a "LIM without a reason" finding would be wrong.
   */
  expectsFinding: boolean;
}

// ---------------------------------------------------------------------------------------------
// People
// ---------------------------------------------------------------------------------------------

/** Password of every demo account. Demo data only: never used outside a demo database. */
export const demoPassword = 'boardwalk-demo';

export const demoAccounts: readonly DemoAccount[] = [
  { email: 'admin@boardwalk.test', role: 'admin', name: 'Odile Marchbank' },
  { email: 'tester@boardwalk.test', role: 'tester', name: 'Callum Brierley' },
  { email: 'reviewer@boardwalk.test', role: 'reviewer', name: 'Ruth Okafor-Lane' },
];

// ---------------------------------------------------------------------------------------------
// Published values
// ---------------------------------------------------------------------------------------------

/** Conductor sizes (mm²) the demo uses. */
export type ConductorCsa = 1 | 1.5 | 2.5 | 4 | 6 | 10 | 16 | 25;

/** Resistance of plain copper conductors at 20 °C (Ω/km). Source: IEC 60228 Table 2 (class 2). */
export const conductorOhmPerKm: Readonly<Record<ConductorCsa, number>> = {
  1: 18.1,
  1.5: 12.1,
  2.5: 7.41,
  4: 4.61,
  6: 3.08,
  10: 1.83,
  16: 1.15,
  25: 0.727,
};

/** Resistance of one metre of a conductor at 20 °C (Ω/m), from IEC 60228. */
function ohmPerMetre(csa: ConductorCsa): number {
  return conductorOhmPerKm[csa] / 1000;
}

// ---------------------------------------------------------------------------------------------
// Planted faults
// ---------------------------------------------------------------------------------------------

const houseBoardReference = 'CU1';
const bakeryBoardReference = 'MDB-1';

export const plantedFaults: readonly PlantedFault[] = [
  {
    id: 'zs-over-max',
    boardReference: bakeryBoardReference,
    circuitNumber: '6L1',
    columns: ['zs'],
    cells: { r1PlusR2: { text: '1.40', reason: null }, zs: { text: '1.52', reason: null } },
    what:
      'Canopy heaters on a B32 circuit-breaker: measured Zs 1.52 Ω is over the 1.37 Ω maximum for 0.4 s ' +
      '(84 m of 4/1.5 mm² cable gives R1+R2 1.40 Ω on top of Zdb 0.13 Ω).',
    limit: '≤ 1.37 Ω',
    source: 'BS 7671:2018 Table 41.3 (type B, In 32 A, 0.4 s): Cmin·U0/Ia = 0.95 × 230 / (5 × 32)',
    expectsFinding: true,
  },
  {
    id: 'ring-ends-linked-wrongly',
    boardReference: houseBoardReference,
    circuitNumber: '5',
    columns: ['ringR1', 'ringR2', 'r1PlusR2'],
    cells: {
      ringR1: { text: '0.43', reason: null },
      ringRn: { text: '0.43', reason: null },
      ringR2: { text: '0.70', reason: null },
      r1PlusR2: { text: '0.57', reason: null },
      zs: { text: '0.50', reason: null },
    },
    what:
      'First-floor ring: R1+R2 0.57 Ω is about (r1+r2)/2 = 0.565 Ω, twice the (r1+r2)/4 = 0.28 Ω a ' +
      'correctly cross-connected ring reads: the ends were linked wrongly at step 3. Zs 0.50 Ω is far ' +
      'below Zdb + R1+R2 = 0.80 Ω, which points the same way.',
    limit: '≈ 0.28 Ω',
    source: 'Ring final circuit three-step test: cross-connected reading (r1+r2)/4 (two parallel paths)',
    expectsFinding: true,
  },
  {
    id: 'insulation-below-minimum',
    boardReference: bakeryBoardReference,
    circuitNumber: '5L1',
    columns: ['irLiveEarth'],
    cells: { irTestVoltage: { text: '500', reason: null }, irLiveEarth: { text: '0.6', reason: null } },
    what: 'Proving cabinet: insulation resistance live–earth 0.6 MΩ at 500 V DC, below the 1.0 MΩ minimum (damp heating element?).',
    limit: '≥ 1.0 MΩ at 500 V DC',
    source: 'BS 7671:2018 Table 64',
    expectsFinding: true,
  },
  {
    id: 'lim-without-reason',
    boardReference: bakeryBoardReference,
    circuitNumber: '9L3',
    columns: ['irLiveLive'],
    cells: { irLiveLive: { text: 'LIM', reason: null } },
    what: 'Fire alarm panel: insulation live–live recorded as LIM with no reason given.',
    limit: null,
    source: 'Common practice: every limitation is recorded with its reason before issue',
    expectsFinding: true,
  },
  {
    id: 'lim-with-reason',
    boardReference: houseBoardReference,
    circuitNumber: '11',
    columns: ['irLiveLive'],
    cells: {
      irLiveLive: {
        text: 'LIM',
        reason: 'Boiler control board could not be disconnected; L–N not tested to avoid damage, L+N to E tested.',
      },
    },
    what: 'Boiler and heating controls: insulation live–live recorded as LIM with its reason (a control case: no missing-reason finding).',
    limit: null,
    source: 'Common practice: every limitation is recorded with its reason before issue',
    expectsFinding: false,
  },
];

// ---------------------------------------------------------------------------------------------
// Seeded scatter
// ---------------------------------------------------------------------------------------------

/** A tiny seeded generator (mulberry32): the same seed always gives the same sequence. */
export function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function pick<T>(random: () => number, items: readonly T[]): T {
  const item = items[Math.floor(random() * items.length)];
  if (item === undefined) throw new Error('pick() needs at least one item');
  return item;
}

function integerBetween(random: () => number, low: number, high: number): number {
  return low + Math.floor(random() * (high - low + 1));
}

/** Ohms as a tester writes them: two decimals, rounded half-up (the epsilon absorbs binary noise). */
function ohms(value: number): string {
  return (Math.round(value * 100 + 1e-7) / 100).toFixed(2);
}

// ---------------------------------------------------------------------------------------------
// Circuit specifications
// ---------------------------------------------------------------------------------------------

type Fill = 'full' | 'dead-tests' | 'none';

interface DeviceSpec {
  standard: '60898' | '61009' | '88-2';
  type: 'B' | 'C' | 'D' | 'gG';
  ratingA: number;
  breakingKa: number;
}

interface CircuitSpec {
  number: string;
  phase: CircuitFields['phase'];
  description: string;
  kind: CircuitKind;
  /** Type of wiring, letter code of the model forms (A: thermoplastic insulated and sheathed, …). */
  wiring: string;
  referenceMethod: string;
  points: number | null;
  live: ConductorCsa;
  cpc: ConductorCsa;
  maxDisconnectionS: number;
  device: DeviceSpec;
  /** An RCD (or the RCD part of an RCBO), 30 mA. */
  rcd: 'A' | 'AC' | null;
  afdd: boolean;
  /** Cable length (m): end to end for a ring, origin to the farthest point otherwise. */
  lengthM: number;
  spur?: { ringNumber: string; originPoint: string; fractionAlongRing: number };
  remarks?: string;
  /** Which readings the tester has typed so far. */
  fill: Fill;
}

/** A circuit-breaker to BS EN 60898. */
function mcb(type: 'B' | 'C' | 'D', ratingA: number, breakingKa: number): DeviceSpec {
  return { standard: '60898', type, ratingA, breakingKa };
}

/** An RCBO to BS EN 61009 (the RCD part is given by the circuit's `rcd`). */
function rcbo(type: 'B' | 'C' | 'D', ratingA: number, breakingKa: number): DeviceSpec {
  return { standard: '61009', type, ratingA, breakingKa };
}

/** A BS 88-2 gG fuse, 80 kA. */
function fuse(ratingA: number): DeviceSpec {
  return { standard: '88-2', type: 'gG', ratingA, breakingKa: 80 };
}

interface BoardSpec extends Omit<DemoBoard, 'circuits'> {
  seed: number;
  /** When the tester started typing the board's readings (ISO). */
  typedFrom: string;
  /** Insulation readings this board's tester met, to draw from (their meter's range shows in them). */
  insulationReadings: readonly string[];
  /** RCD operating times (ms) at IΔn to draw from, by RCD type. */
  rcdTimeMs: Readonly<Record<'A' | 'AC', readonly [number, number]>>;
  circuits: CircuitSpec[];
}

// ---------------------------------------------------------------------------------------------
// Board 1: a house rewire (EIC), single-phase consumer unit, every way on an RCBO
// ---------------------------------------------------------------------------------------------

const houseRcbo = (type: 'B' | 'C', ratingA: number): DeviceSpec => rcbo(type, ratingA, 6);

const houseCircuits: CircuitSpec[] = [
  { number: '1', phase: null, description: 'Cooker', kind: 'radial', wiring: 'A', referenceMethod: 'C', points: 1, live: 6, cpc: 2.5, maxDisconnectionS: 0.4, device: houseRcbo('B', 32), rcd: 'A', afdd: false, lengthM: 9, fill: 'full' },
  { number: '2', phase: null, description: 'Shower', kind: 'radial', wiring: 'A', referenceMethod: 'C', points: 1, live: 10, cpc: 4, maxDisconnectionS: 0.4, device: houseRcbo('B', 40), rcd: 'A', afdd: false, lengthM: 14, fill: 'full' },
  { number: '3', phase: null, description: 'Kitchen sockets', kind: 'ring', wiring: 'A', referenceMethod: '102', points: 9, live: 2.5, cpc: 1.5, maxDisconnectionS: 0.4, device: houseRcbo('B', 32), rcd: 'A', afdd: false, lengthM: 48, fill: 'full' },
  { number: '4', phase: null, description: 'Ground-floor sockets', kind: 'ring', wiring: 'A', referenceMethod: '102', points: 12, live: 2.5, cpc: 1.5, maxDisconnectionS: 0.4, device: houseRcbo('B', 32), rcd: 'A', afdd: true, lengthM: 62, fill: 'full' },
  {
    number: '4a', phase: null, description: 'Garage freezer (unfused spur)', kind: 'spur', wiring: 'A', referenceMethod: 'C', points: 1, live: 2.5, cpc: 1.5, maxDisconnectionS: 0.4, device: houseRcbo('B', 32), rcd: 'A', afdd: true, lengthM: 7,
    // Socket 5 of the twelve on the ring: 5/13 of the way round.
    spur: { ringNumber: '4', originPoint: 'socket 5', fractionAlongRing: 5 / 13 },
    remarks: 'Single socket in the garage, spurred from the hall socket.', fill: 'full',
  },
  { number: '5', phase: null, description: 'First-floor sockets', kind: 'ring', wiring: 'A', referenceMethod: '102', points: 11, live: 2.5, cpc: 1.5, maxDisconnectionS: 0.4, device: houseRcbo('B', 32), rcd: 'A', afdd: true, lengthM: 58, fill: 'full' },
  { number: '6', phase: null, description: 'Ground-floor lights', kind: 'radial', wiring: 'A', referenceMethod: '102', points: 10, live: 1.5, cpc: 1, maxDisconnectionS: 0.4, device: houseRcbo('B', 6), rcd: 'A', afdd: false, lengthM: 32, fill: 'full' },
  { number: '7', phase: null, description: 'First-floor lights', kind: 'radial', wiring: 'A', referenceMethod: '101', points: 12, live: 1.5, cpc: 1, maxDisconnectionS: 0.4, device: houseRcbo('B', 6), rcd: 'A', afdd: false, lengthM: 38, fill: 'full' },
  { number: '8', phase: null, description: 'Outside lights', kind: 'radial', wiring: 'A', referenceMethod: 'C', points: 4, live: 1.5, cpc: 1, maxDisconnectionS: 0.4, device: houseRcbo('B', 6), rcd: 'A', afdd: false, lengthM: 24, remarks: 'PIR floodlight and two wall lights.', fill: 'full' },
  { number: '9', phase: null, description: 'Immersion heater', kind: 'radial', wiring: 'A', referenceMethod: '102', points: 1, live: 2.5, cpc: 1.5, maxDisconnectionS: 0.4, device: houseRcbo('B', 16), rcd: 'A', afdd: false, lengthM: 12, fill: 'full' },
  { number: '10', phase: null, description: 'Smoke and heat alarms', kind: 'radial', wiring: 'A', referenceMethod: '101', points: 5, live: 1.5, cpc: 1, maxDisconnectionS: 0.4, device: houseRcbo('B', 6), rcd: 'A', afdd: false, lengthM: 26, remarks: 'Interlinked, mains with battery back-up.', fill: 'full' },
  { number: '11', phase: null, description: 'Boiler and heating controls', kind: 'radial', wiring: 'A', referenceMethod: '102', points: 2, live: 1.5, cpc: 1, maxDisconnectionS: 0.4, device: houseRcbo('B', 6), rcd: 'A', afdd: false, lengthM: 20, fill: 'full' },
  { number: '12', phase: null, description: 'Garage sockets and lights', kind: 'radial', wiring: 'A', referenceMethod: 'C', points: 4, live: 2.5, cpc: 1.5, maxDisconnectionS: 0.4, device: houseRcbo('B', 20), rcd: 'A', afdd: false, lengthM: 30, fill: 'full' },
  { number: '13', phase: null, description: 'Garden office', kind: 'radial', wiring: 'G', referenceMethod: 'D', points: 1, live: 6, cpc: 6, maxDisconnectionS: 0.4, device: houseRcbo('B', 32), rcd: 'A', afdd: false, lengthM: 35, remarks: '3-core SWA in duct; cpc is the third core.', fill: 'full' },
];

const houseBoard: BoardSpec = {
  seed: 20261118,
  reference: houseBoardReference,
  location: 'Understairs cupboard, hall',
  suppliedFrom: 'Origin: 100 A cut-out, 25 mm² meter tails',
  phases: 1,
  zdbOhm: 0.23,
  ipfKa: 1.3,
  polarityConfirmed: true,
  phaseSequenceConfirmed: false,
  instruments: 'Multifunction tester KVE-MFT-0231, calibrated 2026-08-03',
  typedFrom: '2026-11-18T15:10:00.000Z',
  insulationReadings: ['>200', '>200', '>200', '>200', '>200', '>200', '>200', '150'],
  rcdTimeMs: { A: [15, 30], AC: [15, 30] },
  circuits: houseCircuits,
};

// ---------------------------------------------------------------------------------------------
// Board 2: a craft bakery (EICR), 24-way TP&N main board, circuits numbered per phase
// ---------------------------------------------------------------------------------------------

interface WaySpec extends Omit<CircuitSpec, 'number' | 'phase' | 'fill'> {
  fill?: Fill;
}

const m10 = (type: 'B' | 'C' | 'D', ratingA: number): DeviceSpec => mcb(type, ratingA, 10);
const r10 = (type: 'B' | 'C' | 'D', ratingA: number): DeviceSpec => rcbo(type, ratingA, 10);
const fin = { maxDisconnectionS: 0.4, afdd: false } as const;

function lighting(description: string, ratingA: 6 | 10, points: number, lengthM: number, conduit = false): WaySpec {
  return {
    ...fin, description, kind: 'radial', wiring: conduit ? 'B' : 'A', referenceMethod: conduit ? 'B' : '100', points,
    live: 1.5, cpc: conduit ? 1.5 : 1, device: m10('B', ratingA), rcd: null, lengthM,
  };
}

function officeRing(description: string, points: number, lengthM: number, rcd: 'A' | 'AC'): WaySpec {
  return {
    ...fin, description, kind: 'ring', wiring: 'A', referenceMethod: '100', points, live: 2.5, cpc: 1.5,
    device: r10('B', 32), rcd, lengthM,
  };
}

/** A ring in single-core cables in trunking or conduit, with a 2.5 mm² cpc: r2 reads like r1. */
function singlesRing(description: string, points: number, lengthM: number, wiring: 'B' | 'E'): WaySpec {
  return {
    ...fin, description, kind: 'ring', wiring, referenceMethod: 'B', points, live: 2.5, cpc: 2.5,
    device: r10('B', 32), rcd: 'A', lengthM,
  };
}

function fixedRadial(
  description: string,
  device: DeviceSpec,
  rcd: 'A' | 'AC' | null,
  size: readonly [ConductorCsa, ConductorCsa],
  lengthM: number,
  points: number | null = 1,
  wiring = 'A',
  referenceMethod = 'C',
): WaySpec {
  return {
    ...fin, description, kind: 'radial', wiring, referenceMethod, points, live: size[0], cpc: size[1], device, rcd, lengthM,
  };
}

/** Ways 1–20 of the TP&N board, three single-phase circuits each (L1, L2, L3). */
const bakeryWays: readonly (readonly [WaySpec, WaySpec, WaySpec])[] = [
  [lighting('Office lighting (ground floor)', 10, 14, 36), lighting('Production lighting, bay 1', 10, 8, 42, true), lighting('Production lighting, bay 2', 10, 8, 48, true)],
  [officeRing('Office sockets, ring A', 12, 52, 'AC'), officeRing('Office sockets, ring B', 14, 64, 'AC'), officeRing('Meeting room sockets', 8, 46, 'A')],
  [lighting('Production lighting, bay 3', 10, 8, 54, true), lighting('Stair and corridor lighting', 6, 9, 30), lighting('Toilets lighting and extract', 6, 7, 22)],
  [
    singlesRing('Production sockets, ring 1', 10, 70, 'E'),
    singlesRing('Production sockets, ring 2', 10, 76, 'E'),
    fixedRadial('Packing bench sockets', r10('B', 32), 'A', [4, 4], 28, 6, 'E', 'B'),
  ],
  [
    fixedRadial('Proving cabinet', r10('C', 16), 'A', [2.5, 2.5], 18, 1, 'E', 'B'),
    fixedRadial('Bread slicer', r10('C', 16), 'A', [2.5, 2.5], 20, 1, 'E', 'B'),
    fixedRadial('Dough divider', m10('D', 16), null, [2.5, 2.5], 16, 1, 'E', 'B'),
  ],
  [
    { ...fixedRadial('Canopy heaters (loading bay)', m10('B', 32), null, [4, 1.5], 84, 3), remarks: 'Three radiant heaters under the loading-bay canopy.' },
    fixedRadial('Commando sockets 16 A (goods-in)', r10('C', 16), 'A', [2.5, 2.5], 24, 3, 'B', 'B'),
    fixedRadial('Roller shutter, goods-in door', m10('C', 10), null, [1.5, 1], 18),
  ],
  [lighting('Shop lighting', 10, 16, 34), lighting('Shop display lighting', 6, 12, 26), { ...lighting('Signage and window lighting', 6, 4, 20), remarks: 'Via time switch.' }],
  [
    officeRing('Shop sockets', 10, 47, 'A'),
    fixedRadial('Display chiller (shop)', r10('C', 16), 'A', [2.5, 1.5], 15),
    fixedRadial('Coffee machine (shop)', r10('B', 20), 'A', [2.5, 1.5], 12),
  ],
  [
    officeRing('Staff room sockets', 8, 38, 'A'),
    fixedRadial('Hand dryers (toilets)', r10('B', 20), 'A', [2.5, 1.5], 26, 2),
    { ...fixedRadial('Fire alarm panel', m10('B', 6), null, [1.5, 1.5], 12, 1, 'O', 'C'), remarks: 'Fire-resistant cable; labelled at the board.' },
  ],
  [
    { ...fixedRadial('Emergency lighting (offices)', m10('B', 6), null, [1.5, 1.5], 40, 10, 'O', 'C') },
    { ...fixedRadial('Emergency lighting (production)', m10('B', 6), null, [1.5, 1.5], 52, 12, 'O', 'C') },
    { ...fixedRadial('Emergency lighting (shop and goods-in)', m10('B', 6), null, [1.5, 1.5], 44, 9, 'O', 'C') },
  ],
  [
    { ...fixedRadial('Intruder alarm and CCTV', m10('B', 6), null, [1.5, 1], 16, 2) },
    { ...fixedRadial('Door entry and access control', m10('B', 6), null, [1.5, 1], 24, 3) },
    { ...fixedRadial('Comms cabinet', r10('B', 16), 'A', [2.5, 1.5], 14, 2) },
  ],
  [
    { ...fixedRadial('Air conditioning (offices)', m10('C', 16), null, [2.5, 1.5], 22) },
    { ...fixedRadial('Air conditioning (shop)', m10('C', 16), null, [2.5, 1.5], 28) },
    { ...fixedRadial('Air conditioning (meeting room)', m10('C', 16), null, [2.5, 1.5], 18) },
  ],
  [
    { ...fixedRadial('Bakery extract fan', m10('C', 16), null, [2.5, 2.5], 26, 1, 'B', 'B') },
    { ...fixedRadial('Bread conveyor', m10('D', 10), null, [2.5, 2.5], 20, 1, 'B', 'B') },
    { ...fixedRadial('Cold room evaporator', m10('C', 16), null, [2.5, 2.5], 30, 1, 'B', 'B') },
  ],
  [
    { ...fixedRadial('Blast chiller', m10('C', 20), null, [4, 4], 24, 1, 'B', 'B') },
    { ...fixedRadial('Ice machine', r10('C', 16), 'A', [2.5, 2.5], 22, 1, 'B', 'B') },
    { ...fixedRadial('Wash-up sockets', r10('B', 20), 'A', [2.5, 2.5], 26, 4, 'B', 'B') },
  ],
  [
    { ...fixedRadial('Dishwasher (staff room)', r10('B', 16), 'A', [2.5, 1.5], 16) },
    { ...fixedRadial('Water heater (staff room)', r10('B', 16), 'A', [2.5, 1.5], 14) },
    { ...fixedRadial('Boiler and hot-water pump', r10('B', 6), 'A', [1.5, 1], 20, 2) },
  ],
  [
    { ...fixedRadial('Car park lighting', m10('B', 10), null, [2.5, 2.5], 60, 6, 'G', 'D'), remarks: '3-core SWA; cpc is the third core.' },
    { ...lighting('Yard security lighting', 6, 4, 32) },
    { ...fixedRadial('Roller shutter, despatch door', m10('C', 10), null, [1.5, 1], 22) },
  ],
  [
    { ...lighting('Warehouse lighting', 10, 10, 46, true) },
    { ...singlesRing('Warehouse sockets', 8, 66, 'B') },
    { ...lighting('Mezzanine lighting', 6, 6, 30) },
  ],
  [
    { ...officeRing('Despatch office sockets', 8, 42, 'A') },
    { ...fixedRadial('Printer and copier', r10('B', 20), 'A', [2.5, 1.5], 18, 2) },
    { ...fixedRadial('Server cupboard air conditioning', m10('C', 16), null, [2.5, 1.5], 22) },
  ],
  [
    { ...fixedRadial("Cleaners' store sockets", r10('B', 16), 'A', [2.5, 1.5], 20, 2) },
    { ...fixedRadial('Vending machines (staff room)', r10('B', 20), 'A', [2.5, 1.5], 24, 2) },
    { ...fixedRadial('Display oven (shop)', r10('B', 32), 'A', [6, 2.5], 18) },
  ],
  [
    {
      ...fixedRadial('Sub-main to DB-3 (yard store)', fuse(32), null, [6, 6], 40, null, 'G', 'D'),
      kind: 'distribution', maxDisconnectionS: 5, remarks: '3-core SWA; cpc is the third core.',
    },
    {
      ...fixedRadial('Sub-main to DB-4 (despatch)', fuse(40), null, [10, 10], 30, null, 'G', 'E'),
      kind: 'distribution', maxDisconnectionS: 5, remarks: '3-core SWA; cpc is the third core.',
    },
    { ...fixedRadial('Yard socket pillar (32 A)', r10('C', 32), 'A', [6, 6], 20, 1, 'G', 'D') },
  ],
];

/** Ways 21–24: three-phase circuits, one way across L1, L2 and L3. */
const bakeryThreePhaseWays: readonly CircuitSpec[] = [
  {
    number: '21TP', phase: 'TP', description: 'Sub-main to DB-2 (first-floor offices)', kind: 'distribution', wiring: 'G', referenceMethod: 'E', points: null,
    live: 16, cpc: 16, maxDisconnectionS: 5, device: fuse(63), rcd: null, afdd: false, lengthM: 35, remarks: '5-core SWA on tray.', fill: 'full',
  },
  {
    number: '22TP', phase: 'TP', description: 'Deck oven', kind: 'radial', wiring: 'G', referenceMethod: 'E', points: 1,
    live: 6, cpc: 6, maxDisconnectionS: 0.4, device: fuse(32), rcd: null, afdd: false, lengthM: 18, fill: 'full',
  },
  {
    number: '23TP', phase: 'TP', description: 'Spiral dough mixer', kind: 'radial', wiring: 'G', referenceMethod: 'C', points: 1,
    live: 4, cpc: 4, maxDisconnectionS: 0.4, device: m10('D', 20), rcd: null, afdd: false, lengthM: 14, fill: 'full',
  },
  {
    number: '24TP', phase: 'TP', description: 'Air compressor', kind: 'radial', wiring: 'G', referenceMethod: 'C', points: 1,
    live: 4, cpc: 4, maxDisconnectionS: 0.4, device: m10('C', 20), rcd: null, afdd: false, lengthM: 22, fill: 'full',
  },
];

const phases = ['L1', 'L2', 'L3'] as const;

const bakeryCircuits: CircuitSpec[] = [
  ...bakeryWays.flatMap((way, index) =>
    way.map(({ fill, ...spec }, p): CircuitSpec => {
      const phase = phases[p] ?? 'L1';
      return { ...spec, number: `${index + 1}${phase}`, phase, fill: fill ?? 'full' };
    }),
  ),
  ...bakeryThreePhaseWays,
];

const bakeryBoard: BoardSpec = {
  seed: 20261124,
  reference: bakeryBoardReference,
  location: 'Switch room, goods-in corridor',
  suppliedFrom: 'Origin: 200 A TP&N cut-out via 125 A TP&N switch-fuse',
  phases: 3,
  zdbOhm: 0.13,
  ipfKa: 7.9,
  polarityConfirmed: true,
  phaseSequenceConfirmed: true,
  instruments: 'Multifunction tester KVE-MFT-0187, calibrated 2026-06-21; clamp meter KVE-CM-0042',
  typedFrom: '2026-11-24T16:20:00.000Z',
  insulationReadings: ['>200', '>200', '>200', '>200', '>200', '150', '120', '95', '70'],
  rcdTimeMs: { A: [17, 34], AC: [21, 41] },
  circuits: bakeryCircuits,
};

// ---------------------------------------------------------------------------------------------
// Readings
// ---------------------------------------------------------------------------------------------

/**
 * Columns in the order the tester types them, column by column down the board: the reading
 * columns as the grid shows them, without R2 by long lead (R1+R2 is recorded instead).
 */
const entryOrder: readonly ReadingKey[] = readingKeys.filter((key) => key !== 'r2');

/** The dead tests: everything typed before Zs (continuity, insulation, polarity). */
const deadTestColumns: ReadonlySet<ReadingKey> = new Set(entryOrder.slice(0, entryOrder.indexOf('zs')));

/** End-to-end readings of a ring as measured, kept unrounded for the spurs that hang from it. */
interface RingEnds {
  r1: number;
  r2: number;
}

/**
 * The cross-connected L–cpc reading a fraction x round a ring:
 * [r1·r2 + x(1−x)(r1−r2)²] / (r1+r2), which peaks at (r1+r2)/4 at mid-ring (two parallel paths).
 */
function ringReadingAt(ring: RingEnds, x: number): number {
  return (ring.r1 * ring.r2 + x * (1 - x) * (ring.r1 - ring.r2) ** 2) / (ring.r1 + ring.r2);
}

function computeReadings(
  board: BoardSpec,
  spec: CircuitSpec,
  random: () => number,
  rings: Map<string, RingEnds>,
): Partial<Record<ReadingKey, string>> {
  const perMetreLive = ohmPerMetre(spec.live);
  const perMetreCpc = ohmPerMetre(spec.cpc);
  const values: Partial<Record<ReadingKey, string>> = {};

  let r1PlusR2: number;
  if (spec.kind === 'ring') {
    const r1 = spec.lengthM * perMetreLive;
    const r2 = spec.lengthM * perMetreCpc;
    rings.set(spec.number, { r1, r2 });
    values.ringR1 = ohms(r1);
    // The neutral reads within a hundredth of the line: same cable, different terminations.
    values.ringRn = ohms(r1 + pick(random, [-0.01, 0, 0, 0.01]));
    values.ringR2 = ohms(r2);
    // The highest socket reading is recorded; the spread across sockets is a hundredth or so.
    r1PlusR2 = (r1 + r2) / 4 + pick(random, [0, 0, 0.01]);
  } else if (spec.kind === 'spur' && spec.spur) {
    const ring = rings.get(spec.spur.ringNumber);
    if (!ring) throw new Error(`Spur ${spec.number} names ring ${spec.spur.ringNumber}, which comes later or is missing`);
    // The ring's own reading at the spur's origin, plus the spur cable in series.
    r1PlusR2 = ringReadingAt(ring, spec.spur.fractionAlongRing) + spec.lengthM * (perMetreLive + perMetreCpc);
  } else {
    // A radial is a series path: line out, cpc back.
    r1PlusR2 = spec.lengthM * (perMetreLive + perMetreCpc) + pick(random, [0, 0, 0, 0.01, -0.01]);
  }
  values.r1PlusR2 = ohms(r1PlusR2);

  values.irTestVoltage = '500';
  values.irLiveLive = pick(random, board.insulationReadings);
  values.irLiveEarth = pick(random, board.insulationReadings);
  values.polarity = '✓';

  // Measured Zs sits near Zdb + R1+R2, often a little lower (parallel earth paths), rarely exact.
  const zs = board.zdbOhm + Number(values.r1PlusR2) + pick(random, [-0.02, -0.01, -0.01, 0, 0.01, 0.02]);
  values.zs = ohms(zs);

  if (spec.rcd) {
    const [low, high] = board.rcdTimeMs[spec.rcd];
    values.rcdTimeMs = String(integerBetween(random, low, high));
    values.rcdButton = '✓';
  } else {
    values.rcdTimeMs = 'N/A';
    values.rcdButton = 'N/A';
  }
  values.afddButton = spec.afdd ? '✓' : 'N/A';

  if (spec.fill === 'full') return values;
  if (spec.fill === 'none') return {};
  return Object.fromEntries(Object.entries(values).filter(([key]) => deadTestColumns.has(key as ReadingKey)));
}

function plantedCellsFor(boardReference: string, circuitNumber: string): Partial<Record<ReadingKey, DemoCellValue>> {
  return Object.assign(
    {},
    ...plantedFaults
      .filter((f) => f.boardReference === boardReference && f.circuitNumber === circuitNumber)
      .map((f) => f.cells),
  ) as Partial<Record<ReadingKey, DemoCellValue>>;
}

function buildBoard(spec: BoardSpec): DemoBoard {
  const random = seededRandom(spec.seed);
  const rings = new Map<string, RingEnds>();

  const cellValues = spec.circuits.map((circuit) => {
    const computed = computeReadings(spec, circuit, random, rings);
    const cells: Partial<Record<ReadingKey, DemoCellValue>> = {};
    for (const [key, text] of Object.entries(computed) as [ReadingKey, string][]) cells[key] = { text, reason: null };
    return { ...cells, ...plantedCellsFor(spec.reference, circuit.number) };
  });

  // Timestamps follow the way the tester typed: one column at a time, down the board.
  const start = Date.parse(spec.typedFrom);
  let typed = 0;
  const cellsByCircuit: DemoCells[] = spec.circuits.map(() => ({}));
  for (const key of entryOrder) {
    cellValues.forEach((values, index) => {
      const value = values[key];
      const target = cellsByCircuit[index];
      if (value && target) {
        target[key] = { ...value, updatedAt: new Date(start + typed * 6_000).toISOString() };
        typed += 1;
      }
    });
  }

  const circuits = spec.circuits.map((circuit, index): DemoCircuit => ({
    number: circuit.number,
    phase: circuit.phase,
    description: circuit.description,
    kind: circuit.kind,
    wiringType: circuit.wiring,
    referenceMethod: circuit.referenceMethod,
    points: circuit.points,
    liveCsaMm2: circuit.live,
    cpcCsaMm2: circuit.cpc,
    maxDisconnectionS: circuit.maxDisconnectionS,
    // A radial's cable length, as a tester records it where known (its R1+R2 is checked against it).
    cableLengthM: circuit.kind === 'radial' || circuit.kind === 'distribution' ? circuit.lengthM : null,
    deviceStandard: circuit.device.standard,
    deviceType: circuit.device.type,
    ratingA: circuit.device.ratingA,
    breakingKa: circuit.device.breakingKa,
    rcdType: circuit.rcd,
    rcdRatedResidualMa: circuit.rcd ? 30 : null,
    afdd: circuit.afdd ? 'yes' : 'no',
    remarks: circuit.remarks ?? '',
    spurRingNumber: circuit.spur?.ringNumber ?? null,
    spurOriginPoint: circuit.spur?.originPoint ?? null,
    spurLengthM: circuit.spur ? circuit.lengthM : null,
    maxZsByHandOhm: null,
    cells: cellsByCircuit[index] ?? {},
  }));

  return {
    reference: spec.reference,
    location: spec.location,
    suppliedFrom: spec.suppliedFrom,
    phases: spec.phases,
    zdbOhm: spec.zdbOhm,
    ipfKa: spec.ipfKa,
    polarityConfirmed: spec.polarityConfirmed,
    phaseSequenceConfirmed: spec.phaseSequenceConfirmed,
    instruments: spec.instruments,
    circuits,
  };
}

// ---------------------------------------------------------------------------------------------
// The scenario
// ---------------------------------------------------------------------------------------------

/** Builds the whole demo. Deterministic: every call returns equal data. */
export function buildDemoScenario(): DemoScenario {
  return {
    contractor: 'Kestrel Vale Electrical Ltd',
    company: {
      name: 'Kestrel Vale Electrical Ltd',
      address: '3 Ropewalk Yard, Thornleigh, TL2 5HB',
      phone: '01632 960 427',
      email: 'office@kestrel-vale.example.test',
      registration: '',
      // Continues the demo jobs' references: the next EICR of 2026 is KVE-EICR-2026-058.
      referencePattern: 'KVE-{kind}-{yyyy}-{seq:3}',
      logoFileId: null,
    },
    users: demoAccounts.map((account) => ({ ...account })),
    typistEmail: 'tester@boardwalk.test',
    sites: [
      {
        client: 'Ms Rowena Penhallow',
        address: '14 Quarry Bank Road, Thornleigh, TL4 7QX',
        contactName: 'Rowena Penhallow',
        contactEmail: 'rowena.penhallow@example.test',
        description: 'Three-bedroom semi-detached house with garage and garden office; full rewire during refurbishment.',
        earthing: 'TN-C-S',
        nominalVoltageV: 230,
        zeOhm: 0.21,
        pfcKa: 1.4,
        jobs: [
          {
            kind: 'EIC',
            reference: 'KVE-EIC-2026-041',
            visitDate: '2026-11-18',
            limitations:
              'Insulation resistance between live conductors not measured where electronic controls could not be ' +
              'disconnected; recorded against each circuit.',
            boards: [buildBoard(houseBoard)],
            record: houseEicRecord,
            submitted: null,
          },
        ],
      },
      {
        client: 'Corbel Bakehouse Ltd',
        address: 'Unit 6, Saltmarsh Trading Estate, Fenwick Road, Ashby Marsh, AM3 9RD',
        contactName: 'Priya Venkatesan (facilities manager)',
        contactEmail: 'facilities@corbel-bakehouse.example.test',
        description:
          'Craft bakery in a single-storey steel-framed unit: production floor, retail shop, goods-in, warehouse and ' +
          'first-floor offices.',
        earthing: 'TN-S',
        nominalVoltageV: 230,
        zeOhm: 0.11,
        pfcKa: 8.2,
        jobs: [
          {
            kind: 'EICR',
            reference: 'KVE-EICR-2026-057',
            visitDate: '2026-11-24',
            limitations:
              'Sampling of 20% of accessories agreed with the facilities manager. Cables concealed in the building ' +
              'fabric not inspected. Refrigeration circuits tested after trading hours only. Sub-board DB-2 ' +
              '(first-floor offices) reported separately.',
            boards: [buildBoard(bakeryBoard)],
            record: bakeryEicrRecord,
            // Submitted the morning after the visit, once the board was typed up from the site sheets.
            submitted: {
              at: '2026-11-25T09:40:00.000Z',
              note:
                'MDB-1 typed up from the site sheets. 6L1 Zs over the limit is observation 3 (C2); 5L1 low ' +
                'insulation is observation 10 (FI). 9L3: the fire alarm panel could not be isolated during trading, ' +
                'so L–L was not tested; I left that reason off the LIM.',
              byEmail: 'tester@boardwalk.test',
              inspectorName: 'Callum Brierley',
            },
          },
        ],
      },
    ],
  };
}
