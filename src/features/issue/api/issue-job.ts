import { useMutation, useQueryClient } from '@tanstack/react-query';
import { issueJobResponseSchema } from '../../../../shared/schemas/issues.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { issueKeys } from './issue-keys.ts';

/** Issues an approved job: the server renders, stores and freezes the PDF as the next revision. */
export function issueJob(jobId: number) {
  return apiRequest('POST', `/api/jobs/${jobId}/issue`, issueJobResponseSchema);
}

export function useIssueJob(jobId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => issueJob(jobId),
    onSettled: () => queryClient.invalidateQueries({ queryKey: issueKeys.all }),
  });
}
