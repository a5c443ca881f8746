import { useEffect, useRef, type KeyboardEvent } from 'react';
import { Link } from 'react-router-dom';
import { ApiError } from '../../../lib/api-client.ts';
import { useReviewQueue } from '../api/get-review-queue.ts';

function formatWhen(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : date.toLocaleString('en-GB', { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' });
}

/**
 * `/review`: the jobs waiting for a reviewer, oldest submission first, each with its open errors,
 * warnings and readings still to do. The first job has the focus; ↑ / ↓ move, Enter opens.
 */
export function ReviewQueuePage() {
  const queue = useReviewQueue();
  const listRef = useRef<HTMLTableSectionElement>(null);
  const hasJobs = (queue.data?.length ?? 0) > 0;

  useEffect(() => {
    if (hasJobs) listRef.current?.querySelector<HTMLAnchorElement>('a')?.focus();
  }, [hasJobs]);

  const onKeyDown = (event: KeyboardEvent<HTMLTableSectionElement>) => {
    if (event.key !== 'ArrowDown' && event.key !== 'ArrowUp') return;
    const links = Array.from(listRef.current?.querySelectorAll<HTMLAnchorElement>('a[data-job]') ?? []);
    const at = links.indexOf(document.activeElement as HTMLAnchorElement);
    const next = Math.max(0, Math.min(links.length - 1, at + (event.key === 'ArrowDown' ? 1 : -1)));
    event.preventDefault();
    links[next]?.focus();
  };

  return (
    <div className="space-y-3 p-4">
      <h1 className="text-lg font-semibold">Waiting for review</h1>
      {queue.isPending && <p className="text-muted">Loading…</p>}
      {queue.isError && (
        <p role="alert" className="text-danger">
          The queue cannot be shown: {queue.error instanceof ApiError ? queue.error.message : String(queue.error)}
        </p>
      )}
      {queue.data && queue.data.length === 0 && <p>No job is waiting for review. A tester submits a job from its job screen.</p>}
      {queue.data && queue.data.length > 0 && (
        <>
          <p className="text-sm text-muted">Oldest first. ↑ / ↓ move, Enter opens the job for review.</p>
          <table className="w-full border-collapse bg-surface text-sm">
            <thead>
              <tr className="border-b border-line text-left">
                <th className="px-2 py-1">Job</th>
                <th className="px-2 py-1">Client and site</th>
                <th className="px-2 py-1">Submitted</th>
                <th className="px-2 py-1">Boards locked</th>
                <th className="px-2 py-1 text-right">Open errors</th>
                <th className="px-2 py-1 text-right">Warnings</th>
                <th className="px-2 py-1 text-right">Readings to do</th>
              </tr>
            </thead>
            <tbody ref={listRef} onKeyDown={onKeyDown}>
              {queue.data.map((entry) => (
                <tr key={entry.job.id} className="border-b border-line align-top">
                  <td className="px-2 py-1">
                    <Link data-job to={`/review/${entry.job.id}`} className="font-medium text-accent underline">
                      {entry.job.kind} {entry.job.reference}
                    </Link>
                  </td>
                  <td className="px-2 py-1">
                    {entry.site.client}
                    <span className="block text-muted">{entry.site.address}</span>
                  </td>
                  <td className="px-2 py-1">
                    {entry.submitted ? (
                      <>
                        {formatWhen(entry.submitted.at)} by {entry.submitted.by?.name ?? 'someone'}
                        {entry.submitted.note && <span className="block text-muted">“{entry.submitted.note}”</span>}
                      </>
                    ) : (
                      '—'
                    )}
                  </td>
                  <td className="px-2 py-1">
                    {entry.lockedBoards} of {entry.boardCount}
                  </td>
                  <td className={`px-2 py-1 text-right ${entry.counts.errors > 0 ? 'font-semibold text-danger' : ''}`}>
                    {entry.counts.errors}
                    {entry.counts.accepted > 0 && <span className="block text-xs font-normal text-muted">{entry.counts.accepted} accepted</span>}
                  </td>
                  <td className="px-2 py-1 text-right">{entry.counts.warnings}</td>
                  <td className="px-2 py-1 text-right">{entry.counts.missingReadings}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      )}
    </div>
  );
}
