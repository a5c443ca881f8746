import type { ReactNode } from 'react';

/** One look for every form's fields: a label, the control, and a hint or the error in words. */

export const inputClass =
  'block w-full rounded border border-line-strong bg-surface px-2 py-1 aria-invalid:border-danger aria-invalid:bg-danger-soft disabled:opacity-60';

/** A label, its control, and under it either a hint or the error in words. */
export function FormField({ id, label, hint, error, children }: { id: string; label: string; hint?: string; error?: string; children: ReactNode }) {
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block font-medium">
        {label}
      </label>
      {children}
      {hint && !error && (
        <p id={`${id}-hint`} className="text-xs text-muted">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${id}-error`} className="text-danger">
          {error}
        </p>
      )}
    </div>
  );
}

/** Props that tie a control to its hint or its error. */
export function describedBy(id: string, error: string | undefined, hasHint = false) {
  return {
    'aria-invalid': error ? true : undefined,
    'aria-describedby': error ? `${id}-error` : hasHint ? `${id}-hint` : undefined,
  } as const;
}
