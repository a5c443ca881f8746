import fs from 'node:fs/promises';
import { Router } from 'express';
import { reopenJobBodySchema, type JobIssue } from '../../shared/schemas/issues.ts';
import { jobStateLabels } from '../../shared/schemas/sites.ts';
import type { DB } from '../db/database.ts';
import { toJob } from '../db/mappers.ts';
import type { JobRow } from '../db/types.ts';
import { loadReopenings } from '../db/signature-revisions.ts';
import { userNames } from '../db/users.ts';
import { HttpError, notFound } from '../http-error.ts';
import { currentUser, requireRole } from '../middleware/auth.ts';
import { loadJobDocument, type JobDocument } from '../pdf/load-job-document.ts';
import { renderJobPdf } from '../pdf/render-job-pdf.ts';
import { sha256Hex, storedFilePath, writeNewFile } from '../pdf/stored-files.ts';
import { idParam } from './params.ts';

/**
 * Issuing and reopening. An issue renders the whole document, stores the PDF under the data
 * folder with its SHA-256 and never touches it again; the bytes served later are checked
 * against that hash. Reopening sends an issued job back to being entered, with a reason; the
 * next issue is the next revision and marks the earlier one superseded (kept, still served).
 */
export function issueRoutes(db: DB, options: { dataDir: string }): Router {
  const router = Router();
  const { dataDir } = options;

  async function requireJob(trx: DB, jobId: number): Promise<JobRow> {
    const job = await trx.selectFrom('jobs').selectAll().where('id', '=', jobId).executeTakeFirst();
    if (!job) throw notFound(`Job ${jobId}`);
    return job;
  }

  router.post('/jobs/:jobId/issue', requireRole('reviewer', 'admin'), async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const user = currentUser(req);
    const job = await requireJob(db, jobId);
    if (job.state !== 'approved') {
      throw new HttpError(
        'conflict',
        job.state === 'issued'
          ? `${job.reference} is already issued. Reopen it with a reason to change it; the next issue will be a new revision.`
          : `${job.reference} is ${jobStateLabels[job.state]}; only an approved job can be issued.`,
      );
    }
    const document = await loadJobDocument(db, jobId, dataDir);
    if (!document) throw notFound(`Job ${jobId}`);
    const reopenings = await loadReopenings(db, jobId);
    const unsigned = missingSignatures(document, reopenings.length > 0);
    if (unsigned.length > 0) {
      const latest = reopenings.at(-1);
      const why = latest
        ? ` Revision ${latest.revision} was reopened on ${latest.at.slice(0, 10)}${latest.reason ? ` (“${latest.reason}”)` : ''}, so the document may have changed since it was signed: the signatures given for revision ${latest.revision} stay with it and do not count for revision ${latest.revision + 1}.`
        : '';
      throw new HttpError('conflict', `${job.reference} cannot be issued until it is signed: ${unsigned.join('; ')}.${why}`, { reasons: unsigned });
    }

    const last = await db.selectFrom('job_issues').select((eb) => eb.fn.max('revision').as('revision')).where('job_id', '=', jobId).executeTakeFirst();
    const revision = Number(last?.revision ?? 0) + 1;
    // Whole seconds: the time printed, stored and used as the PDF's creation date is one value.
    const issuedAt = new Date(Math.floor(Date.now() / 1000) * 1000);
    const pdf = await renderJobPdf(document, { revision, issuedAt, issuedBy: user.name });
    const sha256 = sha256Hex(pdf);
    const relative = `issued/job-${jobId}/${safeName(job.reference)}-rev${revision}-${sha256.slice(0, 12)}.pdf`;
    try {
      await writeNewFile(dataDir, relative, pdf);
    } catch (error) {
      // The same revision with the same bytes is already on disk: another request is issuing it.
      if ((error as NodeJS.ErrnoException).code === 'EEXIST') {
        throw new HttpError('conflict', `${job.reference} is being issued by another request; look again in a moment.`);
      }
      throw error;
    }

    try {
      await db.transaction().execute(async (trx) => {
        const current = await requireJob(trx, jobId);
        if (current.state !== 'approved' || current.version !== job.version) {
          throw new HttpError('conflict', `${job.reference} changed while it was being issued (now ${jobStateLabels[current.state]}); nothing was issued. Look again and retry.`);
        }
        const at = issuedAt.toISOString();
        const file = await trx
          .insertInto('files')
          .values({ kind: 'issued-pdf', path: relative, sha256, mime: 'application/pdf', size_bytes: pdf.length, original_name: `${safeName(job.reference)}-rev${revision}.pdf`, job_id: jobId, board_id: null, uploaded_by: user.id, created_at: at })
          .returning('id')
          .executeTakeFirstOrThrow();
        await trx.updateTable('job_issues').set({ superseded_at: at }).where('job_id', '=', jobId).where('superseded_at', 'is', null).execute();
        await trx.insertInto('job_issues').values({ job_id: jobId, revision, file_id: file.id, sha256, issued_by: user.id, issued_at: at, superseded_at: null }).execute();
        await trx.updateTable('jobs').set({ state: 'issued', version: job.version + 1 }).where('id', '=', jobId).execute();
        await trx
          .insertInto('job_history')
          .values({ job_id: jobId, section: null, field: 'state', action: 'issued', old_text: JSON.stringify(job.state), new_text: JSON.stringify('issued'), reason: `revision ${revision}`, user_id: user.id, at, version: job.version + 1 })
          .execute();
      });
    } catch (error) {
      // Nothing refers to the file: remove it so the data folder holds only issued documents.
      await fs.rm(storedFilePath(dataDir, relative), { force: true });
      throw error;
    }

    const issue = (await listIssues(db, jobId)).find((i) => i.revision === revision);
    res.status(201).json({ issue, job: toJob(await requireJob(db, jobId)) });
  });

  router.get('/jobs/:jobId/issues', async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const job = await requireJob(db, jobId);
    res.json({ job: toJob(job), issues: await listIssues(db, jobId) });
  });

  router.get('/jobs/:jobId/issues/:revision/pdf', async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const revision = idParam(req, 'revision');
    const job = await requireJob(db, jobId);
    const row = await db
      .selectFrom('job_issues')
      .innerJoin('files', 'files.id', 'job_issues.file_id')
      .select(['job_issues.sha256 as issued_sha256', 'files.sha256 as file_sha256', 'files.path'])
      .where('job_issues.job_id', '=', jobId)
      .where('job_issues.revision', '=', revision)
      .executeTakeFirst();
    if (!row) throw notFound(`Revision ${revision} of ${job.reference}`);
    let bytes: Buffer;
    try {
      bytes = await fs.readFile(storedFilePath(dataDir, row.path));
    } catch (error) {
      console.error(`Issued PDF missing: job ${jobId} revision ${revision} at ${row.path}`, error);
      throw new HttpError('internal', `The stored PDF of revision ${revision} cannot be read from the server’s disk. An administrator must restore it from a backup.`);
    }
    const actual = sha256Hex(bytes);
    if (actual !== row.issued_sha256 || actual !== row.file_sha256) {
      console.error(`Issued PDF altered on disk: job ${jobId} revision ${revision} at ${row.path}: SHA-256 ${actual}, issued as ${row.issued_sha256}`);
      throw new HttpError(
        'internal',
        `The stored PDF of revision ${revision} no longer matches the SHA-256 taken when it was issued, so it is not served. An administrator must restore it from a backup.`,
      );
    }
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('ETag', `"${actual}"`);
    res.setHeader('Cache-Control', 'private, max-age=31536000, immutable');
    res.attachment(`${safeName(job.reference)}-rev${revision}.pdf`);
    res.send(bytes);
  });

  router.post('/jobs/:jobId/reopen', requireRole('reviewer', 'admin'), async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const { reason } = reopenJobBodySchema.parse(req.body);
    const user = currentUser(req);
    await db.transaction().execute(async (trx) => {
      const job = await requireJob(trx, jobId);
      if (job.state !== 'issued') {
        throw new HttpError('conflict', `${job.reference} is ${jobStateLabels[job.state]}, not issued; only an issued job is reopened.`);
      }
      const at = new Date().toISOString();
      await trx.updateTable('jobs').set({ state: 'entering', version: job.version + 1 }).where('id', '=', jobId).execute();
      await trx
        .insertInto('job_history')
        .values({ job_id: jobId, section: null, field: 'state', action: 'reopened', old_text: JSON.stringify('issued'), new_text: JSON.stringify('entering'), reason, user_id: user.id, at, version: job.version + 1 })
        .execute();
    });
    res.json({ job: toJob(await requireJob(db, jobId)) });
  });

  return router;
}

/**
 * The signatures an issue needs: EIC its designer, constructor and inspector (or one person for
 * all); EICR its inspector and reviewer. `document.signatures` holds only those given since the
 * latest reopening, so after a reopening every person is asked to sign again.
 */
function missingSignatures(document: JobDocument, reopened: boolean): string[] {
  const signed = new Set(document.signatures.map((s) => s.role));
  const declaration = document.record.declaration.data;
  const needed: { role: 'designer' | 'constructor' | 'inspector' | 'reviewer'; words: string }[] =
    document.job.kind === 'EIC'
      ? declaration.samePersonForAll
        ? [{ role: 'inspector', words: 'the person responsible for design, construction, and inspection and testing has not signed' }]
        : [
            { role: 'designer', words: 'the designer has not signed' },
            { role: 'constructor', words: 'the constructor has not signed' },
            { role: 'inspector', words: 'the inspector has not signed' },
          ]
      : [
          { role: 'inspector', words: 'the inspector has not signed' },
          { role: 'reviewer', words: 'the reviewer has not signed' },
        ];
  return needed.filter((n) => !signed.has(n.role)).map((n) => (reopened ? `${n.words} again since the job was reopened` : n.words));
}

/** A reference as a file name: letters, digits, dot, dash and underscore only. */
function safeName(reference: string): string {
  return reference.replace(/[^A-Za-z0-9._-]+/g, '_').slice(0, 60) || 'document';
}

async function listIssues(db: DB, jobId: number): Promise<JobIssue[]> {
  const rows = await db
    .selectFrom('job_issues')
    .innerJoin('files', 'files.id', 'job_issues.file_id')
    .select(['job_issues.revision', 'job_issues.issued_by', 'job_issues.issued_at', 'job_issues.sha256', 'job_issues.superseded_at', 'files.size_bytes'])
    .where('job_issues.job_id', '=', jobId)
    .orderBy('job_issues.revision', 'desc')
    .execute();
  const names = await userNames(db);
  return rows.map((row) => ({
    revision: row.revision,
    issuedBy: { id: row.issued_by, name: names.get(row.issued_by) ?? 'former user' },
    issuedAt: row.issued_at,
    sha256: row.sha256,
    sizeBytes: row.size_bytes,
    supersededAt: row.superseded_at,
    pdfUrl: `/api/jobs/${jobId}/issues/${row.revision}/pdf`,
  }));
}
