import { z } from 'zod';
import { boardSummarySchema } from './boards.ts';
import { findingSchema } from './findings.ts';
import { jobSectionKeys, jobSectionStateSchema, type JobRecord } from './job-record.ts';
import { jobSchema, siteSchema } from './sites.ts';

/**
 * `GET /api/jobs/:jobId`: the job, its site, its boards, every section of its record with the
 * section's version, and the job's own findings (the checker's job rules; board findings stay
 * with each board). Features that add to the job (review, issue, mail) serve their parts from
 * routes of their own rather than growing this answer.
 */
export const jobDetailResponseSchema = z.object({
  job: jobSchema,
  site: siteSchema,
  boards: z.array(boardSummarySchema),
  record: z.object(Object.fromEntries(jobSectionKeys.map((key) => [key, jobSectionStateSchema])) as Record<
    (typeof jobSectionKeys)[number],
    typeof jobSectionStateSchema
  >),
  findings: z.array(findingSchema),
  /** Cursor of the newest entry in the job's history. */
  cursor: z.number().int(),
});
export type JobDetail = Omit<z.infer<typeof jobDetailResponseSchema>, 'record'> & { record: JobRecord };

/** `PUT /api/jobs/:jobId/record/:section` answers the section as it now stands and the job's findings. */
export const writeJobSectionResponseSchema = z.object({
  section: jobSectionStateSchema,
  findings: z.array(findingSchema),
  cursor: z.number().int(),
});

/** One entry of a job's history. */
export const jobHistoryEntrySchema = z.object({
  id: z.number().int(),
  section: z.string().nullable(),
  field: z.string().nullable(),
  action: z.string(),
  oldValue: z.unknown(),
  newValue: z.unknown(),
  reason: z.string().nullable(),
  by: z.object({ id: z.number().int(), name: z.string() }).nullable(),
  at: z.string(),
});
export const jobHistoryResponseSchema = z.object({ entries: z.array(jobHistoryEntrySchema) });
