/**
 * Protective devices as testers write them. The schedule's "BS (EN)" column is free text ("60898",
 * "BS EN 60898-1", "61009", "88-2", "BS88 pt 3", "3036", "1362"); these functions read it into a
 * device family the limit tables know.
 */

import type { FuseFamily } from './reference-data.ts';

export type BreakerFamily = 'bs-en-60898' | 'bs-en-61009';
export type DeviceFamily = BreakerFamily | FuseFamily;

export const deviceFamilyLabels: Readonly<Record<DeviceFamily, string>> = {
  'bs-en-60898': 'BS EN 60898 circuit-breaker',
  'bs-en-61009': 'BS EN 61009 RCBO',
  'bs-88-2': 'BS 88-2 fuse',
  'bs-88-3': 'BS 88-3 fuse',
  'bs-3036': 'BS 3036 semi-enclosed fuse',
  'bs-1362': 'BS 1362 fuse',
};

export type StandardReading = { ok: true; family: DeviceFamily } | { ok: false; reason: string };

/**
 * Reads a device standard as written on a schedule. Case, spaces, "BS", "EN", "IEC", "part"/"pt",
 * hyphens and points are ignored: "BS EN 60898-1", "60898" and "en60898" are the same device.
 */
export function normaliseDeviceStandard(text: string): StandardReading {
  const compact = text
    .toUpperCase()
    .replace(/[\s_\-./:]/g, '')
    .replace(/^(BSEN|BS|EN|IEC)+/, '')
    .replace(/PART|PT/g, '');
  if (compact === '') return { ok: false, reason: 'No protective device standard is recorded.' };
  if (compact.startsWith('60898')) return { ok: true, family: 'bs-en-60898' };
  if (compact.startsWith('61009')) return { ok: true, family: 'bs-en-61009' };
  if (compact.startsWith('882')) return { ok: true, family: 'bs-88-2' };
  if (compact.startsWith('883') || compact.startsWith('1361')) return { ok: true, family: 'bs-88-3' };
  if (compact.startsWith('3036')) return { ok: true, family: 'bs-3036' };
  if (compact.startsWith('1362')) return { ok: true, family: 'bs-1362' };
  if (compact === '88' || compact.startsWith('88GG')) {
    return { ok: false, reason: `"${text.trim()}": say which part of BS 88, 88-2 (gG) or 88-3.` };
  }
  return {
    ok: false,
    reason: `"${text.trim()}" is not a device the limit tables hold (60898, 61009, 88-2, 88-3, 3036, 1362); enter its maximum Zs by hand.`,
  };
}

/** The breaker type letter (B, C, D) from "B", "type c", "Type-D"; null when it is none of these. */
export function normaliseBreakerType(text: string): 'B' | 'C' | 'D' | null {
  const compact = text.toUpperCase().replace(/[\s\-.]/g, '').replace(/^TYPE/, '');
  return compact === 'B' || compact === 'C' || compact === 'D' ? compact : null;
}

/** A short name for a device as the trade says it: "B32", "C20", "BS 88-2 gG 32 A". */
export function deviceShortName(family: DeviceFamily, type: string | null, ratingA: number): string {
  if ((family === 'bs-en-60898' || family === 'bs-en-61009') && type) {
    return `${type}${ratingA}${family === 'bs-en-61009' ? ' RCBO' : ''}`;
  }
  return `${deviceFamilyLabels[family]} ${ratingA} A`;
}
