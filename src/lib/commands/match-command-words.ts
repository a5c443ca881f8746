import { defaultFilter } from 'cmdk';

/**
 * How the palette matches: every word typed must appear in the words people read (label, group,
 * keywords; cmdk's `value` is our command id and is ignored), and cmdk's own score ranks the
 * matches. cmdk's score alone is a loose subsequence match ("lock" would find "tick poLarity On the
 * seleCted circuits"), which makes the first item after typing a surprise.
 */
export function matchCommandWords(value: string, search: string, keywords?: string[]): number {
  const text = (keywords && keywords.length > 0 ? keywords.join(' ') : value).toLowerCase();
  const terms = search.toLowerCase().split(/\s+/).filter(Boolean);
  if (terms.length === 0) return 1;
  if (!terms.every((term) => text.includes(term))) return 0;
  return Math.max(defaultFilter(text, search), 0.01);
}
