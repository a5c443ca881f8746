import type { CircuitFields } from '../../../../shared/schemas/boards.ts';
import type { ReadingKey } from '../../../../shared/schemas/columns.ts';
import type { OutboxEntry } from './outbox-storage.ts';
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

/**
 * The grid's "not yet on the server" marks: per circuit, the reading columns and circuit details
 * with an edit of this typist still to be sent, as " key key " (the form BoardGrid's `pending`
 * takes). Made from the outbox, so its cost follows the edits waiting, not the size of the board.
 * An edit held by a conflict is not marked: its cell shows the conflict instead.
 */
export function pendingMarks(entries: readonly OutboxEntry[]): Map<number, string> {
  const keys = new Map<number, Set<string>>();
  for (const { edit, conflict } of entries) {
    if (conflict) continue;
    let row = keys.get(edit.circuitId);
    if (!row) keys.set(edit.circuitId, (row = new Set()));
    row.add(edit.kind === 'cell' ? edit.column : edit.field);
  }
  const marks = new Map<number, string>();
  for (const [circuitId, row] of keys) marks.set(circuitId, ` ${[...row].join(' ')} `);
  return marks;
}
