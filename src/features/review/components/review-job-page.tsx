import { useCallback, useId, useMemo, useRef, useState, type FormEvent, type KeyboardEvent, type ReactNode, type RefObject } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import type { Role } from '../../../../shared/schemas/common.ts';
import type { JobSectionData } from '../../../../shared/schemas/job-record.ts';
import type { ReviewFinding, ReviewJob } from '../../../../shared/schemas/review.ts';
import { jobStateLabels } from '../../../../shared/schemas/sites.ts';
import { columnByKey, type ColumnKey } from '../../../../shared/schemas/columns.ts';
import { CommandPalette } from '../../../components/command-palette.tsx';
import { KeysOverlay } from '../../../components/keys-overlay.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { createGeneralCommands } from '../../../lib/commands/general-commands.ts';
import { createRegistry } from '../../../lib/commands/registry.ts';
import type { Command } from '../../../lib/commands/types.ts';
import { useCommandKeys } from '../../../lib/commands/use-command-keys.ts';
import { useAcceptFinding, useWithdrawAcceptance } from '../api/accept-finding.ts';
import { useChangeJobState } from '../api/change-job-state.ts';
import { useReviewJob } from '../api/get-review-job.ts';
import { reasonsOf, useLockBoard } from '../api/lock-board.ts';
import { createReviewCommands, type ReviewContext, type ReviewSelection } from '../commands.ts';
import { FindingItem } from './finding-item.tsx';
import { GateReasons } from './gate-reasons.tsx';
import { JobRecordSummary } from './job-record-summary.tsx';
import { RingSocketReadings } from './ring-socket-readings.tsx';
import { UnlockBoardForm } from './unlock-board-form.tsx';

const severityRank: Record<string, number> = { error: 0, warning: 1, note: 2 };

/** Errors still open first, then accepted errors, warnings and notes; readings to do are counted, not listed. */
function orderFindings(findings: readonly ReviewFinding[]): ReviewFinding[] {
  return findings
    .filter((f) => !isToDo(f))
    .map((f, index) => ({ f, index }))
    .sort(
      (a, b) =>
        (severityRank[a.f.severity] ?? 3) - (severityRank[b.f.severity] ?? 3) ||
        Number(a.f.acceptance !== null) - Number(b.f.acceptance !== null) ||
        a.index - b.index,
    )
    .map(({ f }) => f);
}

/** A reading not yet recorded (the checker's `todo`, or its older missing-reading codes). */
function isToDo(f: ReviewFinding): boolean {
  return (f.severity as string) === 'todo' || f.code === 'cells-missing' || f.code === 'rcd-time-missing';
}

const domIdOf = (key: string) => `finding-${key.replace(/[^A-Za-z0-9_-]/g, '_')}`;

function messageOf(error: unknown): string {
  if (error instanceof ApiError) return error.issues[0]?.message ?? error.message;
  return error instanceof Error ? error.message : String(error);
}

export interface ReviewJobPageProps {
  jobId: number;
  role: Role | null;
  /** What other features show with the job record (the app places the job's photos here). */
  recordPanels?: ReactNode;
}

/**
 * One job under review: its boards and their findings on the left, the job record on the right,
 * the gate and the job's actions on top. Keyboard first: j / k move through the findings, a
 * accepts the selected error with a reason, l locks its board, o opens the board in the console,
 * b sends the job back (with a reason), Alt+Shift+A approves; Ctrl+K lists every command.
 */
export function ReviewJobPage({ jobId, role, recordPanels }: ReviewJobPageProps) {
  const query = useReviewJob(jobId);
  if (query.isPending) return <p className="p-4 text-muted">Loading the job…</p>;
  if (query.isError) {
    return (
      <p role="alert" className="p-4 text-danger">
        This job cannot be shown: {messageOf(query.error)}
      </p>
    );
  }
  return <ReviewJobView review={query.data} role={role} recordPanels={recordPanels} />;
}

function ReviewJobView({ review, role, recordPanels }: { review: ReviewJob; role: Role | null; recordPanels?: ReactNode }) {
  const jobId = review.job.id;
  const navigate = useNavigate();
  const accept = useAcceptFinding(jobId);
  const withdraw = useWithdrawAcceptance(jobId);
  const lock = useLockBoard();
  const changeState = useChangeJobState(jobId);
  const [selectedKey, setSelectedKey] = useState<string | null>(null);
  const [acceptingKey, setAcceptingKey] = useState<string | null>(null);
  const [status, setStatus] = useState<{ text: string; tone: 'info' | 'error'; reasons?: string[] } | null>(null);
  const [paletteOpen, setPaletteOpen] = useState(false);
  const [keysOpen, setKeysOpen] = useState(false);
  const sendBackRef = useRef<HTMLInputElement>(null);
  const isReviewer = role === 'reviewer' || role === 'admin';
  const record = review.record as unknown as JobSectionData;

  // Every finding that can be selected, in the order shown: each board's, then the job's.
  const selectable = useMemo(() => {
    const list: ReviewSelection[] = [];
    for (const b of review.boards) for (const finding of orderFindings(b.findings)) list.push({ boardId: b.board.id, finding });
    for (const finding of orderFindings(review.jobFindings)) list.push({ boardId: null, finding });
    return list;
  }, [review]);
  const selected = selectable.find((s) => s.finding.key === selectedKey) ?? null;

  const select = useCallback((key: string) => {
    setSelectedKey(key);
    setAcceptingKey((current) => (current === key ? current : null));
    requestAnimationFrame(() => document.getElementById(domIdOf(key))?.focus());
  }, []);

  const moveSelection = (delta: 1 | -1) => {
    if (selectable.length === 0) {
      setStatus({ text: 'There is no finding on this job.', tone: 'info' });
      return;
    }
    const at = selected ? selectable.indexOf(selected) : -1;
    const next = at === -1 ? (delta === 1 ? 0 : selectable.length - 1) : Math.max(0, Math.min(selectable.length - 1, at + delta));
    select(selectable[next]!.finding.key);
  };

  const lockBoard = (boardId: number) => {
    const board = review.boards.find((b) => b.board.id === boardId);
    lock.mutate(boardId, {
      onSuccess: () => setStatus({ text: `Board ${board?.board.reference ?? boardId} locked.`, tone: 'info' }),
      onError: (error) => setStatus({ text: `Board ${board?.board.reference ?? boardId} was not locked: ${messageOf(error)}`, tone: 'error', reasons: reasonsOf(error) }),
    });
  };

  const approve = () =>
    changeState.mutate(
      { action: 'approve', note: '' },
      {
        onSuccess: () => setStatus({ text: `Job ${review.job.reference} approved. Sign and issue it from the job screen.`, tone: 'info' }),
        onError: (error) => setStatus({ text: `Not approved: ${messageOf(error)}`, tone: 'error', reasons: reasonsOf(error) }),
      },
    );

  const withdrawSelected = () => {
    const acceptance = selected?.finding.acceptance;
    if (!acceptance) return;
    withdraw.mutate(acceptance.id, {
      onSuccess: () => setStatus({ text: 'Acceptance withdrawn: the finding is open again.', tone: 'info' }),
      onError: (error) => setStatus({ text: messageOf(error), tone: 'error' }),
    });
  };

  const ctx: ReviewContext = {
    review,
    role,
    selected,
    busy: lock.isPending || changeState.isPending || accept.isPending,
    ui: {
      moveSelection,
      openAccept: () => selected && setAcceptingKey(selected.finding.key),
      withdrawAcceptance: withdrawSelected,
      focusSendBack: () => sendBackRef.current?.focus(),
      lockBoard,
      approve,
      openBoard: (boardId) => navigate(`/boards/${boardId}`),
      openPalette: () => setPaletteOpen(true),
      openKeys: () => setKeysOpen(true),
    },
  };
  const ctxRef = useRef(ctx);
  ctxRef.current = ctx;

  const registry = useMemo(
    () =>
      createRegistry<ReviewContext>([
        ...createGeneralCommands<ReviewContext>({ openPalette: () => ctxRef.current.ui.openPalette(), showKeys: () => ctxRef.current.ui.openKeys() }),
        ...createReviewCommands(),
      ]),
    [],
  );
  const onCommandError = useCallback((error: unknown, command: Command<ReviewContext>) => setStatus({ text: `${command.label}: ${messageOf(error)}`, tone: 'error' }), []);
  useCommandKeys(registry, ctx, {
    enabled: !paletteOpen && !keysOpen,
    onUnavailable: (command, reason) => setStatus({ text: `${command.label}: ${reason}.`, tone: 'error' }),
    onError: onCommandError,
  });

  const onListKeyDown = (event: KeyboardEvent<HTMLElement>) => {
    if (event.target instanceof HTMLInputElement || event.target instanceof HTMLButtonElement) return;
    if (event.key === 'ArrowDown' || event.key === 'ArrowUp') {
      event.preventDefault();
      moveSelection(event.key === 'ArrowDown' ? 1 : -1);
    } else if (event.key === 'Enter' && selected && acceptingKey !== selected.finding.key) {
      const can = registry.get('review.accept');
      if (can && can.when?.(ctx) === true) {
        event.preventDefault();
        setAcceptingKey(selected.finding.key);
      }
    }
  };

  const renderFinding = (boardId: number | null, finding: ReviewFinding) => (
    <FindingItem
      key={finding.key}
      finding={finding}
      domId={domIdOf(finding.key)}
      selected={selectedKey === finding.key}
      accepting={acceptingKey === finding.key}
      canAccept={isReviewer && review.job.state !== 'approved' && review.job.state !== 'issued'}
      onSelect={() => select(finding.key)}
      onOpenAccept={() => setAcceptingKey(finding.key)}
      onCloseAccept={() => {
        setAcceptingKey(null);
        document.getElementById(domIdOf(finding.key))?.focus();
      }}
      onAccept={async (reason) => {
        await accept.mutateAsync({ boardId, findingKey: finding.key, reason });
        setAcceptingKey(null);
        setStatus({ text: `Accepted: ${finding.message}`, tone: 'info' });
        document.getElementById(domIdOf(finding.key))?.focus();
      }}
      onWithdraw={withdrawSelected}
    />
  );

  const state = review.job.state;
  return (
    <div className="flex min-h-0 flex-1 flex-col">
      <header className="shrink-0 space-y-2 border-b border-line bg-surface px-4 py-3">
        <div className="flex flex-wrap items-baseline gap-x-3">
          <h1 className="text-lg font-semibold">
            Review {review.job.kind} {review.job.reference}
          </h1>
          <span>
            {review.site.client}, {review.site.address}
          </span>
          <span className="rounded border border-line-strong px-1.5 text-sm">{jobStateLabels[state]}</span>
          <Link to={`/jobs/${jobId}`} className="text-accent underline">
            Job screen
          </Link>
          <Link to="/review" className="text-accent underline">
            Back to the queue
          </Link>
        </div>
        {review.submitted && (
          <p className="text-sm">
            Submitted by {review.submitted.by?.name ?? 'someone'} on {new Date(review.submitted.at).toLocaleString('en-GB')}
            {review.submitted.note ? `: “${review.submitted.note}”` : '.'}
          </p>
        )}
        <div className="flex flex-wrap items-start gap-6">
          <div className="min-w-0 flex-1">
            <GateReasons title="Before this job can be approved" reasons={review.gate.reasons} okText="Every board is locked and the record passes the gate: the job can be approved." />
          </div>
          {isReviewer && (
            <div className="flex flex-col gap-2">
              {state === 'ready' && (
                <button
                  type="button"
                  onClick={approve}
                  aria-disabled={changeState.isPending || undefined}
                  aria-describedby={review.gate.reasons.length > 0 ? 'review-approve-note' : undefined}
                  className="rounded bg-accent px-3 py-1 font-medium text-white hover:bg-accent-hover aria-disabled:opacity-70"
                >
                  Approve the job <kbd className="text-xs opacity-80">Alt+Shift+A</kbd>
                </button>
              )}
              {review.gate.reasons.length > 0 && state === 'ready' && (
                <p id="review-approve-note" className="text-xs text-muted">
                  The server will refuse while the list on the left is not empty.
                </p>
              )}
              {(state === 'ready' || state === 'approved') && <SendBackForm inputRef={sendBackRef} jobId={jobId} onDone={(text) => setStatus({ text, tone: 'info' })} />}
            </div>
          )}
        </div>
        {status && (
          <div role={status.tone === 'error' ? 'alert' : 'status'} className={status.tone === 'error' ? 'text-danger' : 'text-ok'}>
            <p>{status.text}</p>
            {status.reasons && status.reasons.length > 0 && (
              <ul className="list-disc pl-5">
                {status.reasons.map((r, i) => (
                  <li key={i}>{r}</li>
                ))}
              </ul>
            )}
          </div>
        )}
        <p className="text-xs text-muted">
          Keys: j / k next and previous finding · a accept it with a reason · l lock its board · o open its board · b send the job back · Alt+Shift+A approve ·
          Ctrl+K every command · ? the keys. Boardwalk checks what was recorded; it does not replace the inspector’s judgement, and local regulations and
          the current edition of BS 7671 take precedence.
        </p>
      </header>

      <div className="flex min-h-0 flex-1 gap-4 overflow-auto p-4">
        <section aria-labelledby="review-boards-heading" className="min-w-0 flex-1 space-y-4">
          <h2 id="review-boards-heading" className="font-semibold">
            Boards and their findings
          </h2>
          {review.boards.length === 0 && <p className="text-muted">This job has no board yet.</p>}
          {review.boards.map((b) => {
            const shown = orderFindings(b.findings);
            const missing = Object.entries(b.missingByColumn);
            return (
              <section key={b.board.id} aria-label={`Board ${b.board.reference}`} className="space-y-2 rounded border border-line bg-surface p-3">
                <div className="flex flex-wrap items-baseline gap-x-3">
                  <h3 className="font-semibold">Board {b.board.reference}</h3>
                  <span className="text-sm">{b.board.location}</span>
                  <span className={`rounded px-1.5 text-sm ${b.board.state === 'locked' ? 'bg-locked-soft text-locked' : 'border border-line-strong'}`}>
                    {b.board.state === 'locked' ? `locked${b.board.lockedBy ? ` by ${b.board.lockedBy.name}` : ''}` : 'open'}
                  </span>
                  <span className="text-sm text-muted">
                    {b.circuitCount} circuits · {b.counts.errors} open errors · {b.counts.accepted} accepted · {b.counts.warnings} warnings · {b.counts.missingReadings}{' '}
                    readings to do
                  </span>
                  <Link to={`/boards/${b.board.id}`} className="text-sm text-accent underline">
                    Open in the console
                  </Link>
                  {isReviewer && b.board.state === 'open' && (
                    <button
                      type="button"
                      onClick={() => lockBoard(b.board.id)}
                      aria-disabled={lock.isPending || undefined}
                      className="rounded border border-line-strong px-2 py-0.5 text-sm hover:bg-accent-soft aria-disabled:opacity-70"
                    >
                      Lock board {b.board.reference}
                    </button>
                  )}
                </div>
                {isReviewer && b.board.state === 'locked' && state !== 'approved' && state !== 'issued' && (
                  <UnlockBoardForm boardId={b.board.id} reference={b.board.reference} onDone={(text) => setStatus({ text, tone: 'info' })} />
                )}
                {b.board.state === 'open' && <GateReasons title={`Before board ${b.board.reference} can be locked`} reasons={b.gate.reasons} okText="Nothing stops this board being locked." />}
                {missing.length > 0 && (
                  <p className="text-sm">
                    Readings to do:{' '}
                    {missing.map(([column, n]) => `${columnByKey[column as ColumnKey]?.label ?? column} ${n}`).join(' · ')}
                  </p>
                )}
                {shown.length > 0 ? (
                  <ul role="listbox" aria-label={`Findings on board ${b.board.reference}`} onKeyDown={onListKeyDown} className="space-y-1">
                    {shown.map((f) => renderFinding(b.board.id, f))}
                  </ul>
                ) : (
                  <p className="text-sm text-muted">No findings about values on this board.</p>
                )}
                <RingSocketReadings boardReference={b.board.reference} rings={b.rings ?? []} />
              </section>
            );
          })}
        </section>

        <section aria-labelledby="review-record-heading" className="w-[28rem] shrink-0 space-y-3">
          <h2 id="review-record-heading" className="font-semibold">
            The job record
          </h2>
          {review.jobFindings.length > 0 && (
            <ul role="listbox" aria-label="Findings on the job record" onKeyDown={onListKeyDown} className="space-y-1">
              {orderFindings(review.jobFindings).map((f) => renderFinding(null, f))}
            </ul>
          )}
          {recordPanels}
          <JobRecordSummary job={review.job} record={record} />
        </section>
      </div>

      <CommandPalette open={paletteOpen} onOpenChange={setPaletteOpen} registry={registry} ctx={ctx} onError={onCommandError} />
      <KeysOverlay open={keysOpen} onOpenChange={setKeysOpen} registry={registry} ctx={ctx} />
    </div>
  );
}

function SendBackForm({ jobId, inputRef, onDone }: { jobId: number; inputRef: RefObject<HTMLInputElement | null>; onDone: (text: string) => void }) {
  const id = useId();
  const changeState = useChangeJobState(jobId);
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | null>(null);

  function submit(event: FormEvent) {
    event.preventDefault();
    if (changeState.isPending) return;
    if (reason.trim().length < 5) {
      setError('Say why the job is sent back (at least 5 characters).');
      inputRef.current?.focus();
      return;
    }
    setError(null);
    changeState.mutate(
      { action: 'send-back', reason: reason.trim() },
      {
        onSuccess: () => {
          setReason('');
          onDone('The job is sent back to being entered; the reason is in its history.');
        },
        onError: (e) => setError(messageOf(e)),
      },
    );
  }

  return (
    <form onSubmit={submit} noValidate className="space-y-1" aria-label="Send the job back">
      <label htmlFor={id} className="block text-sm font-medium">
        Send back to the tester, because…
      </label>
      <div className="flex gap-2">
        <input
          ref={inputRef}
          id={id}
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-error` : undefined}
          className="w-64 rounded border border-line-strong bg-surface px-2 py-0.5 aria-invalid:border-danger"
        />
        <button type="submit" aria-disabled={changeState.isPending || undefined} className="rounded border border-line-strong px-2 py-0.5 font-medium hover:bg-accent-soft">
          Send back
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
