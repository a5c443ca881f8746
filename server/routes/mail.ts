import { Router } from 'express';
import { defaultCompany } from '../../shared/schemas/company.ts';
import { sendJobBodySchema, type OutgoingMail } from '../../shared/schemas/mail.ts';
import { jobStateLabels } from '../../shared/schemas/sites.ts';
import { loadCompany } from '../db/company.ts';
import type { DB } from '../db/database.ts';
import type { OutgoingMailRow } from '../db/types.ts';
import { userNames } from '../db/users.ts';
import { HttpError, notFound } from '../http-error.ts';
import { listMailbox, mailboxAttachment, mailboxRaw } from '../mail/local-mail-server.ts';
import type { MailSender } from '../mail/mail-sender.ts';
import { currentUser, requireRole } from '../middleware/auth.ts';
import { idParam } from './params.ts';

const kindWords = { EIC: 'electrical installation certificate', EICR: 'electrical installation condition report' } as const;

async function requireJob(db: DB, jobId: number) {
  const job = await db
    .selectFrom('jobs')
    .innerJoin('sites', 'sites.id', 'jobs.site_id')
    .select(['jobs.id', 'jobs.kind', 'jobs.reference', 'jobs.state', 'sites.address', 'sites.contact_name', 'sites.contact_email'])
    .where('jobs.id', '=', jobId)
    .executeTakeFirst();
  if (!job) throw notFound(`Job ${jobId}`);
  return job;
}

/** The newest revision not superseded: the one a client should have. */
function latestIssue(db: DB, jobId: number) {
  return db
    .selectFrom('job_issues')
    .select(['id', 'revision', 'issued_at'])
    .where('job_id', '=', jobId)
    .where('superseded_at', 'is', null)
    .orderBy('revision', 'desc')
    .executeTakeFirst();
}

function toOutgoingMail(row: OutgoingMailRow, revision: number | null, names: Map<number, string>): OutgoingMail {
  return {
    id: row.id,
    jobId: row.job_id,
    revision,
    to: row.to_address,
    subject: row.subject,
    body: row.body,
    state: row.state,
    attempts: row.attempts,
    lastError: row.last_error,
    createdBy: row.created_by === null ? null : { id: row.created_by, name: names.get(row.created_by) ?? 'someone removed' },
    createdAt: row.created_at,
    sentAt: row.sent_at,
  };
}

async function mailRowsWithRevision(db: DB, where: { jobId?: number; mailId?: number }) {
  let query = db
    .selectFrom('outgoing_mail')
    .leftJoin('job_issues', 'job_issues.id', 'outgoing_mail.issue_id')
    .selectAll('outgoing_mail')
    .select('job_issues.revision');
  if (where.jobId !== undefined) query = query.where('outgoing_mail.job_id', '=', where.jobId);
  if (where.mailId !== undefined) query = query.where('outgoing_mail.id', '=', where.mailId);
  const rows = await query.orderBy('outgoing_mail.id', 'desc').execute();
  const names = await userNames(db);
  return rows.map((r) => toOutgoingMail(r, r.revision, names));
}

/** The standard words of the e-mail, with the sender's own message (if any) after the first line. */
function composeBody(options: {
  contactName: string;
  kind: 'EIC' | 'EICR';
  reference: string;
  revision: number;
  issuedAt: string;
  address: string;
  message?: string;
  company: { name: string; phone: string; email: string };
}): string {
  const lines = [
    `Hello${options.contactName ? ` ${options.contactName}` : ''},`,
    '',
    `Attached is the ${kindWords[options.kind]} for ${options.address}: reference ${options.reference}, revision ${options.revision}, issued on ${options.issuedAt.slice(0, 10)}.`,
  ];
  if (options.message) lines.push('', options.message);
  lines.push(
    '',
    'Please keep it with the records of the installation: it will be asked for at the next inspection, and when the property is sold or let.',
  );
  // Signed with the company's name and contact; the placeholder name of a company nobody has
  // described yet is left off.
  const signature = [
    options.company.name !== defaultCompany.name ? options.company.name : '',
    [options.company.phone, options.company.email].filter(Boolean).join(' · '),
  ].filter(Boolean);
  if (signature.length > 0) lines.push('', ...signature);
  return `${lines.join('\n')}\n`;
}

/**
 * Sending an issued job to the client: `POST /api/jobs/:jobId/send` (reviewer or admin; queued,
 * answered 202 at once), `GET /api/jobs/:jobId/mail` (progress), `POST /api/mail/:mailId/retry`.
 */
export function mailRoutes(db: DB, sender: MailSender): Router {
  const router = Router();

  router.get('/jobs/:jobId/mail', async (req, res) => {
    const job = await requireJob(db, idParam(req, 'jobId'));
    const issue = await latestIssue(db, job.id);
    const chosen = await db
      .selectFrom('files')
      .select((eb) => eb.fn.countAll<number>().as('n'))
      .where('job_id', '=', job.id)
      .where('kind', '=', 'photo')
      .where('send_to_client', '=', 1)
      .executeTakeFirstOrThrow();
    res.json({
      mail: await mailRowsWithRevision(db, { jobId: job.id }),
      jobState: job.state,
      defaultTo: job.contact_email,
      latestIssue: issue ? { id: issue.id, revision: issue.revision, issuedAt: issue.issued_at } : null,
      photosChosen: Number(chosen.n),
    });
  });

  router.post('/jobs/:jobId/send', requireRole('reviewer', 'admin'), async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const body = sendJobBodySchema.parse(req.body ?? {});
    const job = await requireJob(db, jobId);
    if (job.state !== 'issued') {
      throw new HttpError('conflict', `Only an issued job can be sent to the client; job ${job.reference} is ${jobStateLabels[job.state]}.`);
    }
    const issue = await latestIssue(db, job.id);
    if (!issue) throw new HttpError('conflict', `Job ${job.reference} has no issued document to send.`);
    const to = body.to ?? job.contact_email;
    if (!to) {
      throw new HttpError('bad_request', 'The site has no contact e-mail; give the address to send to.', undefined);
    }
    const pending = await db
      .selectFrom('outgoing_mail')
      .select('id')
      .where('issue_id', '=', issue.id)
      .where('to_address', '=', to)
      .where('state', 'in', ['waiting', 'sending'])
      .executeTakeFirst();
    if (pending) throw new HttpError('conflict', `Revision ${issue.revision} is already on its way to ${to}.`);

    const company = await loadCompany(db);
    const user = currentUser(req);
    const id = await db.transaction().execute(async (trx) => {
      // The photos chosen now go with this e-mail (and with its retries, unless unchosen since).
      const photoIds = (
        await trx.selectFrom('files').select('id').where('job_id', '=', job.id).where('kind', '=', 'photo').where('send_to_client', '=', 1).orderBy('id').execute()
      ).map((f) => f.id);
      const row = await trx
        .insertInto('outgoing_mail')
        .values({
          job_id: job.id,
          issue_id: issue.id,
          to_address: to,
          subject: `${kindWords[job.kind].replace(/^./, (c) => c.toUpperCase())} ${job.reference}, revision ${issue.revision}: ${job.address}`,
          body: composeBody({
            contactName: body.to && body.to !== job.contact_email ? '' : job.contact_name,
            kind: job.kind,
            reference: job.reference,
            revision: issue.revision,
            issuedAt: issue.issued_at,
            address: job.address,
            message: body.message || undefined,
            company,
          }),
          created_by: user.id,
          photo_file_ids: JSON.stringify(photoIds),
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      await trx
        .insertInto('job_history')
        .values({
          job_id: job.id,
          section: null,
          field: null,
          action: 'mail-queued',
          old_text: null,
          new_text: JSON.stringify({ mailId: row.id, to, revision: issue.revision, photoFileIds: photoIds }),
          reason: null,
          user_id: user.id,
          at: new Date().toISOString(),
          version: null,
        })
        .execute();
      return row.id;
    });
    sender.kick();
    const [mail] = await mailRowsWithRevision(db, { mailId: id });
    res.status(202).json({ mail });
  });

  router.post('/mail/:mailId/retry', requireRole('reviewer', 'admin'), async (req, res) => {
    const mailId = idParam(req, 'mailId');
    const user = currentUser(req);
    const row = await db.selectFrom('outgoing_mail').selectAll().where('id', '=', mailId).executeTakeFirst();
    if (!row) throw notFound(`E-mail ${mailId}`);
    if (row.state !== 'failed') {
      throw new HttpError('conflict', `Only an e-mail that was not sent can be retried; this one is ${row.state === 'sent' ? 'already sent' : row.state}.`);
    }
    await db.transaction().execute(async (trx) => {
      const updated = await trx.updateTable('outgoing_mail').set({ state: 'waiting' }).where('id', '=', mailId).where('state', '=', 'failed').executeTakeFirst();
      if (Number(updated.numUpdatedRows) !== 1) throw new HttpError('conflict', 'Someone else retried this e-mail a moment ago.');
      await trx
        .insertInto('job_history')
        .values({
          job_id: row.job_id,
          section: null,
          field: null,
          action: 'mail-retried',
          old_text: JSON.stringify({ state: 'failed', lastError: row.last_error }),
          new_text: JSON.stringify({ mailId, to: row.to_address }),
          reason: null,
          user_id: user.id,
          at: new Date().toISOString(),
          version: null,
        })
        .execute();
    });
    sender.kick();
    const [mail] = await mailRowsWithRevision(db, { mailId });
    res.status(202).json({ mail });
  });

  return router;
}

/**
 * Admin → mailbox: what the local mail server received (`mailboxDir`), newest first, and each
 * message's attachments. `localServerPort` is null when mail goes to a real server instead.
 */
export function mailboxRoutes(mailboxDir: string, localServerPort: number | null): Router {
  const router = Router();
  router.use(requireRole('admin'));

  router.get('/', (_req, res) => {
    res.json({ localServerPort, messages: listMailbox(mailboxDir) });
  });

  router.get('/:messageId/raw', (req, res) => {
    const raw = mailboxRaw(mailboxDir, req.params.messageId);
    if (!raw) throw notFound('That message');
    res.set({ 'Content-Type': 'message/rfc822', 'Content-Disposition': `attachment; filename="${req.params.messageId}.eml"` }).send(raw);
  });

  router.get('/:messageId/attachments/:index', (req, res) => {
    const index = Number(req.params.index);
    if (!Number.isInteger(index) || index < 0) throw new HttpError('bad_request', 'The attachment number must be a whole number from 0.');
    const attachment = mailboxAttachment(mailboxDir, req.params.messageId, index);
    if (!attachment) throw notFound('That attachment');
    const name = attachment.filename.replace(/[^\w. -]/g, '_');
    // Anyone who can reach the local server can put anything in the mailbox: only PDFs and images
    // open in the browser; everything else downloads as bytes, so it never runs as a page here.
    const opensInline = ['application/pdf', 'image/png', 'image/jpeg'].includes(attachment.contentType);
    res
      .set({
        'Content-Type': opensInline ? attachment.contentType : 'application/octet-stream',
        'Content-Disposition': `${opensInline ? 'inline' : 'attachment'}; filename="${name}"`,
      })
      .send(attachment.content);
  });

  return router;
}
