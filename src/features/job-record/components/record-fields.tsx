import { useRef, useState, type KeyboardEvent, type ReactNode } from 'react';
import type { JobSectionKey } from '../../../../shared/schemas/job-record.ts';
import { numberOrText } from '../../../lib/form-errors.ts';
import type { FieldState } from '../api/record-saver.ts';
import { fieldDomId, focusNextField, useFieldState, useRecord } from './record-context.tsx';

export const controlClass =
  'block w-full rounded border border-line-strong bg-surface px-2 py-1 aria-invalid:border-danger aria-invalid:bg-danger-soft [&[readonly]]:bg-paper disabled:bg-paper disabled:opacity-80';

/** How a stored value reads to a person. */
export function showValue(value: unknown, options?: readonly { value: string; label: string }[]): string {
  if (value === null || value === undefined || value === '') return 'blank';
  if (options) return options.find((o) => o.value === value)?.label ?? String(value);
  if (typeof value === 'object') return Object.values(value as Record<string, unknown>).filter(Boolean).join(', ') || 'blank';
  return String(value);
}

/** The save state under a field, in words; a conflict offers keep mine / take theirs. */
export function FieldStatus({
  id,
  section,
  field,
  state,
  options,
  onTakeTheirs,
}: {
  id: string;
  section: JobSectionKey;
  field: string;
  state: FieldState | undefined;
  options?: readonly { value: string; label: string }[];
  onTakeTheirs?: () => void;
}) {
  const { saver } = useRecord();
  if (!state) return <span id={`${id}-status`} className="sr-only" />;
  switch (state.status) {
    case 'saving':
      return (
        <p id={`${id}-status`} className="text-xs text-muted">
          saving…
        </p>
      );
    case 'saved':
      return (
        <p id={`${id}-status`} className="text-xs text-ok">
          ✓ saved
        </p>
      );
    case 'error':
      return (
        <p id={`${id}-status`} className="text-danger">
          {state.message}
        </p>
      );
    case 'conflict':
      return (
        <div id={`${id}-status`} role="alert" className="space-y-1 rounded border border-danger bg-danger-soft px-2 py-1 text-sm">
          <p>
            Someone else changed this since you opened it. Theirs: <strong>{showValue(state.theirs, options)}</strong> · yours:{' '}
            <strong>{showValue(state.mine, options)}</strong>
          </p>
          <div className="flex gap-2">
            <button type="button" className="rounded border border-line-strong bg-surface px-2 py-0.5" onClick={() => void saver.keepMine(section, field)}>
              Keep mine
            </button>
            <button
              type="button"
              className="rounded border border-line-strong bg-surface px-2 py-0.5"
              onClick={() => {
                saver.takeTheirs(section, field);
                onTakeTheirs?.();
              }}
            >
              Take theirs
            </button>
          </div>
        </div>
      );
  }
}

interface FieldProps {
  section: JobSectionKey;
  field: string;
  label: string;
  hint?: ReactNode;
  className?: string;
}

/**
 * A text or number field of the record. While the person types, the field holds their draft;
 * leaving the field (Tab, Enter, a click elsewhere) saves it, and Enter moves to the next field.
 * The draft stays on screen until the server has it, with the save state beneath.
 */
function DraftField({
  section,
  field,
  label,
  hint,
  className,
  kind,
}: FieldProps & { kind: 'text' | 'multiline' | 'number' | 'date' }) {
  const { detail, saver, readOnlyReason } = useRecord();
  const state = useFieldState(section, field);
  const stored = (detail.record[section].data as Record<string, unknown>)[field];
  const [draft, setDraft] = useState<string | null>(null);
  // The stored value the person started typing over: the job is polled, so it may change meanwhile.
  const typedOver = useRef<unknown>(undefined);
  const id = fieldDomId(section, field);
  const storedText = stored === null || stored === undefined ? '' : String(stored);
  const shownText = draft ?? (state?.status === 'conflict' ? String(state.mine ?? '') : storedText);

  const toValue = (text: string): unknown => (kind === 'number' ? numberOrText(text) : kind === 'date' ? text.trim() : text);

  async function commit() {
    if (draft === null) return;
    const value = toValue(draft);
    if (value === stored || (value === null && stored === null)) {
      setDraft(null);
      if (state?.status === 'error') saver.clear(section, field);
      return;
    }
    const startedFrom = typedOver.current;
    if (startedFrom !== undefined && JSON.stringify(startedFrom ?? null) !== JSON.stringify(stored ?? null) && !saver.isOwnValue(section, field, stored)) {
      // Someone else changed this field while it was being typed in: ask, as a 409 would.
      saver.conflictWhileTyping(section, field, value, stored ?? null);
      typedOver.current = undefined;
      setDraft(null);
      return;
    }
    const sent = draft;
    const outcome = await saver.save(section, field, value);
    // Keep what was typed until it is stored; a newer draft typed meanwhile stays.
    if (outcome === 'saved' || outcome === 'conflict') setDraft((now) => (now === sent ? null : now));
  }

  function onKeyDown(event: KeyboardEvent<HTMLInputElement>) {
    if (event.key === 'Enter' && !event.nativeEvent.isComposing) {
      event.preventDefault();
      focusNextField(event.currentTarget);
    } else if (event.key === 'Escape' && draft !== null) {
      event.preventDefault();
      setDraft(null);
    }
  }

  const invalid = state?.status === 'error' || state?.status === 'conflict';
  const common = {
    id,
    'data-record-field': true,
    value: shownText,
    readOnly: readOnlyReason !== null,
    'aria-invalid': invalid || undefined,
    'aria-describedby': `${id}-status${hint ? ` ${id}-hint` : ''}`,
    onChange: (event: { target: { value: string } }) => {
      if (draft === null) typedOver.current = stored ?? null;
      setDraft(event.target.value);
    },
    onBlur: () => void commit(),
    className: controlClass,
  };

  return (
    <div className={`space-y-1 ${className ?? ''}`}>
      <label htmlFor={id} className="block font-medium">
        {label}
      </label>
      {kind === 'multiline' ? (
        <textarea {...common} rows={3} />
      ) : (
        <input
          {...common}
          onKeyDown={onKeyDown}
          autoComplete="off"
          inputMode={kind === 'number' ? 'decimal' : undefined}
          placeholder={kind === 'date' ? 'YYYY-MM-DD' : undefined}
        />
      )}
      {hint && (
        <p id={`${id}-hint`} className="text-xs text-muted">
          {hint}
        </p>
      )}
      <FieldStatus id={id} section={section} field={field} state={state} onTakeTheirs={() => setDraft(null)} />
    </div>
  );
}

export const TextField = (props: FieldProps) => <DraftField {...props} kind="text" />;
export const LongTextField = (props: FieldProps) => <DraftField {...props} kind="multiline" />;
export const NumberField = (props: FieldProps) => <DraftField {...props} kind="number" />;
export const DateField = (props: FieldProps) => <DraftField {...props} kind="date" />;

/** A choice of the record: saved as soon as it changes. The blank choice stores null. */
export function ChoiceField({
  section,
  field,
  label,
  hint,
  className,
  options,
  asNumber = false,
}: FieldProps & { options: readonly { value: string; label: string }[]; asNumber?: boolean }) {
  const { detail, saver, readOnlyReason } = useRecord();
  const state = useFieldState(section, field);
  const stored = (detail.record[section].data as Record<string, unknown>)[field];
  const id = fieldDomId(section, field);
  const pending = state?.status === 'saving' || state?.status === 'error' ? state.value : state?.status === 'conflict' ? state.mine : stored;
  const shown = pending === null || pending === undefined ? '' : String(pending);

  return (
    <div className={`space-y-1 ${className ?? ''}`}>
      <label htmlFor={id} className="block font-medium">
        {label}
      </label>
      <select
        id={id}
        data-record-field
        value={shown}
        disabled={readOnlyReason !== null}
        aria-invalid={state?.status === 'error' || state?.status === 'conflict' || undefined}
        aria-describedby={`${id}-status${hint ? ` ${id}-hint` : ''}`}
        onChange={(event) => {
          const text = event.target.value;
          void saver.save(section, field, text === '' ? null : asNumber ? Number(text) : text);
        }}
        onKeyDown={(event) => {
          if (event.key === 'Enter' && !event.nativeEvent.isComposing) {
            event.preventDefault();
            focusNextField(event.currentTarget);
          }
        }}
        className={controlClass}
      >
        <option value="">—</option>
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
      {hint && (
        <p id={`${id}-hint`} className="text-xs text-muted">
          {hint}
        </p>
      )}
      <FieldStatus id={id} section={section} field={field} state={state} options={options} />
    </div>
  );
}

/** Options from a list of values shown as they are. */
export const plainOptions = (values: readonly string[]) => values.map((value) => ({ value, label: value }));
