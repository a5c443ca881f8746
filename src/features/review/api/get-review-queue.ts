import { queryOptions, useQuery } from '@tanstack/react-query';
import { reviewQueueResponseSchema } from '../../../../shared/schemas/review.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { reviewKeys } from './review-keys.ts';

/** Jobs ready for review, oldest submission first, with their counts of findings. */
export const reviewQueueQueryOptions = () =>
  queryOptions({
    queryKey: reviewKeys.queue(),
    queryFn: async ({ signal }) => (await apiGet('/api/review/queue', reviewQueueResponseSchema, { signal })).jobs,
  });

export function useReviewQueue() {
  return useQuery(reviewQueueQueryOptions());
}
