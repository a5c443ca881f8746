import { z } from 'zod';
import { boardSchema, circuitSchema } from './boards.ts';
import { jobSectionKeys, jobSectionStateSchema } from './job-record.ts';
import { ringReadingsSchema } from './ring-sockets.ts';
import { jobSchema, siteSchema } from './sites.ts';

/**
 * Issued documents. Issuing renders the whole certificate or report as a PDF, stores it with its
 * SHA-256 and never changes it again; reopening the job with a reason lets it be changed, and the
 * next issue is the next revision, the earlier one kept and marked superseded.
 */
export const jobIssueSchema = z.object({
  revision: z.number().int().positive(),
  issuedBy: z.object({ id: z.number().int(), name: z.string() }),
  issuedAt: z.string(),
  /** SHA-256 of the stored PDF (hex). */
  sha256: z.string(),
  sizeBytes: z.number().int(),
  /** When a later revision replaced this one; null for the current one. */
  supersededAt: z.string().nullable(),
  /** Where to download the stored bytes. */
  pdfUrl: z.string(),
});
export type JobIssue = z.infer<typeof jobIssueSchema>;

/** `GET /api/jobs/:jobId/issues`: the job (for its state) and its revisions, newest first. */
export const jobIssueListResponseSchema = z.object({ job: jobSchema, issues: z.array(jobIssueSchema) });
export type JobIssueListResponse = z.infer<typeof jobIssueListResponseSchema>;

/** `POST /api/jobs/:jobId/issue` answers the new revision and the job in its new state. */
export const issueJobResponseSchema = z.object({ issue: jobIssueSchema, job: jobSchema });

/** `POST /api/jobs/:jobId/reopen`: an issued job goes back to being entered, with the reason. */
export const reopenJobBodySchema = z.object({
  reason: z
    .string({ error: 'Say why the issued document must change.' })
    .trim()
    .min(3, 'Say why the issued document must change.')
    .max(500, 'At most 500 characters.'),
});
export type ReopenJobBody = z.infer<typeof reopenJobBodySchema>;
export const reopenJobResponseSchema = z.object({ job: jobSchema });

/**
 * `GET /api/jobs/:jobId/export.json`: the whole job in the API's own shapes, for a user's own
 * records: the job, its site, every section of its record, and every board with its circuits
 * (details and reading cells as typed, and its rings' socket readings).
 */
export const jobExportSchema = z.object({
  format: z.literal('boardwalk-job'),
  formatVersion: z.literal(1),
  exportedAt: z.string(),
  job: jobSchema,
  site: siteSchema,
  record: z.object(
    Object.fromEntries(jobSectionKeys.map((key) => [key, jobSectionStateSchema])) as Record<
      (typeof jobSectionKeys)[number],
      typeof jobSectionStateSchema
    >,
  ),
  boards: z.array(
    z.object({
      board: boardSchema,
      circuits: z.array(circuitSchema),
      /**
       * The rings' socket-by-socket readings with the checker's diagnosis, for rings that have any.
       * Optional: exports written before it was added parse as they are.
       */
      ringSockets: z.array(ringReadingsSchema).optional(),
    }),
  ),
});
export type JobExport = z.infer<typeof jobExportSchema>;
