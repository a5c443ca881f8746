import { queryOptions, useQuery } from '@tanstack/react-query';
import { reviewJobResponseSchema } from '../../../../shared/schemas/review.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { reviewKeys } from './review-keys.ts';

/** One job under review: its boards with every finding (accepted ones marked), its record and its gate. */
export const reviewJobQueryOptions = (jobId: number) =>
  queryOptions({
    queryKey: reviewKeys.job(jobId),
    queryFn: ({ signal }) => apiGet(`/api/review/jobs/${jobId}`, reviewJobResponseSchema, { signal }),
  });

export function useReviewJob(jobId: number) {
  return useQuery(reviewJobQueryOptions(jobId));
}
