import { queryOptions, useQuery } from '@tanstack/react-query';
import { jobMailResponseSchema, type JobMail } from '../../../../shared/schemas/mail.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { mailKeys } from './mail-keys.ts';

/** `GET /api/jobs/:jobId/mail`: the job's e-mails with their state, and what a new one would use. */
export async function getJobMail(jobId: number, signal?: AbortSignal): Promise<JobMail> {
  return apiGet(`/api/jobs/${jobId}/mail`, jobMailResponseSchema, { signal });
}

const inProgress = (data: JobMail | undefined) => data?.mail.some((m) => m.state === 'waiting' || m.state === 'sending') ?? false;

/** Asks again every second while an e-mail is on its way, so its progress shows without a reload. */
export const jobMailQueryOptions = (jobId: number) =>
  queryOptions({
    queryKey: mailKeys.job(jobId),
    queryFn: ({ signal }) => getJobMail(jobId, signal),
    refetchInterval: (query) => (inProgress(query.state.data) ? 1000 : false),
  });

export function useJobMail(jobId: number) {
  return useQuery(jobMailQueryOptions(jobId));
}
