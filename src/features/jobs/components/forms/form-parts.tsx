import type React from 'react';
import { useId, useState } from 'react';
import { firstFieldWithError, type FormErrors } from '../../../../lib/form-errors.ts';

/** The submit button and the form's own message (a problem no single field owns). */
export function FormFooter({ pending, label, pendingLabel, formError }: { pending: boolean; label: string; pendingLabel: string; formError?: string }) {
  return (
    <div className="space-y-2 pt-1">
      <button
        type="submit"
        aria-disabled={pending || undefined}
        className="rounded bg-accent px-3 py-1.5 font-medium text-white hover:bg-accent-hover aria-disabled:opacity-70"
      >
        {pending ? pendingLabel : label}
      </button>
      <p className="text-xs text-muted">Enter saves from any field · Esc closes without saving</p>
      <div role="alert" className="text-danger empty:hidden">
        {formError}
      </div>
    </div>
  );
}

/** Today as YYYY-MM-DD in the person's own time zone. */
export function todayText(): string {
  const now = new Date();
  return `${now.getFullYear()}-${String(now.getMonth() + 1).padStart(2, '0')}-${String(now.getDate()).padStart(2, '0')}`;
}

/**
 * Enter submits from any field: inputs do so by themselves; a select does not, so the form asks.
 * (Textareas keep Enter for new lines.)
 */
export function enterSubmits(event: React.KeyboardEvent<HTMLFormElement>) {
  if (event.key !== 'Enter' || event.nativeEvent.isComposing) return;
  if (event.target instanceof HTMLSelectElement) {
    event.preventDefault();
    event.currentTarget.requestSubmit();
  }
}

/**
 * A form's errors and field ids: `show` keeps the errors and puts the cursor on the first field
 * that has one (in the form's own order), `fieldError` reads one field's message.
 */
export function useFormErrors<Field extends string>(fields: readonly Field[]) {
  const [errors, setErrors] = useState<FormErrors<Field> | null>(null);
  const baseId = useId();
  const id = (field: Field) => `${baseId}-${field}`;
  function show(found: FormErrors<Field>) {
    setErrors(found);
    const first = firstFieldWithError(found, fields);
    if (first) document.getElementById(id(first))?.focus();
  }
  const fieldError = (field: Field) => errors?.fields[field];
  return { errors, setErrors, id, show, fieldError };
}
