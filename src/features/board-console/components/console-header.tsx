import { memo } from 'react';
import type { BoardDetail } from '../../../../shared/schemas/boards.ts';
import type { SaveStatus } from '../sync/types.ts';
import { describeSaveStatus, saveToneClass } from './save-status.ts';

export interface ConsoleHeaderProps {
  board: BoardDetail['board'];
  site: BoardDetail['site'];
  job: BoardDetail['job'];
  present: ReadonlyArray<{ id: number; name: string }>;
  status: SaveStatus;
}

function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="flex min-w-0 items-baseline gap-1">
      <dt className="text-xs text-muted">{label}</dt>
      <dd className="truncate font-medium">{children}</dd>
    </div>
  );
}

/** The board's own details, its state, who else is on it, and whether everything is saved. */
export const ConsoleHeader = memo(function ConsoleHeader({ board, site, job, present, status }: ConsoleHeaderProps) {
  const save = describeSaveStatus(status);
  const locked = board.state === 'locked';
  return (
    <header className="shrink-0 border-b border-line bg-surface px-3 py-1.5">
      <div className="flex flex-wrap items-baseline gap-x-3 gap-y-0.5">
        <h1 className="text-base font-semibold">
          Board <span className="font-mono">{board.reference}</span>
        </h1>
        <span className="truncate text-muted">
          {site.client} · {site.address} ·{' '}
          {/* A plain link: the header is also rendered outside a router (console tests). */}
          <a href={`/jobs/${job.id}`} className="text-accent underline-offset-2 hover:underline" aria-label={`Job ${job.kind} ${job.reference}: the certificate or report`}>
            {job.kind} {job.reference}
          </a>
        </span>
        <span
          className={`rounded px-1.5 py-px text-xs font-semibold ${locked ? 'bg-locked-soft text-locked' : 'bg-ok-soft text-ok'}`}
          aria-label={locked ? `Locked${board.lockedBy ? ` by ${board.lockedBy.name}` : ''}` : 'Open for entry'}
        >
          <span aria-hidden="true">{locked ? '▣ ' : '✎ '}</span>
          {locked ? `Locked${board.lockedBy ? ` by ${board.lockedBy.name}` : ''}${board.lockedAt ? ` on ${new Date(board.lockedAt).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })}` : ''}` : 'Open'}
        </span>
        <span className="ml-auto flex items-baseline gap-3">
          <span className={present.length === 0 ? 'text-muted' : 'font-medium'}>
            <span aria-hidden="true">{present.length === 0 ? '○ ' : '● '}</span>
            {present.length === 0 ? 'nobody else on this board' : `also on this board: ${present.map((p) => p.name).join(', ')}`}
          </span>
          <span className={saveToneClass[save.tone]}>
            <span aria-hidden="true">{save.symbol} </span>
            {save.text}
          </span>
        </span>
      </div>
      <dl className="mt-0.5 flex flex-wrap gap-x-4 gap-y-0.5 font-mono text-[13px]">
        <Fact label="Zdb">{board.zdbOhm === null ? '—' : `${board.zdbOhm} Ω`}</Fact>
        <Fact label="Ipf">{board.ipfKa === null ? '—' : `${board.ipfKa} kA`}</Fact>
        <Fact label="Phases">{board.phases === 3 ? 'three' : 'single'}</Fact>
        <Fact label="Earthing">{site.earthing}</Fact>
        <Fact label="Location">{board.location || '—'}</Fact>
        <Fact label="Instruments">{board.instruments || '—'}</Fact>
      </dl>
    </header>
  );
});
