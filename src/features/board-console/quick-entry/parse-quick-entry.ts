/**
 * The quick-entry grammar: one line of dictation ("7 zs .44 ir >200 8 zs .51") read into cell
 * writes. Pure: no React, no I/O. Never throws; a mistake is answered in words and nothing is
 * written.
 *
 * The line is read left to right as tokens separated by spaces. A token in double quotes
 * ("kitchen sockets", also “curly” quotes) is one token and is always a value.
 *
 * 1. The line starts with a circuit number. Circuit numbers match the board's case-insensitively
 *    (`3l2` is circuit 3L2).
 * 2. Right after a circuit number comes either a column word, or a value for the active column.
 *    A token that is not a column word is that value — for a column of readings, numbers and
 *    ticks it must look like one (a number, >N, N/A, LIM, a tick or a cross); for a column of text
 *    or choices any word is a value.
 * 3. After a column word, the next token is always its value, whatever it looks like (so
 *    `7 zs 8` writes 8 into Zs of circuit 7; it does not start circuit 8).
 * 4. After a value comes a column word (another column of the same circuit), or a circuit number
 *    (a new circuit), or the end of the line. Anything else is a mistake.
 *
 * Column words are, in order of precedence: each column's `aliases` (columns.ts), then its key,
 * then its label in lower case without spaces (`r1+r2`, `l-e`). An earlier kind wins a clash: `r2`
 * is ring r2 (an alias), not the R2 column (whose key is also `r2`: say `wander`); `time` is the
 * maximum disconnection time (an alias), not the RCD time (say `rcd` or `trip`). The words of the
 * cell grammar that are values — N/A, NA, LIM, ✓, ✗, v, x, ok, yes, no, pass, fail… — are never
 * column words. A circuit whose number spells a column word can only start the line.
 *
 * The parser hands values on exactly as typed; the console writes them as every grid edit is
 * written, with the trade's short forms spelt out (`.44` → `0.44`, `v` → `✓`, `na` → `N/A`; see
 * `normaliseReading`). A column may be given once per circuit per line.
 */

import { columnByKey, columns, type CircuitKind, type ColumnDef, type ColumnKey } from '../../../../shared/schemas/columns.ts';

/** A circuit of the board as the quick-entry line needs it. */
export interface QuickEntryCircuit {
  id: number;
  /** As the board numbers it: "7", "3L2". */
  number: string;
  /** Ring, radial…: decides what `r2` means for it (see `columnForCircuit`). */
  kind?: CircuitKind;
}

export interface QuickEntryContext {
  circuits: ReadonlyArray<QuickEntryCircuit>;
  /** The column of the grid's active cell: where a value without a column word goes. */
  activeColumn: ColumnKey;
}

/** One cell to write. */
export interface QuickEntry {
  circuitId: number;
  circuitNumber: string;
  column: ColumnKey;
  /** The value exactly as typed (quotes removed). */
  text: string;
  /** Set when a column word was read for this circuit's kind: "r2 on a radial is R2 (cpc by long lead)". */
  kindNote?: string;
}

/**
 * What a column word means for a circuit of this kind. The trade's `r2` is the cpc end to end on a
 * ring (step 1 of the ring test) but the cpc alone by long lead on any other circuit, so `r2` said
 * of a radial, a spur or a distribution circuit goes to the R2 column, and the entry says so.
 */
export function columnForCircuit(column: ColumnDef, word: string, kind: CircuitKind | undefined): { column: ColumnDef; note?: string } {
  if (column.key === 'ringR2' && kind !== undefined && kind !== 'ring') {
    const r2 = columnByKey.r2;
    return { column: r2, note: `${word} on a ${kind} is ${r2.label} (${r2.meaning.toLowerCase()})` };
  }
  return { column };
}

export type QuickEntryResult = { ok: true; entries: QuickEntry[] } | { ok: false; message: string };

/** The words of the cell grammar that are values in any column; never read as column words. */
const VALUE_WORDS = new Set([
  'n/a',
  'na',
  'n.a.',
  'n.a',
  'lim',
  '✓',
  '✔',
  '☑',
  'v',
  'y',
  'yes',
  'ok',
  'pass',
  '✗',
  '✘',
  '☒',
  'x',
  'no',
  'fail',
]);

/** Characters a number, ">N", "≥N" (or a slip such as "-1" or "<0.01", which the checker explains) starts with. */
const NUMBER_START = /^[0-9.,<>≤≥+\-−]/;

function looksLikeValue(token: string): boolean {
  return NUMBER_START.test(token) || VALUE_WORDS.has(token.toLowerCase());
}

/** Columns whose values are free words, so any token after a circuit number is taken as a value. */
function takesAnyWord(column: ColumnDef): boolean {
  return column.valueKind === 'text' || column.valueKind === 'choice';
}

function compact(label: string): string {
  return label.toLowerCase().replace(/\s+/g, '');
}

/** Column words (lower case) → column, built once with the precedence documented above. */
const COLUMN_WORDS: ReadonlyMap<string, ColumnDef> = (() => {
  const words = new Map<string, ColumnDef>();
  const add = (word: string, column: ColumnDef) => {
    const w = word.toLowerCase();
    if (w !== '' && !VALUE_WORDS.has(w) && !words.has(w)) words.set(w, column);
  };
  for (const column of columns) for (const alias of column.aliases) add(alias, column);
  for (const column of columns) add(column.key, column);
  for (const column of columns) add(compact(column.label), column);
  return words;
})();

/** The column a word names, or undefined. Case-insensitive. */
export function columnForWord(word: string): ColumnKey | undefined {
  return COLUMN_WORDS.get(word.toLowerCase())?.key;
}

function levenshtein(a: string, b: string): number {
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      current[j] = Math.min((previous[j] ?? 0) + 1, (current[j - 1] ?? 0) + 1, (previous[j - 1] ?? 0) + cost);
    }
    previous = current;
  }
  return previous[b.length] ?? 0;
}

/** The four aliases nearest to a mistyped word; ties go to reading columns, then to the grid's order. */
function suggestions(word: string): string[] {
  const lower = word.toLowerCase();
  return columns
    .flatMap((column, order) => column.aliases.map((alias) => ({ alias, order, reading: column.storage === 'reading' })))
    .filter(({ alias }) => !VALUE_WORDS.has(alias))
    .map((s) => ({ ...s, distance: levenshtein(lower, s.alias) }))
    .sort((a, b) => a.distance - b.distance || Number(b.reading) - Number(a.reading) || a.order - b.order)
    .slice(0, 4)
    .map((s) => s.alias);
}

interface Token {
  text: string;
  quoted: boolean;
}

const OPEN_QUOTES = new Set(['"', '“']);
const CLOSE_QUOTES = new Set(['"', '”']);

function tokenize(input: string): { ok: true; tokens: Token[] } | { ok: false; message: string } {
  const tokens: Token[] = [];
  const chars = Array.from(input);
  let i = 0;
  while (i < chars.length) {
    const c = chars[i] as string;
    if (/\s/.test(c)) {
      i++;
      continue;
    }
    if (OPEN_QUOTES.has(c)) {
      let j = i + 1;
      while (j < chars.length && !CLOSE_QUOTES.has(chars[j] as string)) j++;
      const text = chars.slice(i + 1, j).join('');
      if (j >= chars.length) return { ok: false, message: `a quote is not closed: end ${c}${text} with another "` };
      const after = chars[j + 1];
      if (after !== undefined && !/\s/.test(after)) return { ok: false, message: `put a space after "${text}"` };
      tokens.push({ text, quoted: true });
      i = j + 1;
      continue;
    }
    let j = i;
    while (j < chars.length && !/\s/.test(chars[j] as string)) j++;
    // Dictation separates pairs with commas ("7 zs .44, ir >200"): a comma (or semicolon) at the end
    // of a word, or standing alone, separates; one inside a word ("0,44") stays for the cell to refuse.
    const word = chars.slice(i, j).join('').replace(/[,;]+$/, '');
    if (word !== '') tokens.push({ text: word, quoted: false });
    i = j;
  }
  return { ok: true, tokens };
}

function listWithOr(items: readonly string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} or ${items[items.length - 1]}`;
}

function escapeRegExp(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

type CircuitLookup = { found: QuickEntryCircuit } | { message: string };

function findCircuit(token: string, circuits: ReadonlyArray<QuickEntryCircuit>): CircuitLookup {
  const lower = token.toLowerCase();
  const found = circuits.find((c) => c.number.trim().toLowerCase() === lower);
  if (found) return { found };
  const phases = new RegExp(`^${escapeRegExp(lower)}l\\d+$`);
  const group = circuits.filter((c) => phases.test(c.number.trim().toLowerCase()));
  if (group.length > 0) {
    return { message: `circuit ${token} is on three phases here: say ${listWithOr(group.map((c) => c.number.trim()))}` };
  }
  return { message: `there is no circuit ${token} on this board` };
}

/** Whether a token reads as a circuit number (digits, or digits with a phase such as 3L2). */
function looksLikeCircuitNumber(token: string): boolean {
  return /^\d+(?:l\d+)?$/i.test(token);
}

function unknownColumn(token: string): string {
  return `'${token}' is not a column; try ${suggestions(token).join(', ')}, …`;
}

function shown(token: Token): string {
  return token.quoted ? `"${token.text}"` : token.text;
}

interface Walk {
  result: QuickEntryResult;
  /** The last circuit the line named before it ended or went wrong. */
  lastCircuit: QuickEntryCircuit | undefined;
}

function walk(input: string, ctx: QuickEntryContext): Walk {
  let lastCircuit: QuickEntryCircuit | undefined;
  const fail = (message: string): Walk => ({ result: { ok: false, message }, lastCircuit });
  if (typeof input !== 'string' || input.trim() === '') {
    return fail('type a circuit and a value, e.g. 7 .44 or 7 zs .44');
  }
  const tokenized = tokenize(input);
  if (!tokenized.ok) return fail(tokenized.message);
  // Only separators (",", ";"): nothing to write.
  if (tokenized.tokens.length === 0) return fail('type a circuit and a value, e.g. 7 .44 or 7 zs .44');

  const activeColumn: ColumnDef | undefined = columnByKey[ctx.activeColumn];
  const entries: QuickEntry[] = [];
  const given = new Map<number, Set<ColumnKey>>();
  let state: 'start' | 'afterCircuit' | 'afterColumn' | 'afterValue' = 'start';
  let circuit: QuickEntryCircuit | undefined;
  let pending: { column: ColumnDef; word: string } | undefined;
  let lastWritten: ColumnDef | undefined;

  const write = (named: ColumnDef, text: string, word?: string): string | null => {
    if (!circuit) return 'say the circuit first, e.g. 7 zs .44';
    const { column, note } = word === undefined ? { column: named, note: undefined } : columnForCircuit(named, word, circuit.kind);
    if (text.trim() === '') return `${column.label} needs a value: "" is empty (to clear a cell, use Delete in the grid)`;
    const columnsOfCircuit = given.get(circuit.id) ?? new Set<ColumnKey>();
    if (columnsOfCircuit.has(column.key)) return `${column.label} is given twice for circuit ${circuit.number}`;
    columnsOfCircuit.add(column.key);
    given.set(circuit.id, columnsOfCircuit);
    entries.push({ circuitId: circuit.id, circuitNumber: circuit.number, column: column.key, text, ...(note ? { kindNote: note } : {}) });
    lastWritten = column;
    return null;
  };

  for (const token of tokenized.tokens) {
    const word = token.quoted ? undefined : COLUMN_WORDS.get(token.text.toLowerCase());
    switch (state) {
      case 'start': {
        if (token.quoted) return fail(`${shown(token)} is not a circuit: start with a circuit number, e.g. 7 zs .44`);
        const lookup = findCircuit(token.text, ctx.circuits);
        if ('message' in lookup) {
          if (word && !looksLikeCircuitNumber(token.text)) return fail(`say the circuit first, e.g. 7 ${token.text} .44`);
          return fail(lookup.message);
        }
        circuit = lastCircuit = lookup.found;
        state = 'afterCircuit';
        break;
      }
      case 'afterCircuit': {
        if (word) {
          pending = { column: word, word: token.text };
          state = 'afterColumn';
          break;
        }
        if (!activeColumn) return fail(`no column is active: say which, e.g. ${circuit?.number ?? 7} zs ${token.text}`);
        if (activeColumn.storage === 'detail' && !takesAnyWord(activeColumn)) {
          // A figure without a column word goes only to a reading column: a slip of the cursor
          // into a detail such as "Max Zs given" must not take a reading.
          return fail(`the cursor is on ${activeColumn.label}, a circuit detail: name the column, e.g. ${circuit?.number ?? 7} zs ${token.text}`);
        }
        if (!token.quoted && !takesAnyWord(activeColumn) && !looksLikeValue(token.text)) return fail(unknownColumn(token.text));
        const problem = write(activeColumn, token.text);
        if (problem) return fail(problem);
        state = 'afterValue';
        break;
      }
      case 'afterColumn': {
        if (!pending) return fail('a column word needs a value after it');
        const problem = write(pending.column, token.text, pending.word);
        if (problem) return fail(problem);
        pending = undefined;
        state = 'afterValue';
        break;
      }
      case 'afterValue': {
        if (word) {
          pending = { column: word, word: token.text };
          state = 'afterColumn';
          break;
        }
        if (token.quoted) {
          return fail(`${shown(token)} has no column: put a column word before it, e.g. desc ${shown(token)}`);
        }
        const lookup = findCircuit(token.text, ctx.circuits);
        if ('found' in lookup) {
          circuit = lastCircuit = lookup.found;
          state = 'afterCircuit';
          break;
        }
        if (looksLikeCircuitNumber(token.text)) return fail(lookup.message);
        if (looksLikeValue(token.text)) return fail(`'${token.text}' has no column: say which, e.g. zs ${token.text}`);
        if (lastWritten && takesAnyWord(lastWritten)) {
          return fail(`${unknownColumn(token.text)} (to write words with spaces, put them in quotes: "kitchen sockets")`);
        }
        return fail(unknownColumn(token.text));
      }
    }
  }

  if (state === 'afterColumn' && pending) return fail(`${pending.word} needs a value`);
  if (state === 'afterCircuit' && circuit) {
    return fail(`circuit ${circuit.number} needs a value: e.g. ${circuit.number} .44 or ${circuit.number} zs .44`);
  }
  return { result: { ok: true, entries }, lastCircuit };
}

/**
 * Reads one quick-entry line. On success, the cells to write in the order typed; on a mistake,
 * a message in words and no entries. Never throws.
 */
export function parseQuickEntry(input: string, ctx: QuickEntryContext): QuickEntryResult {
  return walk(input, ctx).result;
}

/**
 * The circuit a half-typed line is heading for (the last circuit it names before it ends or goes
 * wrong), so the grid can show the typist where the values will land. Never throws.
 */
export function previewCircuit(input: string, ctx: QuickEntryContext): QuickEntryCircuit | undefined {
  return walk(input, ctx).lastCircuit;
}

function shownValue(text: string): string {
  return /\s/.test(text) ? `“${text}”` : text;
}

/** What a set of entries wrote, in words: "Wrote Zs .44, L-E >200 to circuit 7; Zs .51 to circuit 8". */
export function describeEntries(entries: readonly QuickEntry[]): string {
  if (entries.length === 0) return 'Nothing written.';
  const byCircuit: Array<{ number: string; id: number; parts: string[] }> = [];
  for (const entry of entries) {
    let group = byCircuit.find((g) => g.id === entry.circuitId);
    if (!group) {
      group = { number: entry.circuitNumber, id: entry.circuitId, parts: [] };
      byCircuit.push(group);
    }
    group.parts.push(`${columnByKey[entry.column].label} ${shownValue(entry.text)}`);
  }
  const notes = entries.flatMap((e) => (e.kindNote ? [e.kindNote] : []));
  return `Wrote ${byCircuit.map((g) => `${g.parts.join(', ')} to circuit ${g.number}`).join('; ')}${notes.length > 0 ? ` (${notes.join('; ')})` : ''}`;
}

/**
 * The column words for the keys overlay: one row per column that has aliases, its words and its
 * meaning. Shaped like the overlay's `KeysSection`.
 */
export function quickEntryWordsSection(): { title: string; note: string; rows: Array<{ label: string; words: string[] }> } {
  return {
    title: 'Quick-entry column words',
    note: 'Type a circuit, then column words and values: 7 zs .44 ir >200 (commas between pairs are fine). A value straight after the circuit goes to the active column; quote values with spaces: 7 desc "kitchen sockets". r2 means the ring’s cpc end to end on a ring, and R2 by long lead on any other circuit.',
    rows: columns
      .map((column) => ({
        label: `${column.label}${column.unit ? ` (${column.unit})` : ''}: ${column.meaning}`,
        words: column.aliases.filter((alias) => COLUMN_WORDS.get(alias.toLowerCase())?.key === column.key),
      }))
      .filter((row) => row.words.length > 0),
  };
}

/** The key that undoes the last entry from an empty quick-entry line, in tinykeys syntax. */
export const QUICK_ENTRY_UNDO_KEY = '$mod+z';

/** The keys of the quick-entry line, for the keys overlay. Shaped like the overlay's `KeysSection`. */
export function quickEntryKeysSection(): { title: string; rows: Array<{ label: string; keys: string[] }> } {
  return {
    title: 'Quick-entry line',
    rows: [
      { label: 'Read the line and write what it says', keys: ['Enter'] },
      { label: 'Undo the last entry (on an empty line)', keys: [QUICK_ENTRY_UNDO_KEY] },
      { label: 'Bring back the last line written (on an empty line)', keys: ['ArrowUp'] },
      { label: 'Back to the grid', keys: ['Escape'] },
    ],
  };
}
