import { memo, useMemo, useRef, useState, type KeyboardEvent, type RefObject } from 'react';
import { columnByKey, isDetailKey, isReadingKey } from '../../../../shared/schemas/columns.ts';
import { severities, type Finding, type Severity } from '../../../../shared/schemas/findings.ts';
import { severitySymbol, severityWord, sortFindings } from '../grid/findings-index.ts';
import { severityBadgeClass } from './board-grid.tsx';

export interface FindingsPanelProps {
  findings: readonly Finding[];
  /** Circuit ids in board order, and their numbers. */
  circuitOrder: readonly number[];
  circuitNumbers: ReadonlyMap<number, string>;
  /** Jump to the finding's cell and give the focus back to the grid. */
  onJump: (finding: Finding) => void;
  listRef: RefObject<HTMLUListElement | null>;
}

function columnWords(finding: Finding): string {
  const labels = finding.columns.filter((c) => isReadingKey(c) || isDetailKey(c)).map((c) => columnByKey[c as keyof typeof columnByKey].label);
  return labels.join(', ');
}

/**
 * Every finding of the checker beside the grid, worst first, filterable by severity. Each finding
 * is a button: Enter (or a click) puts the cursor on its cell and the focus back in the grid.
 * ↑/↓ move between findings.
 */
export const FindingsPanel = memo(function FindingsPanel({ findings, circuitOrder, circuitNumbers, onJump, listRef }: FindingsPanelProps) {
  const [shown, setShown] = useState<ReadonlySet<Severity>>(() => new Set(severities));
  const counts = useMemo(() => {
    const c: Record<Severity, number> = { error: 0, warning: 0, note: 0 };
    for (const f of findings) c[f.severity] += 1;
    return c;
  }, [findings]);
  const sorted = useMemo(() => sortFindings(findings, circuitOrder), [findings, circuitOrder]);
  const visible = sorted.filter((f) => shown.has(f.severity));
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
    <section aria-labelledby={headingId} className="flex min-h-0 w-80 shrink-0 flex-col border-l border-line bg-surface">
      <div className="border-b border-line px-2 py-1.5">
        <h2 id={headingId} className="text-sm font-semibold">
          Findings <span className="font-normal text-muted">({findings.length})</span>
        </h2>
        <div role="group" aria-label="Show findings of severity" className="mt-1 flex gap-1">
          {severities.map((severity) => (
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
      {visible.length === 0 ? (
        <p className="px-2 py-3 text-sm text-muted">{findings.length === 0 ? 'No findings: every value checked is within its limit.' : 'No finding of the severities shown.'}</p>
      ) : (
        <ul ref={listRef} aria-label="Findings" onKeyDown={onListKeyDown} className="min-h-0 flex-1 overflow-auto">
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
        </ul>
      )}
    </section>
  );
});
