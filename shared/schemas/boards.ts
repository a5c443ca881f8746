import { z } from 'zod';
import { circuitKinds, rcdTypes, readingKeys, type ReadingKey } from './columns.ts';
import { findingSchema } from './findings.ts';
import { jobSchema, siteSchema } from './sites.ts';

export const boardStates = ['open', 'locked'] as const;
export const phaseLabels = ['L1', 'L2', 'L3', 'TP'] as const;
/** How a value reached the schedule; kept in the history of every change. */
export const entryMethods = ['typed', 'dictated', 'pasted', 'imported', 'filled'] as const;

const personSchema = z.object({ id: z.number().int(), name: z.string() });

export const boardSchema = z.object({
  id: z.number().int(),
  jobId: z.number().int(),
  reference: z.string(),
  location: z.string(),
  suppliedFrom: z.string(),
  phases: z.union([z.literal(1), z.literal(3)]),
  /** Earth fault loop impedance measured at the board (Ω). */
  zdbOhm: z.number().nullable(),
  /** Prospective fault current at the board (kA). */
  ipfKa: z.number().nullable(),
  polarityConfirmed: z.boolean(),
  phaseSequenceConfirmed: z.boolean(),
  /** Instruments used: free text, e.g. "MFT serial 40213, calibrated 2026-03-02". */
  instruments: z.string(),
  state: z.enum(boardStates),
  lockedBy: personSchema.nullable(),
  lockedAt: z.string().nullable(),
  version: z.number().int(),
});
export type Board = z.infer<typeof boardSchema>;

export const cellSchema = z.object({
  /** Text exactly as typed: "0.44", ">200", "N/A", "LIM", "✓". */
  text: z.string(),
  /** Reason recorded with a LIM (a limitation); null otherwise. */
  reason: z.string().nullable(),
  version: z.number().int(),
  updatedBy: personSchema.nullable(),
  updatedAt: z.string().nullable(),
});
export type Cell = z.infer<typeof cellSchema>;

export type Cells = Partial<Record<ReadingKey, Cell>>;

/** Fields of a circuit that people edit (the detail columns plus numbering and spur links). */
export const circuitFieldsSchema = z.object({
  number: z.string().trim().min(1, 'A circuit needs a number.').max(12),
  phase: z.enum(phaseLabels).nullable(),
  description: z.string().max(200),
  kind: z.enum(circuitKinds),
  wiringType: z.string().max(12),
  referenceMethod: z.string().max(12),
  points: z.number().int().min(0).max(999).nullable(),
  liveCsaMm2: z.number().positive().max(1000).nullable(),
  cpcCsaMm2: z.number().positive().max(1000).nullable(),
  maxDisconnectionS: z.number().positive().max(60).nullable(),
  /**
   * Length of the circuit's cable (m), when known: a radial's R1+R2 is checked against it. Optional
   * so circuits written before the field existed still fit.
   */
  cableLengthM: z.number().positive().max(2000).nullable().optional(),
  deviceStandard: z.string().max(20),
  deviceType: z.string().max(12),
  ratingA: z.number().positive().max(6300).nullable(),
  breakingKa: z.number().positive().max(200).nullable(),
  rcdType: z.enum(rcdTypes).nullable(),
  rcdRatedResidualMa: z.number().positive().max(3000).nullable(),
  afdd: z.enum(['yes', 'no']).nullable(),
  remarks: z.string().max(500),
  /** For a spur: the ring final circuit it hangs from. */
  spurRingId: z.number().int().positive().nullable(),
  /** For a spur: where on the ring it starts (e.g. "socket 4" or a fraction written as text). */
  spurOriginPoint: z.string().max(60).nullable(),
  /** For a spur: length of the spur cable (m), when known. */
  spurLengthM: z.number().positive().max(1000).nullable(),
  /**
   * For a spur: through a fused connection unit (`fused`, any number of points) or not (`unfused`:
   * one single or twin socket or one fixed appliance). Optional so circuits written before it fit.
   */
  spurProtection: z.enum(['fused', 'unfused']).nullable().optional(),
  /** A maximum Zs (Ω) entered by hand for a device the published tables do not cover. */
  // Up to 2000 Ω: on TT the limit set by an RCD is 50 V / IΔn (1667 Ω at 30 mA).
  maxZsByHandOhm: z.number().positive().max(2000).nullable(),
});
export type CircuitFields = z.infer<typeof circuitFieldsSchema>;

export const circuitSchema = circuitFieldsSchema.extend({
  id: z.number().int(),
  boardId: z.number().int(),
  position: z.number().int(),
  version: z.number().int(),
  // Only the cells ever written are present.
  cells: z.partialRecord(z.enum(readingKeys), cellSchema),
});
export type Circuit = Omit<z.infer<typeof circuitSchema>, 'cells'> & { cells: Cells };

export const boardSummarySchema = z.object({
  id: z.number().int(),
  reference: z.string(),
  location: z.string(),
  phases: z.union([z.literal(1), z.literal(3)]),
  state: z.enum(boardStates),
  circuitCount: z.number().int(),
  /** Reading cells holding a value. */
  cellsFilled: z.number().int(),
  /** Readings the board's circuits need (the checker's required columns), and how many hold a value. */
  readingsRequired: z.number().int(),
  readingsDone: z.number().int(),
  site: z.object({ id: z.number().int(), client: z.string(), address: z.string() }),
  job: z.object({ id: z.number().int(), kind: z.string(), reference: z.string() }),
});
export type BoardSummary = z.infer<typeof boardSummarySchema>;
export const boardListResponseSchema = z.object({ boards: z.array(boardSummarySchema) });

/**
 * The readings of one circuit last time: the same circuit (`circuits.previous_circuit_id`) on the
 * earlier job this board was started from, with that job's reference and visit date.
 */
export const previousReadingsSchema = z.object({
  /** The circuit on this board. */
  circuitId: z.number().int(),
  job: z.object({ id: z.number().int(), kind: z.string(), reference: z.string(), visitDate: z.string() }),
  cells: z.partialRecord(z.enum(readingKeys), z.object({ text: z.string(), reason: z.string().nullable() })),
});
export type PreviousReadings = z.infer<typeof previousReadingsSchema>;

export const boardDetailResponseSchema = z.object({
  board: boardSchema,
  site: siteSchema,
  job: jobSchema,
  circuits: z.array(circuitSchema),
  /** Last time's readings of the circuits that have a previous circuit; absent or empty otherwise. */
  previousReadings: z.array(previousReadingsSchema).optional(),
  findings: z.array(findingSchema),
  /** Cursor of the newest change included; pass it to the changes feed. */
  cursor: z.number().int(),
});
export type BoardDetail = Omit<z.infer<typeof boardDetailResponseSchema>, 'circuits'> & { circuits: Circuit[] };

// ---- request bodies ----

const decimalText = 'a number such as 0.4';

export const writeCellBodySchema = z.object({
  text: z.string().max(40, 'A reading is at most 40 characters.'),
  /** The version the typist last saw; 0 for a cell never written. */
  version: z.number({ error: 'Give the version of the cell you last saw (0 for a new cell).' }).int().min(0),
  reason: z.string().trim().max(300).nullable().optional(),
  how: z.enum(entryMethods).optional(),
});
export type WriteCellBody = z.infer<typeof writeCellBodySchema>;

export const writeCellResponseSchema = z.object({
  cell: cellSchema,
  findings: z.array(findingSchema),
  cursor: z.number().int(),
});

export const createCircuitBodySchema = circuitFieldsSchema.partial().extend({
  /** Insert after this circuit; omitted or null appends at the end. */
  afterCircuitId: z.number().int().positive().nullable().optional(),
});
export type CreateCircuitBody = z.infer<typeof createCircuitBodySchema>;

export const updateCircuitBodySchema = z.object({
  version: z.number().int().min(0),
  changes: circuitFieldsSchema.partial().refine((c) => Object.keys(c).length > 0, 'Nothing to change.'),
  how: z.enum(entryMethods).optional(),
});
export type UpdateCircuitBody = z.infer<typeof updateCircuitBodySchema>;

export const circuitResponseSchema = z.object({
  circuit: circuitSchema,
  findings: z.array(findingSchema),
  cursor: z.number().int(),
});

export const reorderCircuitsBodySchema = z.object({
  circuitIds: z.array(z.number().int().positive()).min(1),
});

export const updateBoardBodySchema = z.object({
  version: z.number().int().min(0),
  changes: z
    .object({
      reference: z.string().trim().min(1).max(60),
      location: z.string().max(120),
      suppliedFrom: z.string().max(120),
      // Up to 2000 Ω: on TT the earth electrode is in the loop, and hundreds of ohms are normal.
      zdbOhm: z.number({ error: `Zdb must be ${decimalText}.` }).nonnegative().max(2000, 'Zdb is at most 2000 Ω.').nullable(),
      ipfKa: z.number({ error: `Ipf must be ${decimalText}.` }).nonnegative().max(200).nullable(),
      polarityConfirmed: z.boolean(),
      phaseSequenceConfirmed: z.boolean(),
      instruments: z.string().max(300),
    })
    .partial()
    .refine((c) => Object.keys(c).length > 0, 'Nothing to change.'),
});
export type UpdateBoardBody = z.infer<typeof updateBoardBodySchema>;

export const unlockBoardBodySchema = z.object({
  reason: z.string().trim().min(5, 'Say why the board is being unlocked (at least 5 characters).').max(500),
});

export const boardResponseSchema = z.object({ board: boardSchema });

/** What changed on a board after a cursor: the live feed for a second typist. */
export const boardChangesResponseSchema = z.object({
  cursor: z.number().int(),
  board: boardSchema,
  /** Circuits changed after the cursor, whole (with their cells). */
  circuits: z.array(circuitSchema),
  /** The board's circuit ids in order, so inserts, removals and moves show. */
  order: z.array(z.number().int()),
  /** The board's findings; with `findingsScope: 'circuits'`, only those of the circuits above and the board-wide ones. */
  findings: z.array(findingSchema),
  /** 'circuits': `findings` covers only the circuits sent (and board-wide findings); absent or 'board': every finding. */
  findingsScope: z.enum(['board', 'circuits']).optional(),
  /** With `findingsScope: 'circuits'`: the circuits whose findings `findings` gives in full (none may remain). */
  findingsCircuits: z.array(z.number().int()).optional(),
  /** Other people with the board open in the last few seconds. */
  present: z.array(z.object({ id: z.number().int(), name: z.string() })),
});
export type BoardChanges = Omit<z.infer<typeof boardChangesResponseSchema>, 'circuits'> & { circuits: Circuit[] };

/** `GET /api/boards/:boardId/history?person=&column=`: the board's changes, newest first. */
export const boardHistoryQuerySchema = z.object({
  person: z.coerce.number().int().positive().optional(),
  column: z.string().max(40).optional(),
});

export const boardHistoryEntrySchema = z.object({
  id: z.number().int(),
  circuitId: z.number().int().nullable(),
  /** Null when the circuit was removed since, or the change is the board's own. */
  circuitNumber: z.string().nullable(),
  column: z.string().nullable(),
  /** What changed: a cell, a detail field, a circuit added or removed, the board locked or unlocked… */
  action: z.string(),
  oldText: z.string().nullable(),
  newText: z.string().nullable(),
  by: z.object({ id: z.number().int(), name: z.string() }).nullable(),
  at: z.string(),
  /** typed, dictated, pasted, imported, filled… */
  how: z.string(),
});
export type BoardHistoryEntry = z.infer<typeof boardHistoryEntrySchema>;
export const boardHistoryResponseSchema = z.object({ history: z.array(boardHistoryEntrySchema), people: z.array(z.object({ id: z.number().int(), name: z.string() })) });
