/**
 * Boardwalk's checker: the one public entry of `shared/checker/`.
 *
 * Pure functions, no I/O: the client calls them for instant findings as cells are typed, the server
 * on every save and at locking. Every limit carries the name of its source.
 *
 * - `parseCell(column, text)`: the cell grammar (numbers, >N, N/A, LIM, tick/cross).
 * - `maxZs(query)`: maximum Zs for a device (BS 7671:2018 Tables 41.2–41.4).
 * - `checkBoard(input)`: every finding on a board; `createBoardChecker()` for cheap re-checks.
 * - `ringProfile(input)`: a ring's socket-by-socket diagnosis; `diagnoseRingSockets` from cells as typed.
 * - `checkJob(input)`: findings about a job's record and what ties it to its boards.
 * - calculators: `expectedRadialR1PlusR2`, `maxCableLength`, `expectedRingReading`,
 *   `expectedSpurR1PlusR2`, and the ring network formulas (`ringReadingAt`,
 *   `bridgedRingReadingAt`, `spurEndReading`).
 * - the reference tables with their sources.
 */

export {
  /**
   * Reads a cell as typed into a value (`empty`, `number`, `over-range` for ">N", `na`, `lim`,
   * `pass`, `fail`) or `invalid` with a message saying what to write. Never throws.
   */
  parseCell,
  cellGrammars,
  grammarFor,
  cellNumber,
  isRecorded,
  plausibleRange,
  type ParsedCell,
  type CellProblem,
  type CellGrammar,
} from './cell-grammar.ts';

export {
  /**
   * Maximum Zs for a protective device and disconnection time, with its source; or `ok: false` and
   * the reason when the device is not in the tables (the limit may then be entered by hand).
   */
  maxZs,
  /** Maximum Zs where an RCD gives fault protection in a TT system: 50 V / IΔn. */
  rcdMaxZsTT,
  type MaxZsQuery,
  type MaxZsResult,
} from './max-zs.ts';

export {
  /** Reads the free-text device standard of a schedule ("BS EN 60898-1", "88-2"…). */
  normaliseDeviceStandard,
  normaliseBreakerType,
  deviceFamilyLabels,
  type DeviceFamily,
  type BreakerFamily,
  type StandardReading,
} from './devices.ts';

export {
  /**
   * Every finding on a board, sorted board-wide first, then by circuit id, code, columns and
   * message. Deterministic and independent of the order of the circuits.
   */
  checkBoard,
  /** A checker that caches each circuit's own findings by object identity, for re-checks after an edit. */
  createBoardChecker,
  /** The reading columns a circuit of a kind needs for the schedule to be complete. */
  requiredColumns,
  /** Reads a spur's origin ("socket 4", "0.4", "40%", "1/2") as a fraction along its ring. */
  spurOriginFraction,
  /** Every finding code with its severity. */
  findingCodes,
  compareFindings,
  type FindingCode,
} from './rules.ts';

export {
  /**
   * Diagnoses a ring from its L-cpc readings at each socket, with the value to record as R1+R2.
   * Without socket positions (the usual case) each reading is judged against the range a sound ring
   * reads anywhere, r1·r2/(r1+r2) … (r1+r2)/4.
   */
  ringProfile,
  /** The reading at a socket of a cross-connected ring (correct or same-end linking). */
  ringReadingAt,
  /** The same, with interconnections (bridges) across the ring, solved exactly. */
  bridgedRingReadingAt,
  /** The reading at the far end of a spur: ring value at its origin + spur line + spur cpc. */
  spurEndReading,
  /** Closed form of a sound ring at fraction x: [r1·r2 + x(1−x)(r1−r2)²]/(r1+r2). */
  correctRingReading,
  /** Closed form of a ring with the same ends linked, at fraction x: x(1−x)(r1+r2). */
  sameEndsRingReading,
  type RingPoint,
  type RingLinking,
  type RingBridge,
  type RingVerdict,
  type RingProfileInput,
  type RingProfile,
} from './ring.ts';

export {
  /** A ring's diagnosis from its r1/rn/r2 cells and its socket readings as typed. */
  diagnoseRingSockets,
  /** A socket reading as typed, in ohms (null when blank or not a number). */
  socketOhms,
  /** Each ring verdict in a few plain words. */
  ringVerdictText,
  type RingEndCells,
} from './ring-sockets.ts';

export {
  /** Expected R1+R2 of a radial from its length, conductor sizes and a temperature factor. */
  expectedRadialR1PlusR2,
  /** The longest cable run a device and cable allow, from maximum Zs, Ze (or Zdb) and R1+R2 per metre. */
  maxCableLength,
  /** A ring's expected cross-connected readings: (r1+r2)/4 and (r1+rn)/4. */
  expectedRingReading,
  /** A spur's expected R1+R2: ring value at its origin + spur length × R1+R2 per metre. */
  expectedSpurR1PlusR2,
  type Calculation,
} from './calculators.ts';

export {
  copperConductorResistances,
  conductorResistance,
  r1PlusR2PerMetre,
  tradeTemperatureFactors,
  iec60228Kt,
  iec60228FactorFrom20C,
  COPPER_ALPHA_20,
  C_MIN,
  UK_U0,
  breakerTripMultiples,
  fuseTables,
  disconnectionTimes,
  finalCircuitTimesByU0,
  defaultDisconnectionTimeS,
  REDUCED_TEST_VOLTAGE_MINIMUM_MEGOHM,
  REDUCED_TEST_VOLTAGE_SOURCE,
  TT_ELECTRODE_STABLE_UP_TO_OHM,
  TT_ELECTRODE_STABLE_SOURCE,
  twinAndEarthCapacityMethodC,
  TWIN_AND_EARTH_CAPACITY_SOURCE,
  rcdFiveTimesDelayedLimit,
  SOCKET_RCD_SOURCE,
  insulationMinima,
  insulationMinimum,
  rcdTimeLimits,
  rcdTimeLimit,
  rcdFiveTimesLimit,
  isTimeDelayedRcd,
  ringLengthGuidance,
  unfusedSpurGuidance,
  IEC_60228_SOURCE,
  TABLE_64_SOURCE,
  TABLE_41_1_SOURCE,
  RCD_TIME_SOURCE,
  BREAKING_CAPACITY_SOURCE,
  ZS_RULE_OF_THUMB_FACTOR,
  ZS_RULE_OF_THUMB_SOURCE,
  type ConductorResistance,
  type FuseFamily,
  type FuseRow,
  type FuseTable,
  type InsulationMinimum,
  type RcdTimeLimit,
  type DisconnectionTimeRow,
  type FinalCircuitTimeRow,
  type Lookup,
} from './reference-data.ts';

export { roundHalfUp, formatFixed } from './decimal.ts';

export {
  /** Every finding about a job as a whole: its record, and the record against its boards. */
  checkJob,
  jobRules,
  /** Every code the job rules emit, with its severity. */
  jobFindingCodes,
  /** Whether a summary's words call the installation satisfactory (not "unsatisfactory"). */
  claimsSatisfactory,
  type JobCheckInput,
  type JobCheckBoard,
  type JobFindingCode,
} from './job-rules.ts';

export {
  /** The smallest main protective bonding conductor: 544.1.1, and Table 54.8 for PME. */
  mainBondingMinimum,
  pmeBondingTable,
  TT_TOUCH_VOLTAGE_V,
  ELECTRODE_STABLE_MAX_OHM,
  type MainBondingQuery,
  type MainBondingMinimum,
} from './earthing-and-bonding.ts';

export {
  /** Notes on a circuit's readings against the same circuit last time (called by `checkBoard`). */
  previousReadingFindings,
  previousReadingCodes,
} from './previous-readings.ts';
