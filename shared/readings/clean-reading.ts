import { cellGrammars, parseCell } from '../checker/index.ts';
import { columnByKey, readingKeys, type ReadingKey } from '../schemas/columns.ts';
import { normaliseReading } from './normalise-reading.ts';

/**
 * What the console makes of text typed, pasted or dictated into a reading cell before it is saved:
 * - `ok` with the text to store (short forms spelt out, see `normaliseReading`) and, when something
 *   unambiguous was taken off, `stripped` saying what in words for the status line;
 * - not `ok` with a message: the text is not a value and is not saved.
 *
 * Taken off (unambiguous): the column's own unit after a number (`0.44Ω`, `0.44 ohm`, `200 MΩ`,
 * `24ms`, `500 V`), and a trailing comma or semicolon left by dictation (`0.44,`).
 * Refused: a unit of another column (`24 ms` in Zs), a lone dash, words, a comma for a point, a
 * number in a ✓/✗ column or a tick in a number column — every `invalid` of the cell grammar except
 * a value outside the plausible range or an unusual test voltage, which are values the checker
 * then reports (a real reading may be odd; it must stay visible, not be refused).
 */
export type CleanReading = { ok: true; text: string; stripped: string | null } | { ok: false; message: string };

/** Unit words of every reading column, longest first, each with the unit it stands for. */
const UNIT_WORDS: ReadonlyArray<{ word: string; unit: string }> = (() => {
  const all = new Map<string, string>();
  for (const key of readingKeys) {
    const grammar = cellGrammars[key];
    if (!grammar.unit) continue;
    for (const word of grammar.unitWords) if (!all.has(word)) all.set(word, grammar.unit);
  }
  return [...all.entries()].map(([word, unit]) => ({ word, unit })).sort((a, b) => b.word.length - a.word.length);
})();

const NUMBER_THEN_REST = /^(>=?|≥)?\s*(\d+\.?\d*|\.\d+)\s*(.*)$/;

export function cleanReading(column: ReadingKey, typed: string): CleanReading {
  let text = typed.trim();
  const notes: string[] = [];
  // Dictation ("7 zs .44, ir >200") leaves a comma or semicolon after a value.
  const trailing = /[,;]+$/.exec(text);
  if (trailing && text.length > trailing[0].length) {
    text = text.slice(0, -trailing[0].length).trimEnd();
    notes.push(`the “${trailing[0]}” after it`);
  }
  const grammar = cellGrammars[column];
  const match = NUMBER_THEN_REST.exec(text);
  if (match && match[3] !== '') {
    const rest = match[3]!.trim();
    const lower = rest.toLowerCase();
    const own = grammar.unitWords.includes(lower);
    const known = UNIT_WORDS.find((u) => u.word === lower);
    if (own) {
      text = `${match[1] ?? ''}${match[2]}`;
      notes.push(`the unit “${rest}”`);
    } else if (known && grammar.unit) {
      return { ok: false, message: `${columnByKey[column].label} is in ${grammar.unit}, not ${known.unit}: “${typed.trim()}” looks like a reading for another column.` };
    }
  }
  const parsed = parseCell(column, text);
  if (parsed.kind === 'invalid' && parsed.problem !== 'range' && parsed.problem !== 'test-voltage') {
    return { ok: false, message: parsed.message };
  }
  const stored = normaliseReading(column, text);
  return { ok: true, text: stored, stripped: notes.length > 0 ? `took off ${notes.join(' and ')}` : null };
}
