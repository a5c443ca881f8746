/**
 * The jobs page's commands: the palette and the keys are built from this list (src/lib/commands).
 * The keys carry Alt+Shift so they work while the cursor is in the search box, which has it from
 * the start; the same keys mean the same on the job screen ("new board" is Alt+Shift+B on both).
 */
import type { BoardSummary } from '../../../shared/schemas/boards.ts';
import type { Command } from '../../lib/commands/types.ts';
import type { SiteWithJobs } from './api/get-jobs.ts';

/** Which form is open over the jobs page. */
export type JobsForm =
  | { kind: 'new-site' }
  | { kind: 'edit-site'; siteId: number }
  | { kind: 'new-job'; siteId?: number }
  | { kind: 'new-board'; jobId?: number };

export interface JobsContext {
  /** false until the sites and jobs have been loaded. */
  loaded: boolean;
  tree: readonly SiteWithJobs[];
  /** What the search leaves shown. */
  shown: readonly SiteWithJobs[];
  activeBoard: BoardSummary | null;
  openForm(form: JobsForm): void;
  openJob(jobId: number): void;
}

export const NEW_SITE_KEY = 'Alt+Shift+KeyS';
export const NEW_JOB_KEY = 'Alt+Shift+KeyJ';
export const NEW_BOARD_KEY = 'Alt+Shift+KeyB';
export const EDIT_SITE_KEY = 'Alt+Shift+KeyE';
export const OPEN_JOB_KEY = 'Alt+Shift+KeyG';

/** The site the person is looking at: the chosen board's, or the only one the search leaves. */
function siteInView(ctx: JobsContext): number | undefined {
  if (ctx.activeBoard) return ctx.activeBoard.site.id;
  return ctx.shown.length === 1 ? ctx.shown[0]!.site.id : undefined;
}

/** The job the person is looking at: the chosen board's, or the only one the search leaves. */
function jobInView(ctx: JobsContext): number | undefined {
  if (ctx.activeBoard) return ctx.activeBoard.job.id;
  const jobs = ctx.shown.flatMap((entry) => entry.jobs);
  return jobs.length === 1 ? jobs[0]!.job.id : undefined;
}

const STILL_LOADING = 'The sites and jobs are still loading';
const hasSite = (ctx: JobsContext) => (!ctx.loaded ? STILL_LOADING : ctx.tree.length > 0 ? true : 'There is no site yet: add one first');
const hasJob = (ctx: JobsContext) =>
  !ctx.loaded ? STILL_LOADING : ctx.tree.some((entry) => entry.jobs.length > 0) ? true : 'There is no job yet: start one first';

/** `getCtx` is read when the palette asks for a choice's options (the lists change as people work). */
export function createJobsCommands(getCtx: () => JobsContext | null): Command<JobsContext>[] {
  const siteChoices = () => (getCtx()?.tree ?? []).map(({ site }) => ({ value: String(site.id), label: `${site.client} — ${site.address}` }));
  const jobChoices = () =>
    (getCtx()?.tree ?? []).flatMap(({ site, jobs }) =>
      jobs.map(({ job }) => ({ value: String(job.id), label: `${job.kind} ${job.reference} — ${site.client}, ${job.visitDate}` })),
    );
  return [
    {
      id: 'jobs.new-site',
      label: 'New site',
      group: 'Jobs',
      keywords: ['add', 'client', 'installation', 'address', 'create'],
      shortcut: NEW_SITE_KEY,
      run: (ctx) => ctx.openForm({ kind: 'new-site' }),
    },
    {
      id: 'jobs.new-job',
      label: 'New job',
      group: 'Jobs',
      keywords: ['add', 'start', 'EIC', 'EICR', 'certificate', 'report', 'visit', 'create'],
      shortcut: NEW_JOB_KEY,
      when: hasSite,
      run: (ctx) => ctx.openForm({ kind: 'new-job', siteId: siteInView(ctx) }),
    },
    {
      id: 'jobs.new-board',
      label: 'New board',
      group: 'Jobs',
      keywords: ['add', 'distribution', 'consumer unit', 'ways', 'copy', 'create'],
      shortcut: NEW_BOARD_KEY,
      when: hasJob,
      run: (ctx) => ctx.openForm({ kind: 'new-board', jobId: jobInView(ctx) }),
    },
    {
      id: 'jobs.edit-site',
      label: 'Edit a site',
      group: 'Jobs',
      keywords: ['change', 'client', 'address', 'contact', 'e-mail', 'earthing'],
      shortcut: EDIT_SITE_KEY,
      when: hasSite,
      params: [
        {
          name: 'siteId',
          label: 'Which site?',
          kind: 'choice',
          required: true,
          options: siteChoices,
        },
      ],
      run: (ctx, args) => ctx.openForm({ kind: 'edit-site', siteId: Number(args.siteId) }),
    },
    {
      id: 'jobs.open-job',
      label: 'Go to a job',
      group: 'Jobs',
      keywords: ['open', 'job screen', 'certificate', 'report', 'record'],
      shortcut: OPEN_JOB_KEY,
      when: hasJob,
      params: [{ name: 'jobId', label: 'Which job?', kind: 'choice', required: true, options: jobChoices }],
      run: (ctx, args) => ctx.openJob(Number(args.jobId)),
    },
  ];
}
