import { formatJobReference } from '../../shared/schemas/company.ts';
import type { UpdateJobBody } from '../../shared/schemas/sites.ts';
import type { DB } from './database.ts';
import { sameValue, stableJson } from './json-values.ts';
import type { FieldUpdateResult } from './sites.ts';
import type { JobHistoryTable, JobRow, JobTable } from './types.ts';
import { sql, type Insertable, type Updateable } from 'kysely';

export function findJobRow(db: DB, jobId: number): Promise<JobRow | undefined> {
  return db.selectFrom('jobs').selectAll().where('id', '=', jobId).executeTakeFirst();
}

export type JobHistoryEntry = Omit<Insertable<JobHistoryTable>, 'id' | 'at'> & { at?: string };

/** Appends one change to a job's history and returns its id (the job's cursor). */
export async function appendJobHistory(db: DB, entry: JobHistoryEntry): Promise<number> {
  const row = await db
    .insertInto('job_history')
    .values({ ...entry, at: entry.at ?? new Date().toISOString() })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

/** The newest history id of a job (0 when nothing was recorded yet). */
export async function latestJobCursor(db: DB, jobId: number): Promise<number> {
  const row = await db
    .selectFrom('job_history')
    .select((eb) => eb.fn.max<number | null>('id').as('id'))
    .where('job_id', '=', jobId)
    .executeTakeFirst();
  return row?.id ?? 0;
}

export function listJobHistory(db: DB, jobId: number) {
  return db.selectFrom('job_history').selectAll().where('job_id', '=', jobId).orderBy('id').execute();
}

/** True when another job already has this reference (compared without regard to case). */
export async function referenceTaken(db: DB, reference: string, exceptJobId?: number): Promise<boolean> {
  let query = db.selectFrom('jobs').select('id').where(sql`lower(reference)`, '=', reference.trim().toLowerCase());
  if (exceptJobId !== undefined) query = query.where('id', '!=', exceptJobId);
  return (await query.executeTakeFirst()) !== undefined;
}

const escapeRegExp = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/**
 * The next free reference from the company's pattern for a job of this kind visited on `date`:
 * one more than the highest number of that year (and kind, when the pattern has `{kind}`) already
 * used, skipping any reference somebody typed by hand that happens to be taken.
 */
export async function nextJobReference(db: DB, pattern: string, kind: 'EIC' | 'EICR', date: string): Promise<string> {
  const year = date.slice(0, 4);
  // The pattern as a regular expression for references of the same year: {seq} is the number.
  const source = pattern
    .split(/(\{kind\}|\{yyyy\}|\{yy\}|\{mm\}|\{seq(?::\d)?\})/)
    .map((part) => {
      if (part === '{kind}') return escapeRegExp(kind);
      if (part === '{yyyy}') return escapeRegExp(year);
      if (part === '{yy}') return escapeRegExp(year.slice(2));
      if (part === '{mm}') return '\\d{2}';
      if (/^\{seq(?::\d)?\}$/.test(part)) return '(\\d+)';
      return escapeRegExp(part);
    })
    .join('');
  const matcher = new RegExp(`^${source}$`, 'i');
  const rows = await db.selectFrom('jobs').select('reference').execute();
  let highest = 0;
  for (const { reference } of rows) {
    const match = matcher.exec(reference);
    if (match) highest = Math.max(highest, ...match.slice(1).map(Number));
  }
  // A pattern without the year in it still counts per year only through the visit date it was
  // made with; highest + 1 is then simply the next number ever used.
  let seq = highest + 1;
  let reference = formatJobReference(pattern, kind, date, seq);
  while (await referenceTaken(db, reference)) reference = formatJobReference(pattern, kind, date, ++seq);
  return reference;
}

export interface NewJob {
  siteId: number;
  kind: 'EIC' | 'EICR';
  reference: string;
  visitDate: string;
  visitEndDate: string | null;
  startedFromJobId: number | null;
}

/** Inserts a job (state: being entered) and its `created` history row; returns its id. */
export async function insertJob(db: DB, job: NewJob, userId: number): Promise<number> {
  const values: Insertable<JobTable> = {
    site_id: job.siteId,
    kind: job.kind,
    reference: job.reference,
    visit_date: job.visitDate,
    visit_end_date: job.visitEndDate,
    started_from_job_id: job.startedFromJobId,
    version: 1,
  };
  const { id } = await db.insertInto('jobs').values(values).returning('id').executeTakeFirstOrThrow();
  await appendJobHistory(db, {
    job_id: id,
    section: null,
    field: null,
    action: 'created',
    old_text: null,
    new_text: stableJson(job),
    reason: null,
    user_id: userId,
    version: 1,
  });
  return id;
}

const jobColumns = { reference: 'reference', visitDate: 'visit_date', visitEndDate: 'visit_end_date' } as const satisfies Record<
  keyof UpdateJobBody['changes'],
  keyof JobRow
>;
type JobDetailKey = keyof typeof jobColumns;

/**
 * Changes a job's own details (reference, visit dates), one `details` history row per changed
 * field. Like sites and circuits, a stale version is refused only for fields changed since.
 */
export async function updateJobDetails(
  db: DB,
  job: JobRow,
  baseVersion: number,
  changes: UpdateJobBody['changes'],
  userId: number,
): Promise<FieldUpdateResult> {
  const keys = (Object.keys(changes) as JobDetailKey[]).filter((k) => k in jobColumns && changes[k] !== undefined);
  const current = (key: JobDetailKey) => job[jobColumns[key]];
  if (baseVersion > job.version) return { ok: false, conflictingFields: keys };
  if (baseVersion < job.version && keys.length > 0) {
    const later = await db
      .selectFrom('job_history')
      .select('field')
      .where('job_id', '=', job.id)
      .where('section', 'is', null)
      .where('action', '=', 'details')
      .where('version', '>', baseVersion)
      .where('field', 'in', keys)
      .execute();
    const conflicting = [...new Set(later.map((r) => r.field as JobDetailKey))].filter((k) => !sameValue(current(k), changes[k]));
    if (conflicting.length > 0) return { ok: false, conflictingFields: conflicting };
  }
  const changed = keys.filter((k) => !sameValue(current(k), changes[k]));
  if (changed.length === 0) return { ok: true, version: job.version };
  const version = job.version + 1;
  const at = new Date().toISOString();
  const update: Record<string, unknown> = { version };
  for (const key of changed) {
    update[jobColumns[key]] = changes[key];
    await appendJobHistory(db, {
      job_id: job.id,
      section: null,
      field: key,
      action: 'details',
      old_text: stableJson(current(key)),
      new_text: stableJson(changes[key]),
      reason: null,
      user_id: userId,
      version,
      at,
    });
  }
  await db.updateTable('jobs').set(update as Updateable<JobTable>).where('id', '=', job.id).execute();
  return { ok: true, version };
}
