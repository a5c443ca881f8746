import { z } from 'zod';
import { jobStates } from './sites.ts';

/** `POST /api/jobs/:jobId/send`: where to send the issued document, and a few words of one's own. */
export const sendJobBodySchema = z.object({
  /** Defaults to the site's contact e-mail. */
  to: z.email({ error: 'That is not an e-mail address.' }).optional(),
  /** Added to the message above the standard words, if given. */
  message: z.string().trim().max(2000, 'At most 2000 characters.').optional(),
});
export type SendJobBody = z.infer<typeof sendJobBodySchema>;

/** An outgoing e-mail's state: waiting → sending → sent, or failed (kept, and can be retried). */
export const mailStates = ['waiting', 'sending', 'sent', 'failed'] as const;
export type MailState = (typeof mailStates)[number];
export const mailStateLabels: Record<MailState, string> = {
  waiting: 'waiting to be sent',
  sending: 'sending',
  sent: 'sent',
  failed: 'not sent',
};

export const outgoingMailSchema = z.object({
  id: z.number().int(),
  jobId: z.number().int(),
  /** The issued revision attached. */
  revision: z.number().int().nullable(),
  to: z.string(),
  subject: z.string(),
  body: z.string(),
  state: z.enum(mailStates),
  attempts: z.number().int(),
  /** Why the last attempt failed, in words. */
  lastError: z.string().nullable(),
  createdBy: z.object({ id: z.number().int(), name: z.string() }).nullable(),
  createdAt: z.string(),
  sentAt: z.string().nullable(),
});
export type OutgoingMail = z.infer<typeof outgoingMailSchema>;

/** `GET /api/jobs/:jobId/mail`: the job's e-mails, newest first, and what a new one would use. */
export const jobMailResponseSchema = z.object({
  mail: z.array(outgoingMailSchema),
  jobState: z.enum(jobStates),
  /** The site's contact e-mail (the default address), or ''. */
  defaultTo: z.string(),
  /** The newest issued revision, or null when nothing is issued. */
  latestIssue: z.object({ id: z.number().int(), revision: z.number().int(), issuedAt: z.string() }).nullable(),
  /** How many of the job's photos of the notes are chosen to go with the next e-mail (none unless chosen). */
  photosChosen: z.number().int(),
});
export type JobMail = z.infer<typeof jobMailResponseSchema>;

export const outgoingMailResponseSchema = z.object({ mail: outgoingMailSchema });

/** One message the local mail server received (admin → mailbox). */
export const mailboxEntrySchema = z.object({
  id: z.string(),
  receivedAt: z.string(),
  envelopeFrom: z.string(),
  envelopeTo: z.array(z.string()),
  from: z.string(),
  to: z.string(),
  subject: z.string(),
  sizeBytes: z.number().int(),
  attachments: z.array(
    z.object({ index: z.number().int(), filename: z.string(), contentType: z.string(), sizeBytes: z.number().int(), sha256: z.string() }),
  ),
});
export type MailboxEntry = z.infer<typeof mailboxEntrySchema>;

export const mailboxResponseSchema = z.object({
  /** The local mail server's port, or null when mail goes to a real server (SMTP_URL) instead. */
  localServerPort: z.number().int().nullable(),
  messages: z.array(mailboxEntrySchema),
});
export type Mailbox = z.infer<typeof mailboxResponseSchema>;
