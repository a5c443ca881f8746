import type { BoardSummary } from '../../../../shared/schemas/boards.ts';

/** A board's state as a word and a padlock (open or shut), never by colour alone. */
export function BoardStateLabel({ state }: { state: BoardSummary['state'] }) {
  const locked = state === 'locked';
  return (
    <span className={`inline-flex items-center gap-1 font-medium ${locked ? 'text-locked' : 'text-ok'}`}>
      <svg aria-hidden="true" viewBox="0 0 16 16" className="size-3.5" fill="none" stroke="currentColor" strokeWidth="1.6">
        <rect x="2.5" y="7" width="11" height="7.5" rx="1.2" fill={locked ? 'currentColor' : 'none'} />
        {locked ? <path d="M5 7V5a3 3 0 0 1 6 0v2" /> : <path d="M5 7V5a3 3 0 0 1 5.8-1.1" />}
      </svg>
      {state}
    </span>
  );
}
