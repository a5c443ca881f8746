import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { acceptanceResponseSchema, type AcceptFindingBody } from '../../../../shared/schemas/review.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { reviewKeys } from './review-keys.ts';

export async function acceptFinding(jobId: number, body: AcceptFindingBody) {
  return (await apiRequest('POST', `/api/jobs/${jobId}/acceptances`, acceptanceResponseSchema, body)).acceptance;
}

export async function withdrawAcceptance(jobId: number, acceptanceId: number) {
  await apiRequest('DELETE', `/api/jobs/${jobId}/acceptances/${acceptanceId}`, z.undefined());
}

/** Accepts an error finding with a written reason (reviewers and admins). */
export function useAcceptFinding(jobId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: AcceptFindingBody) => acceptFinding(jobId, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: reviewKeys.all }),
  });
}

/** Withdraws an acceptance: the finding is open again. */
export function useWithdrawAcceptance(jobId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (acceptanceId: number) => withdrawAcceptance(jobId, acceptanceId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: reviewKeys.all }),
  });
}
