import { queryOptions, useQuery } from '@tanstack/react-query';
import { boardListResponseSchema, type BoardSummary } from '../../../../shared/schemas/boards.ts';
import { jobListResponseSchema, siteListResponseSchema, type Job, type Site } from '../../../../shared/schemas/sites.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { jobsKeys, type JobListFilters } from './jobs-keys.ts';

/** A job with its boards, in the server's order (board reference). */
export interface JobWithBoards {
  job: Job;
  boards: BoardSummary[];
}

/** A site with its jobs, newest visit first. */
export interface SiteWithJobs {
  site: Site;
  jobs: JobWithBoards[];
}

/**
 * Sites, their jobs and each job's boards as one tree. The three lists come from three endpoints
 * fetched side by side; a job with no board yet and a site with no job yet still appear.
 */
export async function getJobs(filters: JobListFilters, signal?: AbortSignal): Promise<SiteWithJobs[]> {
  const jobsUrl = filters.siteId === undefined ? '/api/jobs' : `/api/jobs?siteId=${encodeURIComponent(filters.siteId)}`;
  const [{ sites }, { jobs }, { boards }] = await Promise.all([
    apiGet('/api/sites', siteListResponseSchema, { signal }),
    apiGet(jobsUrl, jobListResponseSchema, { signal }),
    apiGet('/api/boards', boardListResponseSchema, { signal }),
  ]);
  return buildSiteTree(sites, jobs, boards, filters);
}

/** Groups jobs under their sites and boards under their jobs, keeping each list's own order. */
export function buildSiteTree(sites: Site[], jobs: Job[], boards: BoardSummary[], filters: JobListFilters = {}): SiteWithJobs[] {
  const boardsByJob = new Map<number, BoardSummary[]>();
  for (const board of boards) {
    const list = boardsByJob.get(board.job.id);
    if (list) list.push(board);
    else boardsByJob.set(board.job.id, [board]);
  }
  const jobsBySite = new Map<number, JobWithBoards[]>();
  for (const job of jobs) {
    const entry = { job, boards: boardsByJob.get(job.id) ?? [] };
    const list = jobsBySite.get(job.siteId);
    if (list) list.push(entry);
    else jobsBySite.set(job.siteId, [entry]);
  }
  return sites
    .filter((site) => filters.siteId === undefined || site.id === filters.siteId)
    .map((site) => ({ site, jobs: jobsBySite.get(site.id) ?? [] }));
}

export const jobListQueryOptions = (filters: JobListFilters = {}) =>
  queryOptions({
    queryKey: jobsKeys.list(filters),
    queryFn: ({ signal }) => getJobs(filters, signal),
  });

export function useJobs(filters: JobListFilters = {}) {
  return useQuery(jobListQueryOptions(filters));
}
