/**
 * Review routes: a job's states (submit, approve, send back), the completeness gate, findings a
 * reviewer accepts with a reason, and the review queue. Issuing and reopening live with the
 * issue routes. Every change of state or acceptance is appended to the job's history.
 */
import { Router } from 'express';
import { acceptability, gateFindingKey, missingReadingCounts } from '../../shared/review/gate.ts';
import { jobTransition, type JobStateAction } from '../../shared/review/job-state.ts';
import {
  acceptFindingBodySchema,
  approveJobBodySchema,
  sendBackJobBodySchema,
  submitJobBodySchema,
  type ReviewQueue,
} from '../../shared/schemas/review.ts';
import type { DB } from '../db/database.ts';
import { toBoard, toJob, toSite } from '../db/mappers.ts';
import { appendJobHistory, findJobRow } from '../db/jobs.ts';
import { loadRingReadings } from '../db/ring-sockets.ts';
import { latestStateChange, latestSubmissions, listAcceptanceRows, setJobState, toAcceptance } from '../db/review.ts';
import type { JobRow } from '../db/types.ts';
import { userNames } from '../db/users.ts';
import { HttpError, notFound } from '../http-error.ts';
import { currentUser, requireRole } from '../middleware/auth.ts';
import { requireJobWritable } from '../review/guards.ts';
import { acceptancesOf, reviewBoard, reviewCounts, reviewJob, toReviewFindings, type JobReview } from '../review/review-service.ts';
import { idParam } from './params.ts';

async function requireJob(db: DB, jobId: number): Promise<JobRow> {
  const job = await findJobRow(db, jobId);
  if (!job) throw notFound(`Job ${jobId}`);
  return job;
}

function countsOfJob(review: JobReview) {
  const boardCounts = review.boards.map((b) =>
    reviewCounts(b.findings, new Set(b.acceptances.map((a) => a.finding_key)), (f) => gateFindingKey(b.context.board.id, f)),
  );
  const jobCounts = reviewCounts(review.jobFindings, new Set(review.jobAcceptances.map((a) => a.finding_key)), (f) => gateFindingKey(null, f));
  return [...boardCounts, jobCounts].reduce((sum, c) => ({
    errors: sum.errors + c.errors,
    accepted: sum.accepted + c.accepted,
    warnings: sum.warnings + c.warnings,
    missingReadings: sum.missingReadings + c.missingReadings,
  }));
}

export function reviewRoutes(db: DB): Router {
  const router = Router();

  // ---- job states ------------------------------------------------------------------------------

  async function changeState(jobId: number, action: JobStateAction, userRole: Parameters<typeof jobTransition>[2], userId: number, reason: string | null) {
    return db.transaction().execute(async (trx) => {
      const job = await requireJob(trx, jobId);
      const transition = jobTransition(job.state, action, userRole);
      if (!transition.ok) throw new HttpError(transition.status === 403 ? 'forbidden' : 'conflict', transition.message);
      if (action === 'approve') {
        const { gate } = await reviewJob(trx, job);
        if (!gate.canApprove) {
          throw new HttpError(
            'conflict',
            `Job ${job.reference} cannot be approved yet: ${gate.reasons.length} ${gate.reasons.length === 1 ? 'reason' : 'reasons'} (${gate.reasons[0]}${gate.reasons.length > 1 ? ' …' : ''}).`,
            { reasons: gate.reasons },
          );
        }
      }
      await setJobState(trx, job, { to: transition.to, userId, reason });
      return toJob(await requireJob(trx, jobId));
    });
  }

  router.post('/jobs/:jobId/submit', async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const { note } = submitJobBodySchema.parse(req.body ?? {});
    const user = currentUser(req);
    res.json({ job: await changeState(jobId, 'submit', user.role, user.id, note || null) });
  });

  router.post('/jobs/:jobId/approve', async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const { note } = approveJobBodySchema.parse(req.body ?? {});
    const user = currentUser(req);
    res.json({ job: await changeState(jobId, 'approve', user.role, user.id, note || null) });
  });

  router.post('/jobs/:jobId/send-back', async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const user = currentUser(req);
    // The role is checked before the body, so a tester hears "only a reviewer" rather than "say why".
    const role = jobTransition('ready', 'send-back', user.role);
    if (!role.ok && role.status === 403) throw new HttpError('forbidden', role.message);
    const { reason } = sendBackJobBodySchema.parse(req.body ?? {});
    res.json({ job: await changeState(jobId, 'send-back', user.role, user.id, reason) });
  });

  // ---- the gate --------------------------------------------------------------------------------

  router.get('/jobs/:jobId/gate', async (req, res) => {
    const job = await requireJob(db, idParam(req, 'jobId'));
    const { gate } = await reviewJob(db, job);
    const last = await latestStateChange(db, job.id);
    const names = await userNames(db);
    const text = (json: string | null) => {
      try {
        return json === null ? '' : String(JSON.parse(json));
      } catch {
        return json ?? '';
      }
    };
    res.json({
      ...gate,
      lastChange: last
        ? { from: text(last.old_text), to: text(last.new_text), by: last.user_id === null ? null : { id: last.user_id, name: names.get(last.user_id) ?? 'former user' }, at: last.at, reason: last.reason }
        : null,
    });
  });

  router.get('/boards/:boardId/gate', async (req, res) => {
    const review = await reviewBoard(db, idParam(req, 'boardId'));
    if (!review) throw notFound(`Board ${req.params.boardId}`);
    res.json({ gate: review.gate, acceptances: await acceptancesOf(db, review.acceptances) });
  });

  // ---- accepted findings -------------------------------------------------------------------------

  router.get('/jobs/:jobId/acceptances', async (req, res) => {
    const job = await requireJob(db, idParam(req, 'jobId'));
    res.json({ acceptances: await acceptancesOf(db, await listAcceptanceRows(db, job.id)) });
  });

  router.post('/jobs/:jobId/acceptances', requireRole('reviewer', 'admin'), async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const body = acceptFindingBodySchema.parse(req.body);
    const user = currentUser(req);
    const id = await db.transaction().execute(async (trx) => {
      const job = await requireJob(trx, jobId);
      await requireJobWritable(trx, job.id);
      let finding;
      if (body.boardId !== null) {
        const board = await reviewBoard(trx, body.boardId);
        if (!board || board.context.board.jobId !== job.id) throw new HttpError('bad_request', `Board ${body.boardId} is not on job ${job.reference}.`);
        finding = board.findings.find((f) => gateFindingKey(body.boardId, f) === body.findingKey);
      } else {
        finding = (await reviewJob(trx, job)).jobFindings.find((f) => gateFindingKey(null, f) === body.findingKey);
      }
      if (!finding) {
        throw new HttpError('conflict', 'That finding is no longer there (it may have been put right meanwhile); look at the findings again.');
      }
      const can = acceptability(finding);
      if (can !== true) throw new HttpError('bad_request', can);
      const already = await trx.selectFrom('finding_acceptances').select('id').where('job_id', '=', job.id).where('finding_key', '=', body.findingKey).executeTakeFirst();
      if (already) throw new HttpError('conflict', 'That finding is already accepted.');
      const row = await trx
        .insertInto('finding_acceptances')
        .values({
          job_id: job.id,
          board_id: body.boardId,
          finding_key: body.findingKey,
          code: finding.code,
          message: finding.message,
          reason: body.reason,
          accepted_by: user.id,
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      await appendJobHistory(trx, {
        job_id: job.id,
        section: null,
        field: body.findingKey,
        action: 'finding-accepted',
        old_text: null,
        new_text: JSON.stringify({ boardId: body.boardId, code: finding.code, message: finding.message }),
        reason: body.reason,
        user_id: user.id,
        version: null,
      });
      return row.id;
    });
    const row = await db.selectFrom('finding_acceptances').selectAll().where('id', '=', id).executeTakeFirstOrThrow();
    res.status(201).json({ acceptance: toAcceptance(row, await userNames(db)) });
  });

  router.delete('/jobs/:jobId/acceptances/:acceptanceId', requireRole('reviewer', 'admin'), async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const acceptanceId = idParam(req, 'acceptanceId');
    const user = currentUser(req);
    await db.transaction().execute(async (trx) => {
      const job = await requireJob(trx, jobId);
      await requireJobWritable(trx, job.id);
      const row = await trx.selectFrom('finding_acceptances').selectAll().where('id', '=', acceptanceId).where('job_id', '=', job.id).executeTakeFirst();
      if (!row) throw notFound(`Accepted finding ${acceptanceId} on job ${job.reference}`);
      if (row.board_id !== null) {
        const board = await trx.selectFrom('boards').select(['state', 'reference']).where('id', '=', row.board_id).executeTakeFirst();
        if (board?.state === 'locked') {
          throw new HttpError('locked', `Board ${board.reference} is locked with this finding accepted; unlock it (with a reason) before withdrawing the acceptance.`);
        }
      }
      await trx.deleteFrom('finding_acceptances').where('id', '=', row.id).execute();
      await appendJobHistory(trx, {
        job_id: job.id,
        section: null,
        field: row.finding_key,
        action: 'finding-acceptance-withdrawn',
        old_text: JSON.stringify({ boardId: row.board_id, code: row.code, message: row.message, reason: row.reason }),
        new_text: null,
        reason: null,
        user_id: user.id,
        version: null,
      });
    });
    res.status(204).end();
  });

  // ---- the review queue and one job under review ------------------------------------------------------

  router.get('/review/queue', async (_req, res) => {
    const jobs = await db.selectFrom('jobs').selectAll().where('state', '=', 'ready').execute();
    const submissions = await latestSubmissions(db, jobs.map((j) => j.id));
    const names = await userNames(db);
    const entries: ReviewQueue['jobs'] = [];
    for (const job of jobs) {
      const review = await reviewJob(db, job);
      const site = await db.selectFrom('sites').select(['id', 'client', 'address']).where('id', '=', job.site_id).executeTakeFirstOrThrow();
      const submission = submissions.get(job.id);
      entries.push({
        job: toJob(job),
        site,
        submitted: submission ? { by: submission.userId === null ? null : { id: submission.userId, name: names.get(submission.userId) ?? 'former user' }, at: submission.at, note: submission.note } : null,
        boardCount: review.boards.length,
        lockedBoards: review.boards.filter((b) => b.context.board.state === 'locked').length,
        counts: countsOfJob(review),
      });
    }
    // Oldest submission first; a job made ready without a recorded submission goes by its creation.
    entries.sort((a, b) => (a.submitted?.at ?? a.job.createdAt).localeCompare(b.submitted?.at ?? b.job.createdAt) || a.job.id - b.job.id);
    res.json({ jobs: entries });
  });

  router.get('/review/jobs/:jobId', async (req, res) => {
    const job = await requireJob(db, idParam(req, 'jobId'));
    const review = await reviewJob(db, job);
    const names = await userNames(db);
    const site = await db.selectFrom('sites').selectAll().where('id', '=', job.site_id).executeTakeFirstOrThrow();
    const submission = (await latestSubmissions(db, [job.id])).get(job.id);
    const boardRows = await db.selectFrom('boards').selectAll().where('job_id', '=', job.id).execute();
    const boardRowById = new Map(boardRows.map((b) => [b.id, b]));
    const boards = [];
    for (const b of review.boards) {
      const acceptances = b.acceptances.map((a) => toAcceptance(a, names));
      const numbers = new Map(b.context.circuits.map((c) => [c.id, c.number]));
      const findings = toReviewFindings(b.context.board.id, b.findings, acceptances, numbers);
      const counts = reviewCounts(b.findings, new Set(b.acceptances.map((a) => a.finding_key)), (f) => gateFindingKey(b.context.board.id, f));
      const missingByColumn = missingReadingCounts(b.findings).byColumn;
      const row = boardRowById.get(b.context.board.id)!;
      const rings = await loadRingReadings(db, b.context.circuits);
      boards.push({ board: toBoard(row, names), circuitCount: b.context.circuits.length, findings, counts, missingByColumn, gate: b.gate, rings });
    }
    res.json({
      job: toJob(job),
      site: toSite(site),
      submitted: submission ? { by: submission.userId === null ? null : { id: submission.userId, name: names.get(submission.userId) ?? 'former user' }, at: submission.at, note: submission.note } : null,
      boards,
      jobFindings: toReviewFindings(null, review.jobFindings, review.jobAcceptances.map((a) => toAcceptance(a, names)), new Map()),
      record: review.record,
      gate: review.gate,
    });
  });

  return router;
}
