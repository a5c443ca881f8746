import { queryOptions, useQuery } from '@tanstack/react-query';
import { jobSignaturesResponseSchema, type JobSignatures } from '../../../../shared/schemas/signatures.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { signaturesKeys } from './signatures-keys.ts';

/** `GET /api/jobs/:jobId/signatures`: every signature (newest first), the job's kind, state and signing roles. */
export async function getSignatures(jobId: number, signal?: AbortSignal): Promise<JobSignatures> {
  return apiGet(`/api/jobs/${jobId}/signatures`, jobSignaturesResponseSchema, { signal });
}

export const signaturesQueryOptions = (jobId: number) =>
  queryOptions({ queryKey: signaturesKeys.job(jobId), queryFn: ({ signal }) => getSignatures(jobId, signal) });

export function useSignatures(jobId: number) {
  return useQuery(signaturesQueryOptions(jobId));
}
