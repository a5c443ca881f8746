import type { Circuit, CircuitFields } from '../../../../shared/schemas/boards.ts';
import { isReadingKey, type ColumnKey } from '../../../../shared/schemas/columns.ts';
import { cleanReading } from '../../../../shared/readings/clean-reading.ts';
import { fieldText, parseDetailText } from '../grid/cell-value.ts';
import type { BoardSync, EntryMethod } from '../sync/types.ts';

/**
 * What became of a write: `text` (and `reason`) is what the cell shows afterwards; `written` is
 * false when the value was already there.
 */
export type WriteResult =
  | { ok: true; written: boolean; text: string; reason: string | null; stripped?: string | null }
  | { ok: false; message: string };

/**
 * Writes the text of one grid cell through the sync engine (never the API directly).
 *
 * - A reading column stores the text as typed, short forms written out, the column's unit or a
 *   dictation comma taken off and text that is not a value refused (see `cleanReading`). A LIM keeps the
 *   reason it already had unless one is given; any other value drops the reason.
 * - A detail column stores the typed field: the text is converted first, and text that cannot be
 *   converted is refused with a message for the cell and nothing is written.
 *
 * Unchanged values are not written again (`written: false`).
 */
export function writeCellText(
  sync: Pick<BoardSync, 'writeCell' | 'writeField'>,
  circuit: Circuit,
  column: ColumnKey,
  text: string,
  options: { how?: EntryMethod; reason?: string | null } = {},
): WriteResult {
  const how = options.how ?? 'typed';
  if (isReadingKey(column)) {
    const cleaned = cleanReading(column, text);
    if (!cleaned.ok) return cleaned;
    const value = cleaned.text;
    const stripped = cleaned.stripped;
    const current = circuit.cells[column];
    const isLim = value.toUpperCase() === 'LIM';
    const reason = options.reason !== undefined ? options.reason : isLim ? (current?.reason ?? null) : null;
    if ((current?.text ?? '') === value && (current?.reason ?? null) === reason) return { ok: true, written: false, text: value, reason, stripped };
    sync.writeCell(circuit.id, column, value, { reason, how });
    return { ok: true, written: true, text: value, reason, stripped };
  }
  const parsed = parseDetailText(column, text);
  if (!parsed.ok) return parsed;
  const shown = fieldText(parsed.value);
  if (circuit[column] === parsed.value) return { ok: true, written: false, text: shown, reason: null };
  sync.writeField(circuit.id, column as keyof CircuitFields, parsed.value as CircuitFields[keyof CircuitFields], { how });
  return { ok: true, written: true, text: shown, reason: null };
}
