import { memo, useMemo, useRef, useState, type KeyboardEvent, type RefObject } from 'react';
import { columnByKey, columns, isDetailKey, isReadingKey } from '../../../../shared/schemas/columns.ts';
import type { Finding, Severity } from '../../../../shared/schemas/findings.ts';
import { severitySymbol, severityWord, sortFindings, toDoByColumn, valueSeverities } from '../grid/findings-index.ts';
import { severityBadgeClass } from './board-grid.tsx';

export interface FindingsPanelProps {
  findings: readonly Finding[];
  /** Circuit ids in board order, and their numbers. */
  circuitOrder: readonly number[];
  circuitNumbers: ReadonlyMap<number, string>;
  /** Jump to the finding's cell and give the focus back to the grid. */
  onJump: (finding: Finding) => void;
  listRef: RefObject<HTMLUListElement | null>;
  /** A narrower panel, for a laptop screen (the grid gets the width back). */
  narrow?: boolean;
}

function columnWords(finding: Finding): string {
  const labels = finding.columns.filter((c) => isReadingKey(c) || isDetailKey(c)).map((c) => columnByKey[c as keyof typeof columnByKey].label);
  return labels.join(', ');
}

const columnOrder: readonly string[] = columns.map((c) => c.key);

function columnLabel(key: string): string {
  return isReadingKey(key) || isDetailKey(key) ? columnByKey[key].label : 'Circuit';
}

/**
 * Every finding of the checker beside the grid: the findings about values first, worst first and
 * filterable by severity; then the readings not yet recorded, as a count per column (a board being
 * typed has hundreds of them, and listing each would bury the faults). Each finding and each count
 * is a button: Enter (or a click) puts the cursor on its cell (for a count, the first circuit
 * lacking that reading) and the focus back in the grid. ↑/↓ move between them.
 */
export const FindingsPanel = memo(function FindingsPanel({ findings, circuitOrder, circuitNumbers, onJump, listRef, narrow = false }: FindingsPanelProps) {
  const [shown, setShown] = useState<ReadonlySet<Severity>>(() => new Set(valueSeverities));
  const counts = useMemo(() => {
    const c: Record<Severity, number> = { error: 0, warning: 0, note: 0, todo: 0 };
    for (const f of findings) c[f.severity] += 1;
    return c;
  }, [findings]);
  const sorted = useMemo(() => sortFindings(findings, circuitOrder), [findings, circuitOrder]);
  const toDo = useMemo(() => toDoByColumn(findings, circuitOrder, columnOrder), [findings, circuitOrder]);
  const toDoCells = useMemo(() => toDo.reduce((sum, c) => sum + c.count, 0), [toDo]);
  const visible = sorted.filter((f) => f.severity !== 'todo' && shown.has(f.severity));
  const valueCount = findings.length - counts.todo;
  const headingId = useRef(`findings-heading`).current;

  const toggle = (severity: Severity) =>
    setShown((current) => {
      const next = new Set(current);
      if (next.has(severity)) next.delete(severity);
      else next.add(severity);
      return next;
    });

  const onListKeyDown = (event: KeyboardEvent<HTMLUListElement>) => {
    if (event.key !== 'ArrowDown' && event.key !== 'ArrowUp' && event.key !== 'Home' && event.key !== 'End') return;
    const buttons = Array.from(listRef.current?.querySelectorAll<HTMLButtonElement>('button[data-finding]') ?? []);
    if (buttons.length === 0) return;
    event.preventDefault();
    const at = buttons.indexOf(document.activeElement as HTMLButtonElement);
    const next =
      event.key === 'Home' ? 0 : event.key === 'End' ? buttons.length - 1 : Math.max(0, Math.min(buttons.length - 1, at + (event.key === 'ArrowDown' ? 1 : -1)));
    buttons[next]?.focus();
  };

  return (
    <section aria-labelledby={headingId} className={`flex min-h-0 ${narrow ? 'w-56' : 'w-80'} shrink-0 flex-col border-l border-line bg-surface`}>
      <div className="border-b border-line px-2 py-1.5">
        <h2 id={headingId} className="text-sm font-semibold">
          Findings <span className="font-normal text-muted">({valueCount}{toDoCells > 0 ? ` · ${toDoCells} readings to do` : ''})</span>
        </h2>
        <div role="group" aria-label="Show findings of severity" className="mt-1 flex gap-1">
          {valueSeverities.map((severity) => (
            <button
              key={severity}
              type="button"
              aria-pressed={shown.has(severity)}
              onClick={() => toggle(severity)}
              className="flex items-center gap-1 rounded border border-line-strong px-1.5 py-px text-xs aria-pressed:bg-accent-soft aria-[pressed=false]:text-muted aria-[pressed=false]:line-through"
            >
              <span aria-hidden="true" className={`inline-flex h-3.5 min-w-3.5 items-center justify-center rounded px-0.5 text-[10px] font-bold ${severityBadgeClass[severity]}`}>
                {severitySymbol[severity]}
              </span>
              {severityWord[severity]}s {counts[severity]}
            </button>
          ))}
        </div>
      </div>
      {visible.length === 0 && toDo.length === 0 ? (
        <p className="px-2 py-3 text-sm text-muted">{valueCount === 0 ? 'No findings: every value checked is within its limit.' : 'No finding of the severities shown.'}</p>
      ) : (
        <ul ref={listRef} aria-label="Findings" onKeyDown={onListKeyDown} className="min-h-0 flex-1 overflow-auto">
          {visible.length === 0 && (
            <li className="border-b border-line px-2 py-2 text-sm text-muted">
              {valueCount === 0 ? 'No fault in the values typed so far.' : 'No finding of the severities shown.'}
            </li>
          )}
          {visible.map((finding) => {
            const number = finding.circuitId === null ? null : circuitNumbers.get(finding.circuitId);
            const where = number ? `Circuit ${number}${finding.columns.length ? ` · ${columnWords(finding)}` : ''}` : 'Whole board';
            return (
              <li key={`${finding.code}:${finding.circuitId ?? 'board'}:${finding.columns.join(',')}:${finding.message}`} className="border-b border-line">
                <button
                  type="button"
                  data-finding=""
                  disabled={finding.circuitId === null}
                  onClick={() => onJump(finding)}
                  className="flex w-full gap-2 px-2 py-1 text-left text-sm hover:bg-accent-soft focus:bg-accent-soft focus:outline-none disabled:cursor-default"
                >
                  <span aria-hidden="true" className={`mt-0.5 inline-flex h-4 min-w-4 shrink-0 items-center justify-center rounded px-0.5 text-[11px] font-bold ${severityBadgeClass[finding.severity]}`}>
                    {severitySymbol[finding.severity]}
                  </span>
                  <span className="min-w-0">
                    <span className="block font-medium">
                      <span className="sr-only">{severityWord[finding.severity]}: </span>
                      {where}
                    </span>
                    <span className="block">{finding.message}</span>
                    {(finding.limit || finding.source) && (
                      <span className="block text-xs text-muted">
                        {finding.limit ? `Limit ${finding.limit}` : ''}
                        {finding.limit && finding.source ? ' · ' : ''}
                        {finding.source ?? ''}
                      </span>
                    )}
                  </span>
                </button>
              </li>
            );
          })}
          {toDo.length > 0 && (
            <li aria-label="Readings not recorded yet" className="border-b border-line">
              <h3 className="px-2 pt-2 pb-1 text-xs font-semibold text-muted">
                <span aria-hidden="true" className={`mr-1 inline-flex h-3.5 min-w-3.5 items-center justify-center rounded px-0.5 text-[10px] font-bold ${severityBadgeClass.todo}`}>
                  {severitySymbol.todo}
                </span>
                Not recorded yet ({toDoCells})
              </h3>
              <ul className="pb-1">
                {toDo.map((entry) => (
                  <li key={entry.column}>
                    <button
                      type="button"
                      data-finding=""
                      onClick={() => onJump({ ...entry.first, columns: entry.column ? [entry.column] : [] })}
                      className="flex w-full justify-between gap-2 px-2 py-0.5 text-left text-sm hover:bg-accent-soft focus:bg-accent-soft focus:outline-none"
                    >
                      <span>{columnLabel(entry.column)}</span>
                      <span className="text-muted">
                        {entry.count} {entry.count === 1 ? 'circuit' : 'circuits'}
                        <span className="sr-only"> still to record; go to the first</span>
                      </span>
                    </button>
                  </li>
                ))}
              </ul>
            </li>
          )}
        </ul>
      )}
    </section>
  );
});
