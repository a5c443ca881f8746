import { z } from 'zod';
import {
  boardChangesResponseSchema,
  boardDetailResponseSchema,
  cellSchema,
  circuitResponseSchema,
  circuitSchema,
} from '../../../../shared/schemas/boards.ts';
import { readingKeys } from '../../../../shared/schemas/columns.ts';

/**
 * Response schemas as the console parses them.
 *
 * A circuit's `cells` hold only the readings written so far (the server sends no entry for a cell
 * never written), so they are parsed as a partial record: zod 4 reads `z.record(z.enum(…))` as
 * "every key present" and would refuse a half-filled board.
 */
const cellsSchema = z.partialRecord(z.enum(readingKeys), cellSchema);

export const circuitWireSchema = circuitSchema.extend({ cells: cellsSchema });

export const boardDetailWireSchema = boardDetailResponseSchema.extend({ circuits: z.array(circuitWireSchema) });

export const boardChangesWireSchema = boardChangesResponseSchema.extend({ circuits: z.array(circuitWireSchema) });

export const circuitWireResponseSchema = circuitResponseSchema.extend({ circuit: circuitWireSchema });

/** A 409 on a cell: the cell as it is now (null if it was never written). */
export const cellConflictDetailsSchema = z.object({ current: cellSchema.nullable() });

/** A 409 on circuit details: the circuit as it is now and the fields someone else changed. */
export const circuitConflictDetailsSchema = z.object({ current: circuitWireSchema, fields: z.array(z.string()) });

/** What a removal answers: the board's circuit ids in their new order. */
export const circuitOrderResponseSchema = z.object({ order: z.array(z.number().int()), cursor: z.number().int() });
