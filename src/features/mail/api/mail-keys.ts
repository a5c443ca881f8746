/**
 * Query keys of the mail feature. A job's e-mails live under the job's detail key (everything
 * about jobs is under `['jobs']`), so invalidating `['jobs']` after any change refreshes them;
 * the local mailbox is the admin's own list.
 */
export const mailKeys = {
  job: (jobId: number) => ['jobs', 'detail', jobId, 'mail'] as const,
  mailbox: () => ['mailbox'] as const,
};
