import { useId, useState, type FormEvent, type KeyboardEvent } from 'react';
import { columnByKey, type ColumnKey } from '../../../../shared/schemas/columns.ts';
import type { ReviewFinding } from '../../../../shared/schemas/review.ts';
import { ApiError } from '../../../lib/api-client.ts';

export const severityBadge: Record<string, { symbol: string; word: string; className: string }> = {
  error: { symbol: '!', word: 'error', className: 'bg-danger text-white' },
  warning: { symbol: '▲', word: 'warning', className: 'bg-amber-500 text-black' },
  note: { symbol: 'i', word: 'note', className: 'bg-accent-soft text-accent' },
  todo: { symbol: '…', word: 'to do', className: 'bg-paper text-muted border border-line-strong' },
};

const columnWords = (columns: readonly string[]) =>
  columns
    .map((c) => columnByKey[c as ColumnKey]?.label)
    .filter((label): label is string => Boolean(label))
    .join(', ');

/** Where a finding points, in words: "Circuit 4 · Zs", "Schedule of inspections · 4.8", "Board". */
export function findingPlace(finding: ReviewFinding): string {
  if (finding.circuitNumber !== null) {
    const columns = columnWords(finding.columns);
    return `Circuit ${finding.circuitNumber}${columns ? ` · ${columns}` : ''}`;
  }
  if (finding.section) return `${finding.section}${finding.field ? ` · ${finding.field}` : ''}`;
  return 'Board';
}

function formatWhen(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : date.toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });
}

export interface FindingItemProps {
  finding: ReviewFinding;
  domId: string;
  selected: boolean;
  /** The accept form is open on this finding. */
  accepting: boolean;
  canAccept: boolean;
  onSelect: () => void;
  onOpenAccept: () => void;
  onCloseAccept: () => void;
  onAccept: (reason: string) => Promise<unknown>;
  onWithdraw: () => void;
}

/**
 * One finding as a reviewer reads it: severity, where, the message, the limit used and its source,
 * and — for an error — either its acceptance (who, when, why) or a way to accept it with a reason.
 */
export function FindingItem(props: FindingItemProps) {
  const { finding, selected, accepting } = props;
  const badge = severityBadge[finding.severity as string] ?? severityBadge.note!;
  const accepted = finding.acceptance;
  return (
    <li
      id={props.domId}
      tabIndex={selected ? 0 : -1}
      aria-selected={selected}
      role="option"
      onFocus={(event) => {
        if (event.target === event.currentTarget && !selected) props.onSelect();
      }}
      onClick={() => !selected && props.onSelect()}
      className={`rounded border px-2 py-1.5 ${selected ? 'border-accent bg-accent-soft' : 'border-line bg-surface'} ${accepted ? 'opacity-90' : ''}`}
    >
      <div className="flex items-start gap-2">
        <span aria-hidden="true" className={`mt-0.5 inline-flex h-4 min-w-4 items-center justify-center rounded px-1 text-[10px] font-bold ${badge.className}`}>
          {badge.symbol}
        </span>
        <div className="min-w-0 flex-1">
          <p>
            <span className="sr-only">{badge.word}: </span>
            <span className="font-medium">{findingPlace(finding)}</span> — {finding.message}
            {accepted && <span className="ml-1 rounded bg-ok-soft px-1 text-xs font-medium text-ok">accepted</span>}
          </p>
          {(finding.limit || finding.source) && (
            <p className="text-xs text-muted">
              {finding.limit && <>Limit {finding.limit}. </>}
              {finding.source && <>Source: {finding.source}.</>}
            </p>
          )}
          {accepted && (
            <p className="mt-0.5 text-sm">
              Accepted by {accepted.acceptedBy.name}, {formatWhen(accepted.acceptedAt)}: “{accepted.reason}”
              {accepted.message !== finding.message && <span className="text-muted"> (when accepted it read: {accepted.message})</span>}
            </p>
          )}
          {selected && !accepted && finding.severity === 'error' && props.canAccept && finding.acceptable === true && !accepting && (
            <button type="button" onClick={props.onOpenAccept} className="mt-1 rounded border border-line-strong px-2 py-0.5 text-sm hover:bg-accent-soft">
              Accept with a reason… <kbd className="text-xs text-muted">a</kbd>
            </button>
          )}
          {selected && accepted && props.canAccept && (
            <button type="button" onClick={props.onWithdraw} className="mt-1 rounded border border-line-strong px-2 py-0.5 text-sm hover:bg-accent-soft">
              Withdraw the acceptance
            </button>
          )}
          {accepting && <AcceptForm onAccept={props.onAccept} onClose={props.onCloseAccept} />}
        </div>
      </div>
    </li>
  );
}

function AcceptForm({ onAccept, onClose }: { onAccept: (reason: string) => Promise<unknown>; onClose: () => void }) {
  const id = useId();
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  async function submit(event: FormEvent) {
    event.preventDefault();
    event.stopPropagation();
    if (pending) return;
    if (reason.trim().length < 10) {
      setError('Say why in words (at least 10 characters), e.g. "recorded as observation 4, C2".');
      return;
    }
    setPending(true);
    setError(null);
    try {
      await onAccept(reason.trim());
    } catch (e) {
      setError(e instanceof ApiError ? (e.issues[0]?.message ?? e.message) : e instanceof Error ? e.message : String(e));
    } finally {
      setPending(false);
    }
  }

  const onKeyDown = (event: KeyboardEvent) => {
    if (event.key === 'Escape') {
      event.preventDefault();
      event.stopPropagation();
      onClose();
    }
  };

  return (
    <form onSubmit={submit} onKeyDown={onKeyDown} noValidate className="mt-1 space-y-1" aria-label="Accept the finding">
      <label htmlFor={id} className="block text-sm font-medium">
        Why is it accepted?
      </label>
      <div className="flex gap-2">
        <input
          id={id}
          autoFocus
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          placeholder="e.g. recorded as observation 4, C2"
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-error` : undefined}
          className="min-w-0 flex-1 rounded border border-line-strong bg-surface px-2 py-0.5 aria-invalid:border-danger"
        />
        <button type="submit" aria-disabled={pending || undefined} className="rounded bg-accent px-2 py-0.5 font-medium text-white aria-disabled:opacity-70">
          {pending ? 'Accepting…' : 'Accept'}
        </button>
        <button type="button" onClick={onClose} className="rounded border border-line-strong px-2 py-0.5">
          Cancel
        </button>
      </div>
      {error && (
        <p id={`${id}-error`} className="text-sm text-danger">
          {error}
        </p>
      )}
    </form>
  );
}
