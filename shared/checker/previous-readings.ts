/**
 * Readings against the same circuit last time: on a board started from an earlier job, each
 * circuit may carry the cells it had then (`CheckCircuit.previous`). A reading that moved the wrong
 * way a long way since is worth a reviewer's look — insulation that fell to less than half, a loop
 * or continuity reading that rose by more than a fifth. These are notes, never errors: the reading
 * may be right and the installation changed, or last time's may have been the odd one.
 *
 * Pure; called per circuit from `checkBoard` with the circuit's cells already parsed, so its
 * findings are cached with the circuit's own.
 */

import type { CheckCircuit } from '../schemas/check.ts';
import type { ReadingKey } from '../schemas/columns.ts';
import type { Finding, Severity } from '../schemas/findings.ts';
import { cellGrammars, parseWithGrammar, type ParsedCell } from './cell-grammar.ts';
import { formatFixed } from './decimal.ts';
import { ohmText, readingText } from './format.ts';

/** The codes of this module, with their severity (merged into the board checker's `findingCodes`). */
export const previousReadingCodes = {
  'ir-fallen-since-last-time': 'note',
  'zs-risen-since-last-time': 'note',
  'continuity-risen-since-last-time': 'note',
} as const satisfies Record<string, Severity>;

/** Insulation resistance below this fraction of last time's is noted. */
export const IR_FALL_FRACTION = 0.5;
/**
 * At or above this, a fall says little about the insulation (readings that high swing with the
 * weather and the meter's range): the checker's own choice.
 */
export const IR_FALL_IGNORED_FROM_MEGOHM = 100;
/** Zs and R1+R2 (or R2) above last time × this are noted. */
export const RISE_FACTOR = 1.2;
/**
 * …and only when the rise is more than this: test-lead nulling and the meter's last digit move a
 * small reading by a few hundredths (the checker's own choice).
 */
export const RISE_MIN_OHM = 0.05;

export const PREVIOUS_IR_SOURCE =
  'comparison with the same circuit last time: insulation resistance fallen to less than half — common practice; readings of 100 MΩ and more not compared (the checker’s choice)';
export const PREVIOUS_RISE_SOURCE =
  'comparison with the same circuit last time: a rise of more than a fifth — common practice; rises of 0.05 Ω or less ignored as test-lead and meter resolution (the checker’s choice)';

const EPS = 1e-9;

/** The columns compared, what kind of reading each is, and its grammar: held in arrays for the loop. */
const COMPARED_KEYS: readonly ReadingKey[] = ['irLiveLive', 'irLiveEarth', 'zs', 'r1PlusR2', 'r2'];
const COMPARED_KINDS: ReadonlyArray<'ir' | 'zs' | 'continuity'> = ['ir', 'ir', 'zs', 'continuity', 'continuity'];
const COMPARED_GRAMMARS = COMPARED_KEYS.map((key) => cellGrammars[key]);
const COMPARED_COUNT = COMPARED_KEYS.length;
/**
 * Imported functions held locally: some module loaders (tsx's CommonJS interop among them) reach
 * an imported binding through a getter on every call (as in rules.ts).
 */
const parse = parseWithGrammar;

function note(code: keyof typeof previousReadingCodes, circuitId: number, key: ReadingKey, message: string, limit: string, source: string): Finding {
  return { code, severity: previousReadingCodes[code], circuitId, columns: [key], message, limit, source };
}

/**
 * `part / whole` as a whole percentage, rounded half-up. Readings are scaled to whole thousandths
 * first, so 0.22 / 0.80 gives exactly 27.5 % (→ 28 %) rather than a binary 27.4999….
 */
function percent(part: number, whole: number): string {
  return `${formatFixed((Math.round(part * 1000) * 100) / Math.round(whole * 1000), 0)} %`;
}

/**
 * Notes on a circuit's readings against the same circuit last time. `parsed` holds this time's
 * cells as the board checker read them. Only plain numbers and ">N" (a lower bound) take part, and
 * a note is given only when the change is certain whatever lies beyond a ">N".
 */
export function previousReadingFindings(circuit: CheckCircuit, parsed: Readonly<Record<ReadingKey, ParsedCell>>): Finding[] {
  const out: Finding[] = [];
  pushPreviousReadingFindings(circuit, parsed, out);
  return out;
}

/** `previousReadingFindings`, pushing onto the board checker's list for the circuit. */
export function pushPreviousReadingFindings(circuit: CheckCircuit, parsed: Readonly<Record<ReadingKey, ParsedCell>>, out: Finding[]): void {
  const previous = circuit.previous;
  if (previous === undefined) return;
  for (let k = 0; k < COMPARED_COUNT; k++) {
    const key = COMPARED_KEYS[k]!;
    const before = previous[key];
    if (before === undefined) continue;
    const now = parsed[key];
    if (now.kind !== 'number' && now.kind !== 'over-range') continue;
    const kind = COMPARED_KINDS[k]!;
    // Insulation: only a plain number below 100 MΩ this time can show a fall (see below).
    if (kind === 'ir' && (now.kind !== 'number' || now.value >= IR_FALL_IGNORED_FROM_MEGOHM - EPS)) continue;
    const grammar = COMPARED_GRAMMARS[k]!;
    const then = parse(grammar, before.text);
    if (then.kind !== 'number' && then.kind !== 'over-range') continue;

    if (kind === 'ir') {
      // Fallen for certain only when this time's is a plain number below half of last time's
      // (last time's ">N" is at least N, so half of it is at least N/2).
      const half = then.value * IR_FALL_FRACTION;
      if (now.value < half - EPS) {
        const nowText = readingText(now, grammar.unit);
        const thenText = readingText(then, grammar.unit);
        out.push(
          note(
            'ir-fallen-since-last-time',
            circuit.id,
            key,
            `${grammar.label} ${nowText} has fallen from ${thenText} last time${then.kind === 'number' && then.value >= 0.001 ? ` (to ${percent(now.value, then.value)})` : ''}: damp, damage or a new load connected? Worth a look.`,
            `≥ ${formatFixed(half, half >= 10 ? 0 : 2)} MΩ (half of last time’s ${thenText})`,
            PREVIOUS_IR_SOURCE,
          ),
        );
      }
      continue;
    }

    // Risen for certain only when last time's is a plain number (">N" there could be anything above).
    if (then.kind !== 'number') continue;
    const ceiling = Math.max(then.value * RISE_FACTOR, then.value + RISE_MIN_OHM);
    // This time's ">N" is more than N: risen for certain when N already reaches the ceiling.
    const risen = now.kind === 'number' ? now.value > ceiling + EPS : now.value >= ceiling - EPS;
    if (!risen) continue;
    const nowText = readingText(now, grammar.unit);
    const thenText = readingText(then, grammar.unit);
    const rise = then.value >= 0.001 && now.kind === 'number' ? ` (+${percent(now.value - then.value, then.value)})` : '';
    const limit = `≤ ${ohmText(ceiling)} Ω (last time’s ${thenText} + a fifth, at least + ${RISE_MIN_OHM} Ω)`;
    if (kind === 'zs') {
      out.push(
        note(
          'zs-risen-since-last-time',
          circuit.id,
          key,
          `Zs ${nowText} has risen from ${thenText} last time${rise}: a connection working loose or a deteriorating joint in the loop? Worth a look.`,
          limit,
          PREVIOUS_RISE_SOURCE,
        ),
      );
    } else {
      out.push(
        note(
          'continuity-risen-since-last-time',
          circuit.id,
          key,
          `${grammar.label} ${nowText} has risen from ${thenText} last time${rise}: a loose or corroded termination on the circuit, or an extension since? Worth a look.`,
          limit,
          PREVIOUS_RISE_SOURCE,
        ),
      );
    }
  }
}
