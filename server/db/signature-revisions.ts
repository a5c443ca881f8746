import type { DB } from './database.ts';
import type { SignatureRow } from './types.ts';

/** One reopening of an issued job, from its `job_history` row (action `reopened`). */
export interface Reopening {
  at: string;
  userId: number | null;
  reason: string | null;
  /** The revision that was issued and is now being changed (1 for the first reopening). */
  revision: number;
}

/** Every reopening of a job, oldest first. */
export async function loadReopenings(db: DB, jobId: number): Promise<Reopening[]> {
  const rows = await db
    .selectFrom('job_history')
    .select(['at', 'user_id', 'reason'])
    .where('job_id', '=', jobId)
    .where('action', '=', 'reopened')
    .orderBy('id')
    .execute();
  return rows.map((row, index) => ({ at: row.at, userId: row.user_id, reason: row.reason, revision: index + 1 }));
}

/**
 * The revision a signature was given for: one more than the reopenings before it. A signature
 * belongs to the document as it stood when it was given; once the issued job is reopened the
 * document may change, so the next revision needs every signature again (the earlier ones are
 * kept and listed, never used for it).
 *
 * Signing is refused while a job is issued, so every signature made before a reopening was made
 * before the issue that preceded it — by the length of a PDF render at least. Comparing the
 * signature's time with the reopening's (both ISO 8601 UTC with milliseconds, from the same clock)
 * is therefore unambiguous; a signature in the very millisecond of the reopening counts as
 * earlier, the safe side (it is asked for again).
 */
export function revisionOfSignature(signedAt: string, reopenings: readonly Reopening[]): number {
  return 1 + reopenings.filter((r) => r.at < signedAt).length;
}

/** The revision being prepared (or, once issued, the one last issued): one more than the reopenings. */
export const revisionInHand = (reopenings: readonly Reopening[]): number => 1 + reopenings.length;

/**
 * The signatures that count for the revision in hand: the newest of each role given since the
 * latest reopening. Earlier ones belong to an earlier revision.
 */
export async function signaturesInUse(db: DB, jobId: number): Promise<SignatureRow[]> {
  const reopenings = await loadReopenings(db, jobId);
  const latest = reopenings.at(-1);
  let query = db.selectFrom('signatures').selectAll().where('job_id', '=', jobId);
  if (latest) query = query.where('signed_at', '>', latest.at);
  const rows = await query.orderBy('id').execute();
  const byRole = new Map<string, SignatureRow>();
  for (const row of rows) byRole.set(row.role, row);
  return [...byRole.values()];
}
