import { useId, useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import type { Role } from '../../../../shared/schemas/common.ts';
import { jobStateLabels } from '../../../../shared/schemas/sites.ts';
import { ApiError } from '../../../lib/api-client.ts';
import { useChangeJobState, type JobStateChange } from '../api/change-job-state.ts';
import { useJobGate } from '../api/get-job-gate.ts';
import { reasonsOf } from '../api/lock-board.ts';
import { GateReasons } from './gate-reasons.tsx';

function messageOf(error: unknown): string {
  if (error instanceof ApiError) return error.issues[0]?.message ?? error.message;
  return error instanceof Error ? error.message : String(error);
}

const actionWords: Record<string, string> = {
  ready: 'Submitted for review',
  approved: 'Approved',
  entering: 'Sent back',
  issued: 'Issued',
};

/**
 * The job screen's panel for the job's state: where it stands, the last change with who and why,
 * what still stops approval (the same list the server answers with) and each board's reasons it
 * cannot be locked yet — shown before anyone tries; submit with a note, and for reviewers approve
 * and send back with a reason.
 */
export function JobStatePanel({ jobId, role }: { jobId: number; role: Role | null }) {
  const gate = useJobGate(jobId);
  const changeState = useChangeJobState(jobId);
  const [text, setText] = useState('');
  const [message, setMessage] = useState<{ text: string; tone: 'info' | 'error'; reasons?: string[] } | null>(null);
  const noteId = useId();
  const reasonId = useId();
  const isReviewer = role === 'reviewer' || role === 'admin';

  if (gate.isPending) return <section aria-label="State of the job" className="p-3 text-muted">Loading the job’s state…</section>;
  if (gate.isError) {
    return (
      <section aria-label="State of the job" className="p-3">
        <p role="alert" className="text-danger">
          The job’s state cannot be shown: {messageOf(gate.error)}
        </p>
      </section>
    );
  }
  const { state, reasons, boards, lastChange } = gate.data;

  function run(change: JobStateChange, done: string) {
    setMessage(null);
    changeState.mutate(change, {
      onSuccess: () => {
        setText('');
        setMessage({ text: done, tone: 'info' });
      },
      onError: (error) => setMessage({ text: messageOf(error), tone: 'error', reasons: reasonsOf(error) }),
    });
  }

  function submit(event: FormEvent) {
    event.preventDefault();
    if (changeState.isPending) return;
    run({ action: 'submit', note: text.trim() }, 'Submitted: the job is waiting for a reviewer.');
  }

  function sendBack(event: FormEvent) {
    event.preventDefault();
    if (changeState.isPending) return;
    if (text.trim().length < 5) {
      setMessage({ text: 'Say why the job is sent back (at least 5 characters).', tone: 'error' });
      document.getElementById(reasonId)?.focus();
      return;
    }
    run({ action: 'send-back', reason: text.trim() }, 'Sent back to being entered.');
  }

  const openBoards = boards.filter((b) => b.state === 'open');
  return (
    <section aria-labelledby={`${noteId}-heading`} className="space-y-2 rounded border border-line bg-surface p-3">
      <h2 id={`${noteId}-heading`} className="font-semibold">
        State: <span className="rounded border border-line-strong px-1.5">{jobStateLabels[state]}</span>
      </h2>
      {lastChange && (
        <p className="text-sm">
          {actionWords[lastChange.to] ?? 'Changed'} by {lastChange.by?.name ?? 'someone'} on {new Date(lastChange.at).toLocaleString('en-GB')}
          {lastChange.reason ? `: “${lastChange.reason}”` : '.'}
        </p>
      )}

      {state !== 'issued' && (
        <GateReasons title="Before it can be approved" reasons={reasons} okText="Every board is locked and the record is complete: a reviewer can approve it." />
      )}
      {state !== 'issued' && state !== 'approved' && openBoards.some((b) => b.reasons.length > 0) && (
        <div className="space-y-1 text-sm">
          {openBoards
            .filter((b) => b.reasons.length > 0)
            .map((b) => (
              <details key={b.boardId}>
                <summary>
                  Board {b.reference}: {b.reasons.length} {b.reasons.length === 1 ? 'reason' : 'reasons'} it cannot be locked yet
                </summary>
                <ul className="list-disc pl-5">
                  {b.reasons.map((r, i) => (
                    <li key={i}>{r}</li>
                  ))}
                </ul>
              </details>
            ))}
        </div>
      )}

      {state === 'entering' && (
        <form onSubmit={submit} noValidate className="space-y-1" aria-label="Submit for review">
          <label htmlFor={noteId} className="block text-sm font-medium">
            Note for the reviewer (optional)
          </label>
          <div className="flex gap-2">
            <input id={noteId} value={text} onChange={(e) => setText(e.target.value)} className="min-w-0 flex-1 rounded border border-line-strong px-2 py-0.5" />
            <button type="submit" aria-disabled={changeState.isPending || undefined} className="rounded bg-accent px-3 py-0.5 font-medium text-white aria-disabled:opacity-70">
              Submit for review
            </button>
          </div>
        </form>
      )}

      {isReviewer && (state === 'ready' || state === 'approved') && (
        <div className="space-y-2">
          {state === 'ready' && (
            <div className="flex flex-wrap items-center gap-2">
              <button
                type="button"
                onClick={() => run({ action: 'approve', note: '' }, 'Approved: sign and issue it.')}
                aria-disabled={changeState.isPending || undefined}
                className="rounded bg-accent px-3 py-0.5 font-medium text-white aria-disabled:opacity-70"
              >
                Approve
              </button>
              <Link to={`/review/${jobId}`} className="text-accent underline">
                Review it finding by finding
              </Link>
            </div>
          )}
          <form onSubmit={sendBack} noValidate className="space-y-1" aria-label="Send the job back">
            <label htmlFor={reasonId} className="block text-sm font-medium">
              Send back to being entered, because…
            </label>
            <div className="flex gap-2">
              <input id={reasonId} value={text} onChange={(e) => setText(e.target.value)} className="min-w-0 flex-1 rounded border border-line-strong px-2 py-0.5" />
              <button type="submit" aria-disabled={changeState.isPending || undefined} className="rounded border border-line-strong px-3 py-0.5 font-medium">
                Send back
              </button>
            </div>
          </form>
        </div>
      )}
      {!isReviewer && state === 'ready' && <p className="text-sm text-muted">Waiting for a reviewer. Readings can still be corrected meanwhile.</p>}
      {state === 'approved' && !isReviewer && <p className="text-sm text-muted">Approved: nothing on it changes unless a reviewer sends it back.</p>}

      {message && (
        <div role={message.tone === 'error' ? 'alert' : 'status'} className={message.tone === 'error' ? 'text-danger' : 'text-ok'}>
          <p>{message.text}</p>
          {message.reasons && message.reasons.length > 0 && (
            <ul className="list-disc pl-5">
              {message.reasons.map((r, i) => (
                <li key={i}>{r}</li>
              ))}
            </ul>
          )}
        </div>
      )}
    </section>
  );
}
