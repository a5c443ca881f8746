import {
  blankSection,
  jobSectionKeys,
  type JobRecord,
  type JobSectionData,
  type JobSectionKey,
  type JobSectionState,
} from '../../shared/schemas/job-record.ts';
import type { DB } from './database.ts';
import { appendJobHistory } from './jobs.ts';
import { sameValue, stableJson } from './json-values.ts';
import type { JobSectionRow } from './types.ts';

/**
 * The job record is stored as one JSON document per section (`job_sections`), each with its own
 * version; a section never written is served blank at version 0. See DEVELOPERS.md, "The job
 * record's storage".
 */

/** Sections whose fields are the keys of a record (item ids, observation ids), not fixed properties. */
const keyedSections: ReadonlySet<JobSectionKey> = new Set(['inspections', 'observations']);

function sectionData<K extends JobSectionKey>(key: K, row: JobSectionRow | undefined): JobSectionData[K] {
  const blank = blankSection(key);
  if (!row) return blank;
  const stored = JSON.parse(row.data) as JobSectionData[K];
  // Fields added to a section after it was written read as blank.
  return keyedSections.has(key) ? stored : ({ ...blank, ...stored } as JobSectionData[K]);
}

export async function loadJobSection<K extends JobSectionKey>(db: DB, jobId: number, key: K): Promise<JobSectionState<K>> {
  const row = await db.selectFrom('job_sections').selectAll().where('job_id', '=', jobId).where('section', '=', key).executeTakeFirst();
  return { data: sectionData(key, row), version: row?.version ?? 0 };
}

/** Every section of a job's record, blanks filled in for sections never written. */
export async function loadJobRecord(db: DB, jobId: number): Promise<JobRecord> {
  const rows = await db.selectFrom('job_sections').selectAll().where('job_id', '=', jobId).execute();
  const byKey = new Map(rows.map((r) => [r.section, r]));
  return Object.fromEntries(
    jobSectionKeys.map((key) => {
      const row = byKey.get(key);
      return [key, { data: sectionData(key, row), version: row?.version ?? 0 }];
    }),
  ) as JobRecord;
}

/** A section's data with some fields changed; in a keyed section `null` removes the key. */
export function mergeSectionChanges<K extends JobSectionKey>(key: K, data: JobSectionData[K], changes: Record<string, unknown>): JobSectionData[K] {
  const merged = { ...(data as Record<string, unknown>) };
  for (const [field, value] of Object.entries(changes)) {
    if (value === undefined) continue;
    if (keyedSections.has(key) && value === null) delete merged[field];
    else merged[field] = value;
  }
  return merged as JobSectionData[K];
}

export type SectionWriteResult<K extends JobSectionKey> =
  | { ok: true; section: JobSectionState<K>; changedFields: string[] }
  | { ok: false; conflictingFields: string[]; current: JobSectionState<K> };

/**
 * Writes changed fields of one section. The write names the version it saw; it is refused only
 * when a field it sends was changed by somebody after that version (found through
 * `job_history.version`) and now holds another value than the one sent. Every field that changes
 * appends a `record` row to the job's history with its old and new value as JSON. A write that
 * changes nothing (a retry after a lost answer) leaves the version as it is.
 *
 * `changes` must already be parsed (`parseSectionChanges`) and checked against the job.
 */
export async function writeJobSection<K extends JobSectionKey>(
  db: DB,
  input: { jobId: number; key: K; baseVersion: number; changes: Record<string, unknown>; userId: number },
): Promise<SectionWriteResult<K>> {
  const { jobId, key, baseVersion, changes, userId } = input;
  const current = await loadJobSection(db, jobId, key);
  const data = current.data as Record<string, unknown>;
  const fields = Object.keys(changes).filter((f) => changes[f] !== undefined);
  const valueOf = (record: Record<string, unknown>, field: string) => record[field] ?? null;

  if (baseVersion > current.version) return { ok: false, conflictingFields: fields, current };
  if (baseVersion < current.version && fields.length > 0) {
    const later = await db
      .selectFrom('job_history')
      .select('field')
      .where('job_id', '=', jobId)
      .where('section', '=', key)
      .where('action', '=', 'record')
      .where('version', '>', baseVersion)
      .where('field', 'in', fields)
      .execute();
    const conflicting = [...new Set(later.map((r) => r.field ?? ''))].filter((f) => !sameValue(valueOf(data, f), changes[f]));
    if (conflicting.length > 0) return { ok: false, conflictingFields: conflicting, current };
  }

  const changed = fields.filter((f) => !sameValue(valueOf(data, f), changes[f]));
  if (changed.length === 0) return { ok: true, section: current, changedFields: [] };

  const merged = mergeSectionChanges(key, current.data, Object.fromEntries(changed.map((f) => [f, changes[f]])));
  const version = current.version + 1;
  const at = new Date().toISOString();
  for (const field of changed) {
    await appendJobHistory(db, {
      job_id: jobId,
      section: key,
      field,
      action: 'record',
      old_text: stableJson(valueOf(data, field)),
      new_text: stableJson(changes[field]),
      reason: null,
      user_id: userId,
      version,
      at,
    });
  }
  const text = JSON.stringify(merged);
  if (current.version === 0) {
    await db.insertInto('job_sections').values({ job_id: jobId, section: key, data: text, version, updated_by: userId, updated_at: at }).execute();
  } else {
    await db
      .updateTable('job_sections')
      .set({ data: text, version, updated_by: userId, updated_at: at })
      .where('job_id', '=', jobId)
      .where('section', '=', key)
      .execute();
  }
  return { ok: true, section: { data: merged, version }, changedFields: changed };
}
