/**
 * Query keys of the review feature. Everything about jobs lives under `['jobs']` (see
 * src/features/jobs/api/jobs-keys.ts), so one invalidation of `['jobs']` after any change to a job
 * refreshes the job screen, the jobs list, the queue and the gate together.
 */
export const reviewKeys = {
  all: ['jobs'] as const,
  queue: () => [...reviewKeys.all, 'review-queue'] as const,
  job: (jobId: number) => [...reviewKeys.all, 'review', jobId] as const,
  gate: (jobId: number) => [...reviewKeys.all, 'gate', jobId] as const,
};
