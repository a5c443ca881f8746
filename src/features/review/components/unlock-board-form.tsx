import { useId, useState, type FormEvent } from 'react';
import { ApiError } from '../../../lib/api-client.ts';
import { useUnlockBoard } from '../api/lock-board.ts';

/**
 * Sends a locked board back to the testers: it is unlocked with the reason, which stays in the
 * board's history. Only while the job is not approved (an approved job is sent back first).
 */
export function UnlockBoardForm({ boardId, reference, onDone }: { boardId: number; reference: string; onDone: (text: string) => void }) {
  const id = useId();
  const unlock = useUnlockBoard();
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | null>(null);

  function submit(event: FormEvent) {
    event.preventDefault();
    if (unlock.isPending) return;
    if (reason.trim().length < 5) {
      setError('Say why the board is sent back (at least 5 characters).');
      document.getElementById(id)?.focus();
      return;
    }
    setError(null);
    unlock.mutate(
      { boardId, reason: reason.trim() },
      {
        onSuccess: () => {
          setReason('');
          onDone(`Board ${reference} unlocked and sent back to the testers.`);
        },
        onError: (e) => setError(e instanceof ApiError ? (e.issues[0]?.message ?? e.message) : e.message),
      },
    );
  }

  return (
    <form onSubmit={submit} noValidate className="space-y-1 text-sm" aria-label={`Send board ${reference} back`}>
      <label htmlFor={id} className="block font-medium">
        Send board {reference} back (unlock it), because…
      </label>
      <div className="flex gap-2">
        <input
          id={id}
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-error` : undefined}
          className="min-w-0 flex-1 rounded border border-line-strong bg-surface px-2 py-0.5 aria-invalid:border-danger"
        />
        <button type="submit" aria-disabled={unlock.isPending || undefined} className="rounded border border-line-strong px-2 py-0.5 font-medium hover:bg-accent-soft">
          Unlock
        </button>
      </div>
      {error && (
        <p id={`${id}-error`} className="text-danger">
          {error}
        </p>
      )}
    </form>
  );
}
