import { useMutation, useQueryClient } from '@tanstack/react-query';
import { jobResponseSchema, type CreateJobBody, type Job } from '../../../../shared/schemas/sites.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { jobsKeys } from './jobs-keys.ts';

/**
 * `POST /api/jobs`: a new job on a site. A blank reference is made by the server from the
 * company's pattern; `startFromJobId` copies an earlier job's boards and circuit details.
 */
export async function createJob(body: CreateJobBody): Promise<Job> {
  return (await apiRequest('POST', '/api/jobs', jobResponseSchema, body)).job;
}

export function useCreateJob() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createJob,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: jobsKeys.all }),
  });
}
