import { useId, useRef, useState, type FormEvent } from 'react';
import { ApiError } from '../../../lib/api-client.ts';
import { useChangePassword } from '../api/change-password.ts';

type Field = 'currentPassword' | 'newPassword';

const inputClass =
  'block w-full rounded border border-line-strong bg-surface px-2 py-1 aria-invalid:border-danger aria-invalid:bg-danger-soft';

/** Where the server's refusal belongs: a zod issue at its field, the wrong current password at that field. */
function errorsFrom(error: unknown): { fields: Partial<Record<Field, string>>; form?: string } {
  if (!(error instanceof ApiError)) return { fields: {}, form: error instanceof Error ? error.message : 'That did not work. Try again.' };
  const fields: Partial<Record<Field, string>> = {};
  for (const issue of error.issues) {
    if (issue.path === 'currentPassword' || issue.path === 'newPassword') fields[issue.path] ??= issue.message;
  }
  const named = (error.details as { field?: string } | undefined)?.field;
  if (error.issues.length === 0 && (named === 'currentPassword' || named === 'newPassword')) fields[named] = error.message;
  return Object.keys(fields).length > 0 ? { fields } : { fields, form: error.message };
}

/**
 * Route `/account/password`: the signed-in person changes their password. Their sessions on other
 * devices end at once; this one goes on.
 */
export function PasswordPage() {
  const changePassword = useChangePassword();
  const [errors, setErrors] = useState<ReturnType<typeof errorsFrom> | null>(null);
  const [done, setDone] = useState(false);
  const formRef = useRef<HTMLFormElement>(null);
  const baseId = useId();
  const id = (field: Field) => `${baseId}-${field}`;

  function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (changePassword.isPending) return;
    const data = new FormData(event.currentTarget);
    setErrors(null);
    setDone(false);
    changePassword.mutate(
      { currentPassword: String(data.get('currentPassword') ?? ''), newPassword: String(data.get('newPassword') ?? '') },
      {
        onSuccess: () => {
          formRef.current?.reset();
          setDone(true);
        },
        onError: (error) => {
          const found = errorsFrom(error);
          setErrors(found);
          const first = (['currentPassword', 'newPassword'] as const).find((f) => found.fields[f]);
          if (first) document.getElementById(id(first))?.focus();
        },
      },
    );
  }

  const field = (name: Field, label: string, autoComplete: string, hint?: string) => {
    const error = errors?.fields[name];
    return (
      <div className="space-y-1">
        <label htmlFor={id(name)} className="block font-medium">
          {label}
        </label>
        <input
          id={id(name)}
          name={name}
          type="password"
          autoComplete={autoComplete}
          className={inputClass}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id(name)}-error` : hint ? `${id(name)}-hint` : undefined}
        />
        {hint && !error && (
          <p id={`${id(name)}-hint`} className="text-xs text-muted">
            {hint}
          </p>
        )}
        {error && (
          <p id={`${id(name)}-error`} className="text-danger">
            {error}
          </p>
        )}
      </div>
    );
  };

  return (
    <div className="mx-auto w-full max-w-md p-4">
      <form ref={formRef} aria-labelledby={`${baseId}-heading`} noValidate onSubmit={handleSubmit} className="space-y-3 rounded border border-line bg-surface p-4">
        <h1 id={`${baseId}-heading`} className="text-lg font-semibold">
          Change your password
        </h1>
        {field('currentPassword', 'Current password', 'current-password')}
        {field('newPassword', 'New password', 'new-password', 'At least 10 characters. You stay signed in here; everywhere else you are signed out.')}
        <button
          type="submit"
          aria-disabled={changePassword.isPending || undefined}
          className="rounded bg-accent px-3 py-1.5 font-medium text-white hover:bg-accent-hover aria-disabled:opacity-70"
        >
          {changePassword.isPending ? 'Changing…' : 'Change password'}
        </button>
        <div aria-live="polite">
          {done && <p className="text-ok">Your password is changed. Your other sign-ins have ended.</p>}
          {errors?.form && (
            <p role="alert" className="text-danger">
              {errors.form}
            </p>
          )}
        </div>
      </form>
    </div>
  );
}
