/**
 * Query keys of the issue feature. They live under `['jobs']` like everything about a job, so
 * invalidating `['jobs']` after an issue or a reopening refreshes the job screen and the lists too.
 */
export const issueKeys = {
  all: ['jobs'] as const,
  list: (jobId: number) => [...issueKeys.all, 'issues', jobId] as const,
};
