import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { jobDetailResponseSchema, type JobDetail } from '../../../../shared/schemas/jobs.ts';
import { blankSection, jobSectionKeys, jobSectionSchemas, type JobRecord, type JobSectionKey, type JobSectionState } from '../../../../shared/schemas/job-record.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { jobRecordKeys } from './job-record-keys.ts';

/**
 * A section as served, made whole: an object section gets every field (a blank one for any the
 * server has not stored yet), so the screen can always read `data.field`.
 */
export function normaliseSection<K extends JobSectionKey>(key: K, state: { data: unknown; version: number }): JobSectionState<K> {
  const blank = blankSection(key);
  const raw = state.data && typeof state.data === 'object' ? (state.data as Record<string, unknown>) : {};
  // Record sections (inspections, observations) are keyed by item; an absent key is simply blank.
  const merged = jobSectionSchemas[key] instanceof z.ZodRecord ? raw : { ...(blank as object), ...raw };
  return { data: merged as JobSectionState<K>['data'], version: state.version };
}

export async function getJob(jobId: number, signal?: AbortSignal): Promise<JobDetail> {
  const detail = await apiGet(`/api/jobs/${jobId}`, jobDetailResponseSchema, { signal });
  const record = Object.fromEntries(jobSectionKeys.map((key) => [key, normaliseSection(key, detail.record[key])])) as JobRecord;
  return { ...detail, record };
}

/**
 * The job with its site, boards, record and findings. Kept current by the screen's own writes
 * (`setQueryData` with each section the server answers); refetched when the list of jobs changes.
 */
export const jobDetailQueryOptions = (jobId: number) =>
  queryOptions({
    queryKey: jobRecordKeys.detail(jobId),
    queryFn: ({ signal }) => getJob(jobId, signal),
  });

/**
 * How often the job screen asks for the job again while the page is visible, so a second
 * person's record changes and the job's state (submitted, approved, issued) show within seconds.
 */
export const JOB_REFRESH_MS = 4000;

/**
 * `select` may lift the record to what the screen's own writes already know (see
 * RecordSaver.withLatest). `refreshEveryMs` polls while the page is visible (TanStack Query
 * pauses an interval while the document is hidden, as `refetchIntervalInBackground` is off);
 * `false` turns it off. A poll never overwrites a field being typed in: each field keeps the
 * person's draft until it is saved (record-fields.tsx).
 */
export function useJobDetail(jobId: number, select?: (detail: JobDetail) => JobDetail, refreshEveryMs: number | false = JOB_REFRESH_MS) {
  return useQuery({ ...jobDetailQueryOptions(jobId), select, refetchInterval: refreshEveryMs, refetchIntervalInBackground: false });
}
