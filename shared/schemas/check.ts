import { z } from 'zod';
import { circuitFieldsSchema } from './boards.ts';
import { readingKeys } from './columns.ts';
import { findingSchema } from './findings.ts';
import { earthingArrangements } from './sites.ts';

/** A cell as the checker needs it: the text as typed, and the reason given with a LIM. */
export const checkCellSchema = z.object({
  text: z.string().max(40),
  reason: z.string().nullable().optional(),
});

export const checkCircuitSchema = circuitFieldsSchema.extend({
  id: z.number().int(),
  cells: z.partialRecord(z.enum(readingKeys), checkCellSchema),
  /**
   * The same circuit's cells on the earlier job this board was started from, when there is one:
   * readings are compared with last time (`shared/checker/previous-readings.ts`).
   */
  previous: z.partialRecord(z.enum(readingKeys), checkCellSchema).optional(),
});

/**
 * The checker's input: a board's details, the site facts the limits depend on, and its circuits
 * with their cells as typed. A board fetched from the API (board + site + circuits) fits it.
 */
export const checkInputSchema = z.object({
  board: z.object({
    phases: z.union([z.literal(1), z.literal(3)]),
    zdbOhm: z.number().nullable(),
    ipfKa: z.number().nullable(),
    polarityConfirmed: z.boolean(),
  }),
  site: z.object({
    earthing: z.enum(earthingArrangements),
    nominalVoltageV: z.number().positive(),
  }),
  circuits: z.array(checkCircuitSchema).max(5000),
});
export type CheckInput = z.infer<typeof checkInputSchema>;
export type CheckCircuit = z.infer<typeof checkCircuitSchema>;
export type CheckCell = z.infer<typeof checkCellSchema>;

export const checkResponseSchema = z.object({ findings: z.array(findingSchema) });

type CellsAsServed = Partial<Record<string, { text: string; reason?: string | null } | undefined>>;

function toCheckCells(cells: CellsAsServed): CheckCircuit['cells'] {
  const checkCells: CheckCircuit['cells'] = {};
  for (const [key, cell] of Object.entries(cells)) {
    if (cell) checkCells[key as keyof CheckCircuit['cells']] = { text: cell.text, reason: cell.reason ?? null };
  }
  return checkCells;
}

/**
 * Shapes a board as the API returns it (board, site, circuits with cells, and the readings of the
 * same circuits last time when the board was started from an earlier job) as the checker's input.
 */
export function boardToCheckInput(detail: {
  board: { phases: 1 | 3; zdbOhm: number | null; ipfKa: number | null; polarityConfirmed: boolean };
  site: { earthing: CheckInput['site']['earthing']; nominalVoltageV: number };
  circuits: ReadonlyArray<z.infer<typeof circuitFieldsSchema> & { id: number; cells: CellsAsServed }>;
  previousReadings?: ReadonlyArray<{ circuitId: number; cells: CellsAsServed }>;
}): CheckInput {
  const previousById = detail.previousReadings && detail.previousReadings.length > 0 ? new Map(detail.previousReadings.map((p) => [p.circuitId, p.cells])) : null;
  return {
    board: {
      phases: detail.board.phases,
      zdbOhm: detail.board.zdbOhm,
      ipfKa: detail.board.ipfKa,
      polarityConfirmed: detail.board.polarityConfirmed,
    },
    site: { earthing: detail.site.earthing, nominalVoltageV: detail.site.nominalVoltageV },
    circuits: detail.circuits.map((circuit) => {
      const previous = previousById?.get(circuit.id);
      return toCheckCircuit(circuit, toCheckCells(circuit.cells), previous ? toCheckCells(previous) : undefined);
    }),
  };
}

/**
 * One circuit as the checker's input, written out field by field. Measured: circuits made by
 * `const { cells, ...fields } = c; ({ ...fields, cells })` took the checker about twice the CPU of
 * circuits built as one object literal (≈3.5 against ≈1.7 ms for 1,000 circuits), so every circuit
 * is built here with the same literal shape, `previous` included (undefined when there is none).
 * A field added to `circuitFieldsSchema` must be added here: the `satisfies` below names every key,
 * optional ones included, so the type checker refuses the literal until it is.
 */
function toCheckCircuit(c: z.infer<typeof circuitFieldsSchema> & { id: number }, cells: CheckCircuit['cells'], previous: CheckCircuit['cells'] | undefined): CheckCircuit {
  return {
    id: c.id,
    number: c.number,
    phase: c.phase,
    description: c.description,
    kind: c.kind,
    wiringType: c.wiringType,
    referenceMethod: c.referenceMethod,
    points: c.points,
    liveCsaMm2: c.liveCsaMm2,
    cpcCsaMm2: c.cpcCsaMm2,
    maxDisconnectionS: c.maxDisconnectionS,
    // Optional in the schema (circuits written before it existed), so the type does not ask for it.
    cableLengthM: c.cableLengthM ?? null,
    deviceStandard: c.deviceStandard,
    deviceType: c.deviceType,
    ratingA: c.ratingA,
    breakingKa: c.breakingKa,
    rcdType: c.rcdType,
    rcdRatedResidualMa: c.rcdRatedResidualMa,
    afdd: c.afdd,
    remarks: c.remarks,
    spurRingId: c.spurRingId,
    spurOriginPoint: c.spurOriginPoint,
    spurLengthM: c.spurLengthM,
    spurProtection: c.spurProtection ?? null,
    maxZsByHandOhm: c.maxZsByHandOhm,
    cells,
    previous,
  } satisfies Record<keyof Required<CheckCircuit>, unknown>;
}
