/** How the checker writes values in its messages and limits. */

import type { ParsedCell } from './cell-grammar.ts';
import { formatFixed } from './decimal.ts';

/**
 * A limit or computed value in ohms as the tables print it: whole ohms from 100 up (1667), one
 * decimal from 10 (12.0, 16.8), two below (1.37, 0.22).
 */
export function ohmText(value: number): string {
  if (value >= 100) return formatFixed(value, 0);
  if (value >= 10) return formatFixed(value, 1);
  return formatFixed(value, 2);
}

/** A megohm limit as Table 64 prints it (0.5, 1.0). */
export function megohmText(value: number): string {
  return formatFixed(value, 1);
}

/**
 * A reading in ohms with at least two decimals, as the trade writes them: 0.3 → "0.30",
 * 0.455 → "0.455".
 */
export function ohmReading(value: number): string {
  const text = String(value);
  const point = text.indexOf('.');
  if (text.includes('e')) return text;
  if (point === -1) return `${text}.00`;
  return text.length - point - 1 >= 2 ? text : `${text}0`;
}

/** A reading as the tester typed it, with its unit: "0.44 Ω", ">200 MΩ", "N/A". */
export function readingText(cell: ParsedCell, unit: string | null): string {
  const u = unit ? ` ${unit}` : '';
  switch (cell.kind) {
    case 'number':
      return `${unit === 'Ω' ? ohmReading(cell.value) : cell.value}${u}`;
    case 'over-range':
      return `>${cell.value}${u}`;
    case 'na':
      return 'N/A';
    case 'lim':
      return 'LIM';
    case 'pass':
      return '✓';
    case 'fail':
      return '✗';
    default:
      return '';
  }
}
