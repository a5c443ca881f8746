import { useId, useState, type FormEvent } from 'react';
import type { ListedUser } from '../../../../shared/schemas/auth.ts';
import { useUpdateUser } from '../api/update-user.ts';
import { fieldErrorsFrom } from '../field-errors.ts';

/**
 * An admin sets a new password for a person (who forgot theirs, or whose password got out). Every
 * session of that person ends at once; the admin passes the new password on privately.
 */
export function PasswordReset({ user }: { user: ListedUser }) {
  const updateUser = useUpdateUser();
  const [open, setOpen] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const inputId = useId();

  function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (updateUser.isPending) return;
    const password = String(new FormData(event.currentTarget).get('password') ?? '');
    setError(null);
    updateUser.mutate(
      { id: user.id, changes: { password } },
      {
        onSuccess: (updated) => {
          setOpen(false);
          setDone(`New password set; ${updated.name} was signed out everywhere.`);
        },
        onError: (failure) => {
          const found = fieldErrorsFrom(failure, ['password'] as const);
          setError(found.fields.password ?? found.form ?? failure.message);
        },
      },
    );
  }

  if (!open) {
    return (
      <span className="flex flex-wrap items-center gap-2">
        <button
          type="button"
          className="rounded border border-line-strong px-2 py-0.5 font-medium hover:bg-paper"
          onClick={() => {
            setOpen(true);
            setDone(null);
          }}
        >
          New password…
        </button>
        {done && (
          <span role="status" className="text-ok">
            {done}
          </span>
        )}
      </span>
    );
  }
  return (
    <form onSubmit={handleSubmit} noValidate className="flex flex-wrap items-center gap-2">
      <label htmlFor={inputId} className="sr-only">
        New password for {user.name}
      </label>
      <input
        id={inputId}
        name="password"
        type="password"
        autoComplete="new-password"
        autoFocus
        placeholder="At least 10 characters"
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${inputId}-error` : undefined}
        className="rounded border border-line-strong bg-surface px-2 py-0.5 aria-invalid:border-danger"
      />
      <button type="submit" aria-disabled={updateUser.isPending || undefined} className="rounded border border-accent px-2 py-0.5 font-medium text-accent hover:bg-accent-soft aria-disabled:opacity-70">
        {updateUser.isPending ? 'Setting…' : 'Set password'}
      </button>
      <button type="button" className="rounded px-2 py-0.5 text-muted hover:bg-paper" onClick={() => setOpen(false)}>
        Cancel
      </button>
      {error && (
        <span id={`${inputId}-error`} role="alert" className="text-danger">
          {error}
        </span>
      )}
    </form>
  );
}
