import type { CircuitFields } from '../../../../shared/schemas/boards.ts';
import type { ReadingKey } from '../../../../shared/schemas/columns.ts';
import type { PendingEdit } from './types.ts';

/**
 * What an edit writes to, as one string: a reading cell (`cell:<circuitId>:<column>`) or a circuit
 * detail (`field:<circuitId>:<field>`). Two edits with the same target write the same value on the
 * server, so they are rebased, folded and protected together.
 */
export type EditTarget = string;

export const cellTarget = (circuitId: number, column: ReadingKey): EditTarget => `cell:${circuitId}:${column}`;

export const fieldTarget = (circuitId: number, field: keyof CircuitFields): EditTarget => `field:${circuitId}:${field}`;

export function targetOf(edit: PendingEdit): EditTarget {
  return edit.kind === 'cell' ? cellTarget(edit.circuitId, edit.column) : fieldTarget(edit.circuitId, edit.field);
}

/** A circuit detail's value as the text a person reads (null → empty). */
export function fieldValueText(value: CircuitFields[keyof CircuitFields] | undefined): string {
  return value === null || value === undefined ? '' : String(value);
}
