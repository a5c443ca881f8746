import type { InspectionOutcome, ObservationCode } from '../../shared/schemas/job-record.ts';

/** How the issued document writes things: the trade's own signs and codes, our own words. */

export const documentTitles = {
  EIC: 'Electrical Installation Certificate',
  EICR: 'Electrical Installation Condition Report',
} as const;

/** An inspection item's outcome as printed in the schedule of inspections. */
export const outcomeSigns: Record<InspectionOutcome, string> = {
  ok: '✓',
  fail: '✗',
  C1: 'C1',
  C2: 'C2',
  C3: 'C3',
  LIM: 'LIM',
  'N/A': 'N/A',
  'not-verified': 'not verified',
};

export const outcomeMeanings: Record<InspectionOutcome, string> = {
  ok: 'acceptable',
  fail: 'not acceptable: put right before the certificate is issued',
  C1: 'danger present',
  C2: 'potentially dangerous',
  C3: 'improvement recommended',
  LIM: 'not inspected because of a stated limitation',
  'N/A': 'does not apply to this installation',
  'not-verified': 'could not be verified',
};

/** What each observation code asks of the person responsible for the installation. */
export const codeMeanings: Record<ObservationCode, string> = {
  C1: 'Danger present. Risk of injury: act at once to remove the danger.',
  C2: 'Potentially dangerous. Act urgently to remove the risk.',
  C3: 'Improvement recommended.',
  FI: 'Further investigation needed without delay.',
};

export const reasonLabels: Record<string, string> = {
  periodic: 'periodic inspection',
  sale: 'sale of the property',
  letting: 'letting',
  'change-of-occupancy': 'change of occupancy',
  insurance: 'insurance',
  'alterations-planned': 'alterations planned',
  other: 'other',
};

export const premisesLabels: Record<string, string> = {
  domestic: 'domestic, owner-occupied',
  'rented-dwelling': 'rented dwelling',
  commercial: 'commercial',
  industrial: 'industrial',
  caravan: 'caravan or caravan park',
  'pool-or-similar': 'swimming pool or similar',
  other: 'other',
};

export const signatureRoleLabels = {
  designer: 'Design',
  constructor: 'Construction',
  inspector: 'Inspection and testing',
  reviewer: 'Reviewed before issue',
} as const;

/** The caution every issued document carries (domain.md, "Cautions the product must show"). */
export const safetyCaution =
  'Safety: inspection and testing are for competent people only, on circuits made safe by safe isolation ' +
  'and proven dead with a proven instrument. This document records and checks the results; it does not ' +
  'replace the inspector’s judgement. The current edition of BS 7671 and local regulations take precedence ' +
  'over anything written here.';

const months = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

/** 2026-12-02 → "2 December 2026"; anything else as it is. Locale-free, so output is repeatable. */
export function longDate(value: string | null | undefined): string {
  if (!value) return '';
  const match = /^(\d{4})-(\d{2})-(\d{2})/.exec(value);
  if (!match) return value;
  const [, y, m, d] = match;
  return `${Number(d)} ${months[Number(m) - 1] ?? m} ${y}`;
}

/** An ISO timestamp as "2 December 2026, 09:14 UTC". */
export function longDateTime(iso: string): string {
  const match = /^(\d{4}-\d{2}-\d{2})T(\d{2}):(\d{2})/.exec(iso);
  return match ? `${longDate(match[1])}, ${match[2]}:${match[3]} UTC` : iso;
}

/** A number with its unit, or empty when there is none. */
export function withUnit(value: number | null | undefined, unit: string): string {
  return value === null || value === undefined ? '' : `${value} ${unit}`;
}

export function yesNo(value: 'yes' | 'no' | 'none' | 'unknown' | boolean | null | undefined): string {
  if (value === null || value === undefined) return '';
  if (value === true || value === 'yes') return 'yes';
  if (value === false || value === 'no') return 'no';
  if (value === 'none') return 'none present';
  return 'not known';
}
