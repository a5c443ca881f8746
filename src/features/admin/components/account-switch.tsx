import { useState } from 'react';
import type { ListedUser } from '../../../../shared/schemas/auth.ts';
import { useUpdateUser } from '../api/update-user.ts';

/**
 * Deactivates or reactivates a person's account. Deactivating asks once more, in words, because it
 * signs the person out everywhere at once; their name stays on everything they did. Reactivating
 * lets them sign in again with their password.
 */
export function AccountSwitch({ user }: { user: ListedUser }) {
  const updateUser = useUpdateUser();
  const [asking, setAsking] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);

  function setActive(active: boolean) {
    if (updateUser.isPending) return;
    setError(null);
    setDone(null);
    updateUser.mutate(
      { id: user.id, changes: { active } },
      {
        onSuccess: (updated) => {
          setAsking(false);
          setDone(updated.active ? `${updated.name} can sign in again.` : `${updated.name} is signed out and cannot sign in.`);
        },
        onError: (failure) => {
          setAsking(false);
          setError(failure.message);
        },
      },
    );
  }

  const button = 'rounded border px-2 py-0.5 font-medium aria-disabled:opacity-70';
  return (
    <div className="flex flex-wrap items-center gap-2">
      {!user.active && !asking && <span className="text-muted">Deactivated</span>}
      {user.active && !asking && (
        <button
          type="button"
          className={`${button} border-line-strong hover:bg-paper`}
          onClick={() => {
            setAsking(true);
            setError(null);
            setDone(null);
          }}
        >
          Deactivate…
        </button>
      )}
      {asking && (
        <span role="group" aria-label={`Deactivate ${user.name}?`} className="flex flex-wrap items-center gap-2">
          <span>Sign {user.name} out everywhere and refuse their sign-in? Their name stays on their work.</span>
          <button
            type="button"
            autoFocus
            aria-disabled={updateUser.isPending || undefined}
            className={`${button} border-danger text-danger hover:bg-danger-soft`}
            onClick={() => setActive(false)}
          >
            {updateUser.isPending ? 'Deactivating…' : `Deactivate ${user.name}`}
          </button>
          <button type="button" className={`${button} border-transparent text-muted hover:bg-paper`} onClick={() => setAsking(false)}>
            Keep active
          </button>
        </span>
      )}
      {!user.active && (
        <button
          type="button"
          aria-disabled={updateUser.isPending || undefined}
          className={`${button} border-accent text-accent hover:bg-accent-soft`}
          onClick={() => setActive(true)}
        >
          {updateUser.isPending ? 'Reactivating…' : 'Reactivate'}
        </button>
      )}
      {error && (
        <span role="alert" className="text-danger">
          {error}
        </span>
      )}
      {done && (
        <span role="status" className="text-ok">
          {done}
        </span>
      )}
    </div>
  );
}
