import { queryOptions, useQuery } from '@tanstack/react-query';
import { jobHistoryResponseSchema } from '../../../../shared/schemas/jobs.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { jobRecordKeys } from './job-record-keys.ts';

/** `GET /api/jobs/:jobId/history`: every change of the job and its record, oldest first. */
export const jobHistoryQueryOptions = (jobId: number) =>
  queryOptions({
    queryKey: jobRecordKeys.history(jobId),
    queryFn: async ({ signal }) => (await apiGet(`/api/jobs/${jobId}/history`, jobHistoryResponseSchema, { signal })).entries,
  });

/** The job's history, fetched only while it is shown. */
export function useJobHistory(jobId: number, enabled: boolean) {
  return useQuery({ ...jobHistoryQueryOptions(jobId), enabled });
}
