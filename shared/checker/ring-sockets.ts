import type { RingSocket } from '../schemas/ring-sockets.ts';
import { cellNumber, parseCell } from './cell-grammar.ts';
import { ringProfile, type RingProfile, type RingVerdict } from './ring.ts';

/** The cells of a circuit this needs: the ring's end-to-end readings r1, rn and r2, as typed. */
export type RingEndCells = { readonly [key: string]: { readonly text: string } | null | undefined };

/** A socket reading as typed ("0.34", ".34", "0,34") as ohms; null when blank or not a number. */
export function socketOhms(text: string): number | null {
  const t = text.trim();
  if (t === '') return null;
  const parsed = parseCell('r1PlusR2', /^\.\d/.test(t) ? `0${t}` : t);
  return parsed.kind === 'number' ? parsed.value : null;
}

/**
 * A ring's diagnosis from its end-to-end readings (r1, rn, r2 cells) and the L-cpc reading typed at
 * each socket; null when r1 or r2 is missing or no socket was typed. Positions count only when every
 * socket has one.
 */
export function diagnoseRingSockets(cells: RingEndCells, sockets: readonly RingSocket[]): RingProfile | null {
  const number = (key: 'ringR1' | 'ringRn' | 'ringR2') => cellNumber(parseCell(key, cells[key]?.text ?? ''));
  const r1 = number('ringR1');
  const r2 = number('ringR2');
  if (r1 === null || r2 === null || sockets.length === 0) return null;
  const readings = sockets.map((s) => socketOhms(s.lineCpc));
  const positions = sockets.every((s) => s.position !== null) ? sockets.map((s) => s.position!) : undefined;
  return ringProfile({ r1, rn: number('ringRn'), r2, readings, positions });
}

/** Each verdict of `ringProfile` in a few plain words, for the review screen and the printed document. */
export const ringVerdictText: Record<RingVerdict, string> = {
  consistent: 'consistent with a sound ring',
  'same-end-linked': 'line and cpc linked at the same end of the cable',
  open: 'no reading: ring open or wrongly linked',
  'high-point': 'a reading high at a point (a spur or a loose termination)',
  'low-points': 'readings low (an interconnection across the ring)',
};
