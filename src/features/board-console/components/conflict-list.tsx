import { columnByKey, isDetailKey, isReadingKey } from '../../../../shared/schemas/columns.ts';
import type { Conflict } from '../sync/types.ts';

export interface ConflictListProps {
  conflicts: readonly Conflict[];
  circuitNumbers: ReadonlyMap<number, string>;
  onResolve: (conflict: Conflict, choice: 'keep-theirs' | 'overwrite') => void;
  onShow: (conflict: Conflict) => void;
}

function columnLabel(column: string): string {
  return isReadingKey(column) || isDetailKey(column) ? columnByKey[column].label : column;
}

/**
 * Cells where someone else wrote first: both values, and the two choices as buttons (reachable
 * with Tab, and from the palette for the active cell). Nothing is overwritten until the typist chooses.
 */
export function ConflictList({ conflicts, circuitNumbers, onResolve, onShow }: ConflictListProps) {
  if (conflicts.length === 0) return null;
  return (
    <section aria-label="Conflicts to settle" className="shrink-0 border-t-2 border-locked bg-locked-soft px-3 py-1 text-sm">
      <h2 className="font-semibold text-locked">
        <span aria-hidden="true">⇄ </span>
        {conflicts.length === 1 ? 'One cell was changed by someone else while you typed' : `${conflicts.length} cells were changed by someone else while you typed`}
      </h2>
      <ul className="max-h-28 overflow-auto">
        {conflicts.map((conflict) => {
          const where = `Circuit ${circuitNumbers.get(conflict.circuitId) ?? '?'} · ${columnLabel(conflict.column)}`;
          return (
            <li key={conflict.editId} className="flex flex-wrap items-center gap-x-3 gap-y-0.5 py-0.5">
              <button type="button" onClick={() => onShow(conflict)} className="font-medium underline underline-offset-2">
                {where}
              </button>
              <span>
                {conflict.theirsBy ?? 'Someone'} wrote <span className="font-mono font-semibold">“{conflict.theirs}”</span>; you wrote{' '}
                <span className="font-mono font-semibold">“{conflict.mine}”</span>
              </span>
              <span className="flex gap-1">
                <button
                  type="button"
                  onClick={() => onResolve(conflict, 'keep-theirs')}
                  aria-label={`${where}: keep their value ${conflict.theirs}`}
                  className="rounded border border-line-strong bg-surface px-2 py-px hover:bg-accent-soft"
                >
                  Keep theirs
                </button>
                <button
                  type="button"
                  onClick={() => onResolve(conflict, 'overwrite')}
                  aria-label={`${where}: write my value ${conflict.mine}`}
                  className="rounded border border-line-strong bg-surface px-2 py-px hover:bg-accent-soft"
                >
                  Write mine
                </button>
              </span>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
