import { Router } from 'express';
import { boardResponseSchema } from '../../shared/schemas/boards.ts';
import {
  jobSectionKeys,
  parseSectionChanges,
  sectionsFor,
  writeJobSectionBodySchema,
  type JobSectionData,
  type JobSectionKey,
} from '../../shared/schemas/job-record.ts';
import { jobDetailResponseSchema, jobHistoryResponseSchema, writeJobSectionResponseSchema } from '../../shared/schemas/jobs.ts';
import { createBoardBodySchema, createJobBodySchema, jobListResponseSchema, jobResponseSchema, jobStateLabels, updateJobBodySchema, type SiteFields } from '../../shared/schemas/sites.ts';
import { loadBoard } from '../db/boards.ts';
import { boardReferenceTaken, copyBoard, copyBoardsOfJob, createEmptyBoard } from '../db/board-creation.ts';
import { loadCompany } from '../db/company.ts';
import type { DB } from '../db/database.ts';
import { loadJobRecord, loadJobSection, mergeSectionChanges, writeJobSection } from '../db/job-sections.ts';
import { findJobRow, insertJob, latestJobCursor, listJobHistory, nextJobReference, referenceTaken, updateJobDetails } from '../db/jobs.ts';
import { parseHistoryText } from '../db/json-values.ts';
import { toJob, toSite } from '../db/mappers.ts';
import { findSiteRow, listBoardSummaries, listJobs, toBoardSummary, updateSite } from '../db/sites.ts';
import type { JobRow } from '../db/types.ts';
import { userNames } from '../db/users.ts';
import { HttpError, notFound } from '../http-error.ts';
import { jobFindings } from '../job-findings.ts';
import { describeSectionIssues, issuesError, sectionChangeIssues, sectionTitles, type JobBoardsIndex } from '../job-section-checks.ts';
import { currentUser } from '../middleware/auth.ts';
import { idParam } from './params.ts';

/**
 * The supply characteristics recorded on a visit become the site's own (earthing, U0, Ze, Ipf at
 * the origin), so the board checker (which reads the site) and the job rules (which read the
 * record) judge the same installation. Blank values leave the site's as they were.
 */
async function siteFollowsSupply(db: DB, siteId: number, supply: JobSectionData['supply'], userId: number): Promise<void> {
  const site = await findSiteRow(db, siteId);
  if (!site) return;
  const changes: Partial<SiteFields> = {};
  if (supply.earthing !== null) changes.earthing = supply.earthing;
  if (supply.u0V !== null && supply.u0V > 0) changes.nominalVoltageV = supply.u0V;
  if (supply.zeOhm !== null) changes.zeOhm = supply.zeOhm;
  if (supply.ipfKa !== null) changes.pfcKa = supply.ipfKa;
  if (Object.keys(changes).length > 0) await updateSite(db, site, site.version, changes, userId);
}

async function requireJob(db: DB, jobId: number): Promise<JobRow> {
  const job = await findJobRow(db, jobId);
  if (!job) throw notFound(`Job ${jobId}`);
  return job;
}

/** Once a reviewer has approved a job, or it has been issued, nothing about it changes (423). */
function requireJobOpen(job: JobRow): void {
  if (job.state === 'approved' || job.state === 'issued') {
    throw new HttpError(
      'locked',
      `Job ${job.reference} is ${jobStateLabels[job.state]}: nothing on it can change unless a reviewer reopens it.`,
    );
  }
}

function takenMessage(reference: string): string {
  return `The reference ${reference} is already used by another job; choose another, or leave it blank for the next free one.`;
}

async function jobBoardsIndex(db: DB, jobId: number): Promise<JobBoardsIndex> {
  const rows = await db
    .selectFrom('boards')
    .leftJoin('circuits', 'circuits.board_id', 'boards.id')
    .select(['boards.id as board_id', 'boards.reference', 'circuits.id as circuit_id', 'circuits.number'])
    .where('boards.job_id', '=', jobId)
    .execute();
  const index = new Map<number, { reference: string; circuits: Map<number, string> }>();
  for (const row of rows) {
    const entry = index.get(row.board_id) ?? { reference: row.reference, circuits: new Map<number, string>() };
    if (row.circuit_id !== null) entry.circuits.set(row.circuit_id, row.number ?? '');
    index.set(row.board_id, entry);
  }
  return index;
}

/** Routes of jobs, their record, history and new boards (mounted at /api/jobs). */
export function jobRoutes(db: DB): Router {
  const router = Router();

  router.get('/', async (req, res) => {
    const raw = req.query.siteId;
    let siteId: number | undefined;
    if (raw !== undefined) {
      siteId = Number(raw);
      if (!Number.isSafeInteger(siteId) || siteId <= 0) throw new HttpError('bad_request', 'siteId must be a positive whole number.');
    }
    res.json(jobListResponseSchema.parse({ jobs: (await listJobs(db, siteId)).map(toJob) }));
  });

  router.post('/', async (req, res) => {
    const body = createJobBodySchema.parse(req.body);
    const user = currentUser(req);
    const company = await loadCompany(db);
    const jobId = await db.transaction().execute(async (trx) => {
      const site = await findSiteRow(trx, body.siteId);
      if (!site) throw new HttpError('bad_request', `There is no site ${body.siteId}; choose the site again.`);
      const startFrom = body.startFromJobId ? await findJobRow(trx, body.startFromJobId) : null;
      if (body.startFromJobId && !startFrom) {
        throw new HttpError('bad_request', `There is no job ${body.startFromJobId} to start from.`);
      }
      if (startFrom && startFrom.site_id !== site.id) {
        throw new HttpError(
          'bad_request',
          `Job ${startFrom.reference} is on another site: a new job can only start from an earlier job on the same site (${site.client}, ${site.address}).`,
        );
      }
      const typed = body.reference?.trim() ?? '';
      if (typed && (await referenceTaken(trx, typed))) throw new HttpError('conflict', takenMessage(typed));
      const reference = typed || (await nextJobReference(trx, company.referencePattern, body.kind, body.visitDate));
      const id = await insertJob(
        trx,
        {
          siteId: site.id,
          kind: body.kind,
          reference,
          visitDate: body.visitDate,
          visitEndDate: body.visitEndDate ?? null,
          startedFromJobId: startFrom?.id ?? null,
        },
        user.id,
      );
      if (startFrom) await copyBoardsOfJob(trx, startFrom.id, id, user.id);
      return id;
    });
    res.status(201).json(jobResponseSchema.parse({ job: toJob(await requireJob(db, jobId)) }));
  });

  router.get('/:jobId', async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const job = await requireJob(db, jobId);
    const site = await findSiteRow(db, job.site_id);
    if (!site) throw notFound(`The site of job ${job.reference}`);
    const record = await loadJobRecord(db, jobId);
    res.json(
      jobDetailResponseSchema.parse({
        job: toJob(job),
        site: toSite(site),
        boards: (await listBoardSummaries(db, jobId)).map(toBoardSummary),
        record,
        findings: await jobFindings(db, job, record),
        cursor: await latestJobCursor(db, jobId),
      }),
    );
  });

  router.patch('/:jobId', async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const body = updateJobBodySchema.parse(req.body);
    const user = currentUser(req);
    await db.transaction().execute(async (trx) => {
      const job = await requireJob(trx, jobId);
      requireJobOpen(job);
      const visitDate = body.changes.visitDate ?? job.visit_date;
      const visitEndDate = body.changes.visitEndDate === undefined ? job.visit_end_date : body.changes.visitEndDate;
      if (visitEndDate && visitEndDate < visitDate) {
        throw issuesError([{ path: ['changes', 'visitEndDate'], message: 'The last day of the visit cannot be before the first.' }]);
      }
      const reference = body.changes.reference;
      if (reference !== undefined && (await referenceTaken(trx, reference, job.id))) throw new HttpError('conflict', takenMessage(reference));
      const result = await updateJobDetails(trx, job, body.version, body.changes, user.id);
      if (!result.ok) {
        throw new HttpError('conflict', `Someone else changed ${result.conflictingFields.join(', ')} of job ${job.reference} meanwhile; look again and retry.`, {
          current: toJob(await requireJob(trx, jobId)),
          fields: result.conflictingFields,
        });
      }
    });
    res.json(jobResponseSchema.parse({ job: toJob(await requireJob(db, jobId)) }));
  });

  router.put('/:jobId/record/:section', async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const key = req.params.section as JobSectionKey;
    if (!jobSectionKeys.includes(key)) {
      throw new HttpError('bad_request', `A job record has no section "${String(req.params.section)}"; its sections are ${jobSectionKeys.join(', ')}.`);
    }
    const body = writeJobSectionBodySchema.parse(req.body);
    const user = currentUser(req);
    const section = await db.transaction().execute(async (trx) => {
      const job = await requireJob(trx, jobId);
      if (!sectionsFor(job.kind).includes(key)) {
        throw new HttpError('bad_request', `An ${job.kind} has no ${sectionTitles[key]} section (${key}).`);
      }
      requireJobOpen(job);
      const parsed = parseSectionChanges(key, body.changes);
      if (!parsed.success) throw issuesError(describeSectionIssues(key, parsed.error));
      const changes = parsed.data as Record<string, unknown>;
      const current = await loadJobSection(trx, jobId, key);
      const issues = sectionChangeIssues({
        kind: job.kind,
        key,
        changes,
        merged: mergeSectionChanges(key, current.data, changes),
        boards: await jobBoardsIndex(trx, jobId),
      });
      if (issues.length > 0) throw issuesError(issues);
      const result = await writeJobSection(trx, { jobId, key, baseVersion: body.version, changes, userId: user.id });
      if (!result.ok) {
        const names = result.conflictingFields.join(', ');
        throw new HttpError(
          'conflict',
          `Someone else changed ${names} in the ${sectionTitles[key]} section meanwhile; look at their value and write yours again if it should stand.`,
          { section: result.current, fields: result.conflictingFields },
        );
      }
      if (key === 'supply' && result.changedFields.length > 0) {
        await siteFollowsSupply(trx, job.site_id, result.section.data as JobSectionData['supply'], user.id);
      }
      return result.section;
    });
    const job = await requireJob(db, jobId);
    res.json(writeJobSectionResponseSchema.parse({ section, findings: await jobFindings(db, job), cursor: await latestJobCursor(db, jobId) }));
  });

  router.get('/:jobId/history', async (req, res) => {
    const jobId = idParam(req, 'jobId');
    await requireJob(db, jobId);
    const names = await userNames(db);
    const rows = await listJobHistory(db, jobId);
    res.json(
      jobHistoryResponseSchema.parse({
        entries: rows.map((r) => ({
          id: r.id,
          section: r.section,
          field: r.field,
          action: r.action,
          oldValue: parseHistoryText(r.old_text),
          newValue: parseHistoryText(r.new_text),
          reason: r.reason,
          by: r.user_id === null ? null : { id: r.user_id, name: names.get(r.user_id) ?? 'former user' },
          at: r.at,
        })),
      }),
    );
  });

  router.post('/:jobId/boards', async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const body = createBoardBodySchema.parse(req.body);
    const user = currentUser(req);
    const board = await db.transaction().execute(async (trx) => {
      const job = await requireJob(trx, jobId);
      requireJobOpen(job);
      if (await boardReferenceTaken(trx, jobId, body.reference)) {
        throw new HttpError('conflict', `This job already has a board ${body.reference}; give the new board another reference.`);
      }
      const fields = { reference: body.reference, location: body.location, suppliedFrom: body.suppliedFrom };
      if (body.copyFromBoardId) {
        const source = await trx.selectFrom('boards').selectAll().where('id', '=', body.copyFromBoardId).executeTakeFirst();
        if (!source) throw issuesError([{ path: ['copyFromBoardId'], message: `There is no board ${body.copyFromBoardId} to copy.` }]);
        const sourceLayout = source.phases === 3 ? 'three-phase' : 'single-phase';
        if (sourceLayout !== body.layout) {
          throw issuesError([{ path: ['layout'], message: `Board ${source.reference} is ${sourceLayout}: a copy of it is ${sourceLayout} too.` }]);
        }
        return copyBoard(trx, source, jobId, fields, { linkPrevious: false, userId: user.id });
      }
      // The schema asks for ways when nothing is copied.
      return createEmptyBoard(trx, jobId, fields, body.layout, body.ways ?? 1, user.id);
    });
    res.status(201).json(boardResponseSchema.parse({ board: await loadBoard(db, board.id) }));
  });

  return router;
}
