import { queryOptions, useQuery } from '@tanstack/react-query';
import { jobGateResponseSchema } from '../../../../shared/schemas/review.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { reviewKeys } from './review-keys.ts';

/** The job's state, why it cannot be approved yet, and each board's reasons it cannot be locked. */
export const jobGateQueryOptions = (jobId: number) =>
  queryOptions({
    queryKey: reviewKeys.gate(jobId),
    queryFn: ({ signal }) => apiGet(`/api/jobs/${jobId}/gate`, jobGateResponseSchema, { signal }),
  });

export function useJobGate(jobId: number) {
  return useQuery(jobGateQueryOptions(jobId));
}
