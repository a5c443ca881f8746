/**
 * Checks other routes call inside their write's transaction: a job that is approved or issued
 * refuses every write to its boards (423, as a locked board does), and a board is locked only
 * when its gate passes (409 with every reason).
 */
import { isJobFrozen } from '../../shared/review/job-state.ts';
import { jobStateLabels } from '../../shared/schemas/sites.ts';
import type { DB } from '../db/database.ts';
import { HttpError, notFound } from '../http-error.ts';
import { reviewBoard } from './review-service.ts';

/** Refuses (423) any write to a job that is approved or issued, or to anything on it. */
export async function requireJobWritable(db: DB, jobId: number): Promise<void> {
  const job = await db.selectFrom('jobs').select(['state', 'reference']).where('id', '=', jobId).executeTakeFirst();
  if (!job) throw notFound(`Job ${jobId}`);
  if (isJobFrozen(job.state)) {
    const how =
      job.state === 'approved'
        ? 'a reviewer must send it back before anything on it changes'
        : 'an issued document never changes; a reviewer reopens the job with a reason to make a new revision';
    throw new HttpError('locked', `Job ${job.reference} is ${jobStateLabels[job.state]}: ${how}.`);
  }
}

/**
 * Refuses (409) to lock a board while its gate does not pass; `details.reasons` lists every
 * reason in words. 409 rather than 422: the request is well formed, but the board's present
 * content conflicts with locking it; the same request succeeds once the readings change.
 */
export async function requireBoardLockable(db: DB, boardId: number): Promise<void> {
  const review = await reviewBoard(db, boardId);
  if (!review) throw notFound(`Board ${boardId}`);
  const { gate } = review;
  if (!gate.canLock) {
    throw new HttpError(
      'conflict',
      `Board ${gate.reference} cannot be locked yet: ${gate.reasons.length} ${gate.reasons.length === 1 ? 'reason' : 'reasons'} (${gate.reasons[0]}${gate.reasons.length > 1 ? ' …' : ''}).`,
      { reasons: gate.reasons },
    );
  }
}
