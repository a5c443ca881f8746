import { defaultFilter } from 'cmdk';

/**
 * How well what was typed in the palette names a command, best first:
 * - `exact`: the label itself ("remove the circuit");
 * - `prefix`: the start of the label ("remove"), or every word typed starts a word of the label,
 *   group or keywords ("rem circ");
 * - `words`: every word typed appears inside those words ("move" in "remove");
 * - `fuzzy`: only a loose match, the letters in order with gaps ("rmvc"): shown last, and a command
 *   that changes data asks before it runs when chosen this way.
 */
export type MatchKind = 'exact' | 'prefix' | 'words' | 'fuzzy';

const rankOfKind: Record<MatchKind, number> = { exact: 4, prefix: 3, words: 2, fuzzy: 1 };

export interface RankedMatch {
  kind: MatchKind;
  /** Higher is better: the kind first, then cmdk's own score within it. */
  score: number;
}

/** The match of `search` against a command's label and its other words; null when it does not match. */
export function matchCommand(label: string, otherWords: readonly string[], search: string): RankedMatch | null {
  const s = search.trim().toLowerCase().replace(/\s+/g, ' ');
  if (s === '') return { kind: 'words', score: rankOfKind.words };
  const lowerLabel = label.toLowerCase();
  const text = [lowerLabel, ...otherWords.map((w) => w.toLowerCase())].join(' ');
  const loose = defaultFilter(text, s);
  let kind: MatchKind | null = null;
  if (lowerLabel === s) kind = 'exact';
  else if (lowerLabel.startsWith(s)) kind = 'prefix';
  else {
    const words = text.split(/[\s/().,:;+-]+/).filter(Boolean);
    const terms = s.split(' ');
    if (terms.every((term) => words.some((word) => word.startsWith(term)))) kind = 'prefix';
    else if (terms.every((term) => text.includes(term))) kind = 'words';
    else if (loose > 0) kind = 'fuzzy';
  }
  if (kind === null) return null;
  return { kind, score: rankOfKind[kind] + Math.min(Math.max(loose, 0), 0.99) };
}
