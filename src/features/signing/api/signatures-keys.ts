/** A job's signatures live under the job's detail key, so invalidating `['jobs']` refreshes them. */
export const signaturesKeys = {
  job: (jobId: number) => ['jobs', 'detail', jobId, 'signatures'] as const,
};
