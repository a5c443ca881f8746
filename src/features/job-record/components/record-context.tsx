import { createContext, useContext, useSyncExternalStore } from 'react';
import type { JobDetail } from '../../../../shared/schemas/jobs.ts';
import type { JobSectionKey } from '../../../../shared/schemas/job-record.ts';
import type { FieldState, RecordSaver } from '../api/record-saver.ts';

/** What every part of the job screen reads: the job as cached, the saver, and whether it may change. */
export interface RecordContextValue {
  detail: JobDetail;
  saver: RecordSaver;
  /** Why the record cannot change now (approved, issued), or null when it can. */
  readOnlyReason: string | null;
}

export const RecordContext = createContext<RecordContextValue | null>(null);

export function useRecord(): RecordContextValue {
  const value = useContext(RecordContext);
  if (!value) throw new Error('useRecord outside the job screen');
  return value;
}

/** The save state of one field; re-renders only when it changes. */
export function useFieldState(section: JobSectionKey, field: string): FieldState | undefined {
  const { saver } = useRecord();
  return useSyncExternalStore(saver.subscribe, () => saver.state(section, field));
}

/** The id of a field's control: findings and the "go to" command find fields by it. */
export const fieldDomId = (section: JobSectionKey, field: string) => `job-field-${section}-${field.replace(/[^A-Za-z0-9_-]/g, '_')}`;
/** The id of a section's heading. */
export const sectionDomId = (section: JobSectionKey) => `job-section-${section}`;

/** Moves the cursor to the next field of the record after `from` (Enter in a one-line field). */
export function focusNextField(from: HTMLElement) {
  const fields = [...document.querySelectorAll<HTMLElement>('[data-record-field]')].filter((el) => !(el as HTMLInputElement).disabled);
  const next = fields[fields.indexOf(from) + 1];
  next?.focus();
}
