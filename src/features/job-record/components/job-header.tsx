import { Link } from 'react-router-dom';
import { jobStateLabels } from '../../../../shared/schemas/sites.ts';
import { useRecord } from './record-context.tsx';

const kindNames = { EIC: 'Electrical Installation Certificate', EICR: 'Electrical Installation Condition Report' } as const;

function longDate(iso: string): string {
  const date = new Date(`${iso}T00:00:00`);
  return Number.isNaN(date.getTime()) ? iso : date.toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });
}

/** Who, where, what kind, which dates, what state; and the job's boards with a link to each console. */
export function JobHeader() {
  const { detail } = useRecord();
  const { job, site, boards } = detail;
  const kind = job.kind as keyof typeof kindNames;
  return (
    <header className="space-y-3 rounded border border-line bg-surface p-4">
      <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
        <h1 className="text-lg font-semibold">
          <abbr title={kindNames[kind]} className="no-underline">
            {job.kind}
          </abbr>{' '}
          {job.reference}
        </h1>
        <span className="rounded border border-line-strong px-1.5 text-sm" aria-label={`State: ${jobStateLabels[job.state]}`}>
          {jobStateLabels[job.state]}
        </span>
        <span className="text-muted">
          visit {longDate(job.visitDate)}
          {job.visitEndDate && job.visitEndDate !== job.visitDate ? ` to ${longDate(job.visitEndDate)}` : ''}
        </span>
      </div>
      {job.startedFromJobId !== null && (
        <p className="text-sm text-muted">
          Started from{' '}
          <Link to={`/jobs/${job.startedFromJobId}`} className="text-accent underline-offset-2 hover:underline">
            an earlier job on this site
          </Link>
          : its boards and circuit details were copied, readings start empty.
        </p>
      )}
      <p>
        <span className="font-medium">{site.client}</span> · {site.address}
        {site.description && <span className="text-muted"> · {site.description}</span>}
        {site.contactEmail && <span className="text-muted"> · issued to {site.contactName || site.contactEmail}</span>}
      </p>
      <div>
        <h2 className="text-sm font-semibold">Boards</h2>
        {boards.length === 0 ? (
          <p className="text-muted">No boards yet. Add one with “New board” (Alt+Shift+B, or from the palette).</p>
        ) : (
          <table className="w-full max-w-3xl text-sm">
            <caption className="sr-only">Boards of this job</caption>
            <thead>
              <tr className="text-left text-xs text-muted">
                <th scope="col" className="py-1 pr-3 font-medium">Board</th>
                <th scope="col" className="py-1 pr-3 font-medium">Location</th>
                <th scope="col" className="py-1 pr-3 font-medium">State</th>
                <th scope="col" className="py-1 pr-3 text-right font-medium">Circuits</th>
                <th scope="col" className="py-1 font-medium">Readings filled</th>
              </tr>
            </thead>
            <tbody>
              {boards.map((board) => {
                return (
                  <tr key={board.id} className="border-t border-line">
                    <td className="py-1 pr-3">
                      <Link to={`/boards/${board.id}`} className="font-medium text-accent underline-offset-2 hover:underline" aria-label={`Open board ${board.reference} in the console`}>
                        {board.reference}
                      </Link>
                      {board.phases === 3 && <span className="ml-1 text-xs text-muted">3-phase</span>}
                    </td>
                    <td className="py-1 pr-3">{board.location || <span className="text-muted">—</span>}</td>
                    <td className="py-1 pr-3">{board.state === 'locked' ? '🔒 locked' : 'open'}</td>
                    <td className="py-1 pr-3 text-right tabular-nums">{board.circuitCount}</td>
                    <td className="py-1 tabular-nums">
                      {board.readingsDone} / {board.readingsRequired} needed readings
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        )}
      </div>
    </header>
  );
}
