import { useMutation, useQueryClient } from '@tanstack/react-query';
import { jobResponseSchema, type Job, type UpdateJobBody } from '../../../../shared/schemas/sites.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { jobsKeys } from './jobs-keys.ts';

/** `PATCH /api/jobs/:jobId`: reference and visit dates, with the job's version as last seen. */
export async function updateJob({ jobId, body }: { jobId: number; body: UpdateJobBody }): Promise<Job> {
  return (await apiRequest('PATCH', `/api/jobs/${jobId}`, jobResponseSchema, body)).job;
}

export function useUpdateJob() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateJob,
    onSettled: () => queryClient.invalidateQueries({ queryKey: jobsKeys.all }),
  });
}
