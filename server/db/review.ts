/**
 * Repositories for review: findings a reviewer accepted, and the job's state with its history. Plain functions taking `db` or a transaction first.
 */
import type { FindingAcceptance } from '../../shared/schemas/review.ts';
import type { JobState } from '../../shared/schemas/sites.ts';
import type { DB } from './database.ts';
import { appendJobHistory } from './jobs.ts';
import type { FindingAcceptanceRow, JobRow } from './types.ts';
import type { PersonNames } from './mappers.ts';

/** Moves a job to a new state and records who, when and why (action `state`). */
export async function setJobState(
  db: DB,
  job: JobRow,
  change: { to: JobState; userId: number; reason: string | null },
): Promise<void> {
  const version = job.version + 1;
  await db.updateTable('jobs').set({ state: change.to, version }).where('id', '=', job.id).execute();
  await appendJobHistory(db, {
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

/** The newest change of a job's state (submit, approve, send back, issue, reopen), or undefined. */
export function latestStateChange(db: DB, jobId: number) {
  return db
    .selectFrom('job_history')
    .select(['old_text', 'new_text', 'user_id', 'at', 'reason'])
    .where('job_id', '=', jobId)
    // `issued` and `reopened` are written by the issue routes.
    .where('action', 'in', ['state', 'issued', 'reopened'])
    .orderBy('id', 'desc')
    .limit(1)
    .executeTakeFirst();
}
