import { writeJobSectionResponseSchema } from '../../../../shared/schemas/jobs.ts';
import type { JobSectionKey, WriteJobSectionBody } from '../../../../shared/schemas/job-record.ts';
import { apiRequest } from '../../../lib/api-client.ts';

/**
 * `PUT /api/jobs/:jobId/record/:section`: the fields that change, with the section's version as
 * last seen. Answers the section as it now stands and the job's findings. 409 (a field sent was
 * changed by someone else since; `error.details` holds the current section), 423 (the job is
 * approved or issued) and 400 (issues by field) arrive as ApiError.
 */
export function writeSection(jobId: number, section: JobSectionKey, body: WriteJobSectionBody) {
  return apiRequest('PUT', `/api/jobs/${jobId}/record/${section}`, writeJobSectionResponseSchema, body);
}
