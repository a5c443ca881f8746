import { queryOptions, useQuery } from '@tanstack/react-query';
import { jobIssueListResponseSchema } from '../../../../shared/schemas/issues.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { issueKeys } from './issue-keys.ts';

/** The job's state and its issued revisions, newest first. */
export const jobIssuesQueryOptions = (jobId: number) =>
  queryOptions({
    queryKey: issueKeys.list(jobId),
    queryFn: ({ signal }) => apiGet(`/api/jobs/${jobId}/issues`, jobIssueListResponseSchema, { signal }),
  });

export function useJobIssues(jobId: number) {
  return useQuery(jobIssuesQueryOptions(jobId));
}
