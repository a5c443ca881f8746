/**
 * Query keys of the job screen. Everything about jobs lives under `['jobs']` (the jobs list's
 * prefix too), so invalidating `['jobs']` after any change refreshes lists and job screens alike.
 */
export const jobRecordKeys = {
  all: ['jobs'] as const,
  detail: (jobId: number) => [...jobRecordKeys.all, 'detail', jobId] as const,
  history: (jobId: number) => [...jobRecordKeys.all, 'history', jobId] as const,
  /** A board's circuits as the observation form offers them. */
  boardCircuits: (boardId: number) => [...jobRecordKeys.all, 'board-circuits', boardId] as const,
};
