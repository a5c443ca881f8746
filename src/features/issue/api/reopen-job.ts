import { useMutation, useQueryClient } from '@tanstack/react-query';
import { reopenJobResponseSchema, type ReopenJobBody } from '../../../../shared/schemas/issues.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { issueKeys } from './issue-keys.ts';

/** Sends an issued job back to being entered, with the reason; the issued revisions stay as they are. */
export function reopenJob(jobId: number, body: ReopenJobBody) {
  return apiRequest('POST', `/api/jobs/${jobId}/reopen`, reopenJobResponseSchema, body);
}

export function useReopenJob(jobId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ReopenJobBody) => reopenJob(jobId, body),
    onSettled: () => queryClient.invalidateQueries({ queryKey: issueKeys.all }),
  });
}
