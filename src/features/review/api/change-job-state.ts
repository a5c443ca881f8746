import { useMutation, useQueryClient } from '@tanstack/react-query';
import { jobStateResponseSchema } from '../../../../shared/schemas/review.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { reviewKeys } from './review-keys.ts';

export type JobStateChange =
  | { action: 'submit'; note: string }
  | { action: 'approve'; note: string }
  | { action: 'send-back'; reason: string };

/**
 * Moves a job to its next state. A refused approval answers 409 with `details.reasons` (the gate);
 * the ApiError carries them for the screen to list.
 */
export async function changeJobState(jobId: number, change: JobStateChange) {
  const { action, ...body } = change;
  return (await apiRequest('POST', `/api/jobs/${jobId}/${action}`, jobStateResponseSchema, body)).job;
}

/** Changes a job's state; afterwards everything about jobs is fetched again (`['jobs']`). */
export function useChangeJobState(jobId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (change: JobStateChange) => changeJobState(jobId, change),
    onSettled: () => queryClient.invalidateQueries({ queryKey: reviewKeys.all }),
  });
}
