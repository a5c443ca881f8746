/**
 * Repositories for review: the job record as the gate reads it, findings a reviewer accepted,
 * and the job's state with its history. Plain functions taking `db` or a transaction first.
 */
import { blankSection, jobSectionKeys, type JobSectionData, type JobSectionKey } from '../../shared/schemas/job-record.ts';
import type { FindingAcceptance } from '../../shared/schemas/review.ts';
import type { JobState } from '../../shared/schemas/sites.ts';
import type { DB } from './database.ts';
import type { FindingAcceptanceRow, JobHistoryTable, JobRow } from './types.ts';
import type { PersonNames } from './mappers.ts';
import type { Insertable } from 'kysely';

export function findJobRow(db: DB, jobId: number): Promise<JobRow | undefined> {
  return db.selectFrom('jobs').selectAll().where('id', '=', jobId).executeTakeFirst();
}

/**
 * The job's record, every section present: a stored section is laid over its blank, so a field
 * added to a section later reads as blank on older jobs instead of missing.
 */
export async function loadJobRecordData(db: DB, jobId: number): Promise<JobSectionData> {
  const rows = await db.selectFrom('job_sections').select(['section', 'data']).where('job_id', '=', jobId).execute();
  const stored = new Map(rows.map((r) => [r.section, r.data]));
  const record = {} as Record<JobSectionKey, unknown>;
  for (const key of jobSectionKeys) {
    const blank = blankSection(key);
    const text = stored.get(key);
    let data: unknown = null;
    if (text) {
      try {
        data = JSON.parse(text);
      } catch {
        data = null;
      }
    }
    record[key] = data && typeof data === 'object' && !Array.isArray(data) ? { ...blank, ...(data as object) } : blank;
  }
  return record as JobSectionData;
}

export type JobHistoryEntry = Omit<Insertable<JobHistoryTable>, 'id' | 'at'> & { at?: string };

/** Appends one entry to a job's (append-only) history; returns its id. */
export async function appendJobHistoryEntry(db: DB, entry: JobHistoryEntry): Promise<number> {
  const row = await db
    .insertInto('job_history')
    .values({ ...entry, at: entry.at ?? new Date().toISOString() })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

/** Moves a job to a new state and records who, when and why (action `state`). */
export async function setJobState(
  db: DB,
  job: JobRow,
  change: { to: JobState; userId: number; reason: string | null },
): Promise<void> {
  const version = job.version + 1;
  await db.updateTable('jobs').set({ state: change.to, version }).where('id', '=', job.id).execute();
  await appendJobHistoryEntry(db, {
    job_id: job.id,
    section: null,
    field: 'state',
    action: 'state',
    old_text: JSON.stringify(job.state),
    new_text: JSON.stringify(change.to),
    reason: change.reason,
    user_id: change.userId,
    version,
  });
}

/** The newest submission for review of each job (the history entry that made it `ready`). */
export async function latestSubmissions(db: DB, jobIds: readonly number[]) {
  if (jobIds.length === 0) return new Map<number, { userId: number | null; at: string; note: string }>();
  const rows = await db
    .selectFrom('job_history')
    .select(['job_id', 'user_id', 'at', 'reason', 'id'])
    .where('job_id', 'in', jobIds)
    .where('action', '=', 'state')
    .where('new_text', '=', JSON.stringify('ready'))
    .orderBy('id')
    .execute();
  const latest = new Map<number, { userId: number | null; at: string; note: string }>();
  for (const row of rows) latest.set(row.job_id, { userId: row.user_id, at: row.at, note: row.reason ?? '' });
  return latest;
}

export function listAcceptanceRows(db: DB, jobId: number, boardId?: number): Promise<FindingAcceptanceRow[]> {
  let query = db.selectFrom('finding_acceptances').selectAll().where('job_id', '=', jobId);
  if (boardId !== undefined) query = query.where('board_id', '=', boardId);
  return query.orderBy('id').execute();
}

export function toAcceptance(row: FindingAcceptanceRow, names: PersonNames): FindingAcceptance {
  return {
    id: row.id,
    boardId: row.board_id,
    findingKey: row.finding_key,
    code: row.code,
    message: row.message,
    reason: row.reason,
    acceptedBy: { id: row.accepted_by, name: names.get(row.accepted_by) ?? 'former user' },
    acceptedAt: row.accepted_at,
  };
}
