import { queryOptions, useQuery } from '@tanstack/react-query';
import { jobPhotosResponseSchema, type JobPhotos } from '../../../../shared/schemas/job-photos.ts';
import { apiGet } from '../../../lib/api-client.ts';

/**
 * Query keys of the photos-on-job feature: under the job's detail key, so invalidating `['jobs']`
 * after any change (a photo attached in the console, a choice made here) refreshes them.
 */
export const jobPhotoKeys = {
  job: (jobId: number) => ['jobs', 'detail', jobId, 'photos'] as const,
};

/** `GET /api/jobs/:jobId/photos`: the job's photos of the paper notes, by board. */
export async function getJobPhotos(jobId: number, signal?: AbortSignal): Promise<JobPhotos> {
  return apiGet(`/api/jobs/${jobId}/photos`, jobPhotosResponseSchema, { signal });
}

export const jobPhotosQueryOptions = (jobId: number) =>
  queryOptions({ queryKey: jobPhotoKeys.job(jobId), queryFn: ({ signal }) => getJobPhotos(jobId, signal) });

export function useJobPhotos(jobId: number) {
  return useQuery(jobPhotosQueryOptions(jobId));
}
