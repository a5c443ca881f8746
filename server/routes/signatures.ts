import { Router } from 'express';
import {
  maxSignatureBytes,
  signBodySchema,
  signingRefusal,
  signingRolesFor,
  type Signature,
} from '../../shared/schemas/signatures.ts';
import type { DB } from '../db/database.ts';
import { loadReopenings, revisionInHand, revisionOfSignature, type Reopening } from '../db/signature-revisions.ts';
import type { SignatureRow } from '../db/types.ts';
import { userNames } from '../db/users.ts';
import { imageTypes, singleUpload, type FileStore, type UploadedFile } from '../files.ts';
import { HttpError, notFound } from '../http-error.ts';
import { currentUser } from '../middleware/auth.ts';
import { idParam } from './params.ts';

async function requireJob(db: DB, jobId: number) {
  const job = await db.selectFrom('jobs').select(['id', 'kind', 'state', 'reference']).where('id', '=', jobId).executeTakeFirst();
  if (!job) throw notFound(`Job ${jobId}`);
  return job;
}

/**
 * Every signature of a job, newest first, each with the revision it was given for; the newest
 * per role given for the revision in hand is the one in use (see signature-revisions.ts).
 */
export async function listSignatures(db: DB, jobId: number, reopenings?: readonly Reopening[]): Promise<Signature[]> {
  const rows = await db.selectFrom('signatures').selectAll().where('job_id', '=', jobId).orderBy('id', 'desc').execute();
  const names = await userNames(db);
  const reopens = reopenings ?? (await loadReopenings(db, jobId));
  const inHand = revisionInHand(reopens);
  const seen = new Set<string>();
  return rows.map((row: SignatureRow) => {
    const revision = revisionOfSignature(row.signed_at, reopens);
    const current = revision === inHand && !seen.has(row.role);
    if (revision === inHand) seen.add(row.role);
    return {
      id: row.id,
      jobId: row.job_id,
      role: row.role,
      name: row.name,
      fileId: row.file_id,
      signedBy: { id: row.user_id, name: names.get(row.user_id) ?? 'someone removed' },
      signedAt: row.signed_at,
      current,
      revision,
    };
  });
}

/**
 * `GET /api/jobs/:jobId/signatures` and `POST /api/jobs/:jobId/signatures` (multipart: `role`,
 * `name` and the image in `image`, drawn in the browser or uploaded; PNG or JPEG by content, at
 * most `maxSignatureBytes`). Who may sign what: `signingRefusal` in shared/schemas/signatures.ts.
 * A new signature for a role supersedes the earlier one; every row is kept, and every signing is
 * in the job's history.
 */
export function signatureRoutes(db: DB, files: FileStore): Router {
  const router = Router();

  router.get('/jobs/:jobId/signatures', async (req, res) => {
    const job = await requireJob(db, idParam(req, 'jobId'));
    const reopenings = await loadReopenings(db, job.id);
    const latest = reopenings.at(-1);
    const names = await userNames(db);
    res.json({
      signatures: await listSignatures(db, job.id, reopenings),
      jobKind: job.kind,
      jobState: job.state,
      roles: signingRolesFor(job.kind),
      revision: revisionInHand(reopenings),
      reopened: latest
        ? { at: latest.at, by: { id: latest.userId ?? 0, name: (latest.userId !== null && names.get(latest.userId)) || 'someone removed' }, reason: latest.reason, revision: latest.revision }
        : null,
    });
  });

  router.post(
    '/jobs/:jobId/signatures',
    ...singleUpload({ field: 'image', maxBytes: maxSignatureBytes, types: imageTypes, what: 'a signature image' }),
    async (req, res) => {
      const jobId = idParam(req, 'jobId');
      const body = signBodySchema.parse(req.body ?? {});
      const user = currentUser(req);
      const upload = res.locals.upload as UploadedFile;

      let storedPath: string | null = null;
      const signatureId = await db.transaction().execute(async (trx) => {
        // The job's state is read inside the write, so a job issued a moment ago is not signed.
        const job = await requireJob(trx, jobId);
        const refusal = signingRefusal(user.role, body.role, job);
        if (refusal) throw new HttpError(refusal.code, refusal.message);
        const file = await files.save(trx, {
          kind: 'signature',
          bytes: upload.bytes,
          mime: upload.mime,
          originalName: upload.originalName || `signature-${body.role}.png`,
          jobId,
          uploadedBy: user.id,
        });
        storedPath = file.path;
        const signature = await trx
          .insertInto('signatures')
          .values({ job_id: jobId, role: body.role, name: body.name, file_id: file.id, user_id: user.id })
          .returningAll()
          .executeTakeFirstOrThrow();
        await trx
          .insertInto('job_history')
          .values({
            job_id: jobId,
            section: 'declaration',
            field: body.role,
            action: 'signed',
            old_text: null,
            new_text: JSON.stringify({ signatureId: signature.id, name: body.name, fileId: file.id, sha256: file.sha256 }),
            reason: null,
            user_id: user.id,
            at: new Date().toISOString(),
            version: null,
          })
          .execute();
        return signature.id;
      }).catch((error: unknown) => {
        // The row went with the rolled-back transaction; the bytes go too.
        if (storedPath) files.remove(storedPath);
        throw error;
      });
      const signature = (await listSignatures(db, jobId)).find((s) => s.id === signatureId)!;
      res.status(201).json({ signature });
    },
  );

  return router;
}
