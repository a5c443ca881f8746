import { parseCell } from '../checker/index.ts';
import { columnByKey, type ReadingKey } from '../schemas/columns.ts';

/**
 * A reading as it is stored: trimmed, and written the way a schedule writes it when what was typed
 * is one of the trade's short forms — a bare leading point gets its zero (".44" → "0.44"), a tick or
 * cross typed from the keyboard becomes the symbol in a pass/fail column ("v", "ok" → "✓"; "x" →
 * "✗"), and "na", "lim" become "N/A", "LIM". Anything else is kept exactly as typed (a slip stays
 * visible for the checker to flag).
 *
 * Shared by the console (typed, pasted, dictated values) and the file import, so a value reads the
 * same whichever way it came in.
 */
export function normaliseReading(column: ReadingKey, text: string): string {
  const trimmed = text.trim();
  if (/^\.\d/.test(trimmed)) return `0${trimmed}`;
  if (/^>\.\d/.test(trimmed)) return `>0${trimmed.slice(1)}`;
  const parsed = parseCell(column, trimmed);
  switch (parsed.kind) {
    case 'na':
      return 'N/A';
    case 'lim':
      return 'LIM';
    case 'pass':
      return columnByKey[column].valueKind === 'pass-fail' ? '✓' : trimmed;
    case 'fail':
      return columnByKey[column].valueKind === 'pass-fail' ? '✗' : trimmed;
    default:
      return trimmed;
  }
}
