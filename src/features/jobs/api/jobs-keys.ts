/** What a jobs list can be narrowed to on the server. */
export interface JobListFilters {
  /** Only this site's jobs and boards. */
  siteId?: number;
}

/**
 * Query keys of the jobs feature, general → specific: invalidating `jobsKeys.all` (or `lists()`)
 * refreshes every jobs list whatever its filters. Everything about jobs lives under `['jobs']`, so
 * one invalidation after any change to a site, job or board refreshes lists and job screens alike.
 */
export const jobsKeys = {
  all: ['jobs'] as const,
  lists: () => [...jobsKeys.all, 'list'] as const,
  list: (filters: JobListFilters) => [...jobsKeys.lists(), filters] as const,
};
