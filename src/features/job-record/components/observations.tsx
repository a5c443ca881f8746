import { useId, useState, type FormEvent } from 'react';
import { inspectionAreas, inspectionItemsById } from '../../../../shared/schemas/inspection-items.ts';
import { observationCodes, observationSchema, type Observation, type ObservationCode } from '../../../../shared/schemas/job-record.ts';
import { zodFormErrors, type FormErrors } from '../../../lib/form-errors.ts';
import { useBoardCircuits } from '../api/get-board-circuits.ts';
import { controlClass } from './record-fields.tsx';
import { RecordSection } from './record-sections.tsx';
import { useFieldState, useRecord } from './record-context.tsx';
import { useSyncExternalStore } from 'react';

/** What each classification code means, in words. */
export const codeMeanings: Record<ObservationCode, string> = {
  C1: 'danger present: act at once',
  C2: 'potentially dangerous: act urgently',
  C3: 'improvement recommended',
  FI: 'further investigation needed without delay',
};

/** A new observation's id, made here so two people can add observations at once (works over plain HTTP too). */
export function newObservationId(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(5));
  return `o-${[...bytes].map((b) => b.toString(16).padStart(2, '0')).join('')}`;
}

/** The next free observation number: one more than the highest. */
export function nextObservationNumber(observations: Record<string, Observation | null>): number {
  return Math.max(0, ...Object.values(observations).flatMap((o) => (o ? [o.number] : []))) + 1;
}

/** Observations as shown: the stored ones with any being saved, in number order. */
export function useObservationList(): Array<[string, Observation]> {
  const { detail, saver } = useRecord();
  useSyncExternalStore(saver.subscribe, () => saver.revision);
  const merged: Record<string, Observation | null> = { ...detail.record.observations.data };
  for (const id of Object.keys(merged)) {
    const state = saver.state('observations', id);
    if (state?.status === 'saving') merged[id] = state.value as Observation | null;
  }
  return Object.entries(merged)
    .filter((entry): entry is [string, Observation] => entry[1] !== null)
    .sort((a, b) => a[1].number - b[1].number);
}

/** Their version of an observation after a conflict, in a few words. */
function theirsText(theirs: unknown): string {
  if (theirs === null) return ': they removed it';
  const o = theirs as Partial<Observation>;
  return o.text ? `: theirs reads “${o.text}”${o.code ? ` (${o.code})` : ''}` : '';
}

/** What the form opens with: an observation to edit, or a new one with some fields chosen. */
export interface ObservationFormTarget {
  id?: string;
  preset?: Partial<Observation>;
}

export function ObservationsSection({ onOpen }: { onOpen: (target: ObservationFormTarget) => void }) {
  const { detail, saver, readOnlyReason } = useRecord();
  const list = useObservationList();
  const [confirming, setConfirming] = useState<string | null>(null);
  const boards = new Map(detail.boards.map((b) => [b.id, b.reference]));

  return (
    <RecordSection
      section="observations"
      title="Observations"
      intro={
        <p>
          Each observation carries a code: {observationCodes.map((code) => `${code} ${codeMeanings[code]}`).join(' · ')}. Any C1, C2 or FI makes the
          installation unsatisfactory.
        </p>
      }
    >
      {list.length === 0 && <p className="text-muted">No observations yet.</p>}
      <ol className="space-y-2">
        {list.map(([id, o]) => (
          <li key={id} className="rounded border border-line p-2">
            <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
              <span className="font-semibold">Observation {o.number}</span>
              <span className={o.code === 'C1' || o.code === 'C2' || o.code === 'FI' ? 'font-semibold text-danger' : ''}>
                {o.code ? `${o.code} — ${codeMeanings[o.code]}` : 'not coded yet'}
              </span>
              {saver.state('observations', id)?.status === 'saving' && <span className="text-xs text-muted">saving…</span>}
            </div>
            <p>{o.text}</p>
            <p className="text-xs text-muted">
              {[
                o.location && `at ${o.location}`,
                o.boardId && `board ${boards.get(o.boardId) ?? o.boardId}`,
                o.inspectionItem && `inspection item ${o.inspectionItem}`,
              ]
                .filter(Boolean)
                .join(' · ')}
            </p>
            <div className="mt-1 flex gap-2">
              <button
                type="button"
                disabled={readOnlyReason !== null}
                onClick={() => onOpen({ id })}
                className="rounded border border-line-strong px-2 py-0.5 hover:bg-accent-soft"
                aria-label={`Edit observation ${o.number}`}
              >
                Edit
              </button>
              {confirming === id ? (
                <span className="flex items-center gap-2">
                  <span>Remove observation {o.number}?</span>
                  <button
                    type="button"
                    autoFocus
                    onClick={() => {
                      setConfirming(null);
                      void saver.save('observations', id, null);
                    }}
                    onKeyDown={(event) => {
                      if (event.key === 'Escape') setConfirming(null);
                    }}
                    className="rounded border border-danger px-2 py-0.5 text-danger"
                  >
                    Yes, remove it
                  </button>
                  <button type="button" onClick={() => setConfirming(null)} className="rounded border border-line-strong px-2 py-0.5">
                    Keep it
                  </button>
                </span>
              ) : (
                <button
                  type="button"
                  disabled={readOnlyReason !== null}
                  onClick={() => setConfirming(id)}
                  className="rounded border border-line-strong px-2 py-0.5 hover:bg-danger-soft"
                  aria-label={`Remove observation ${o.number}`}
                >
                  Remove
                </button>
              )}
            </div>
          </li>
        ))}
      </ol>
      <button
        type="button"
        disabled={readOnlyReason !== null}
        onClick={() => onOpen({})}
        className="rounded border border-line-strong px-2 py-1 hover:bg-accent-soft"
      >
        Add an observation
      </button>
    </RecordSection>
  );
}

const formFields = ['number', 'text', 'location', 'code', 'boardId', 'circuitId', 'inspectionItem'] as const;
type FormField = (typeof formFields)[number];

/**
 * Adds or edits one observation. Checked with the record's own schema first; saved as one field
 * of the observations section (keyed by its id), so two people can work on different ones.
 */
export function ObservationForm({ target, onDone }: { target: ObservationFormTarget; onDone: () => void }) {
  const { detail, saver } = useRecord();
  const list = useObservationList();
  const [id] = useState(() => target.id ?? newObservationId());
  const existing = target.id ? detail.record.observations.data[target.id] : null;
  const initial: Observation = existing ?? {
    number: nextObservationNumber(detail.record.observations.data),
    text: '',
    location: '',
    code: null,
    boardId: null,
    circuitId: null,
    inspectionItem: null,
    ...target.preset,
  };
  const [boardId, setBoardId] = useState<number | null>(initial.boardId);
  const circuits = useBoardCircuits(boardId);
  const [errors, setErrors] = useState<FormErrors<FormField> | null>(null);
  const [pending, setPending] = useState(false);
  const state = useFieldState('observations', id);
  const baseId = useId();
  const fid = (field: FormField) => `${baseId}-${field}`;

  async function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (pending) return;
    const data = new FormData(event.currentTarget);
    const text = (name: FormField) => String(data.get(name) ?? '');
    const numberText = text('number').trim();
    const candidate = {
      number: /^\d+$/.test(numberText) ? Number(numberText) : numberText,
      text: text('text'),
      location: text('location'),
      code: text('code') || null,
      boardId: boardId,
      circuitId: text('circuitId') ? Number(text('circuitId')) : null,
      inspectionItem: text('inspectionItem') || null,
    };
    const parsed = observationSchema.safeParse(candidate);
    let found: FormErrors<FormField> = parsed.success ? { fields: {} } : zodFormErrors(parsed.error, formFields);
    if (!parsed.success && typeof candidate.number !== 'number') found.fields.number = 'The number is a whole number, e.g. 4.';
    const clash = list.find(([otherId, o]) => otherId !== id && o.number === candidate.number);
    if (clash) found = { ...found, fields: { ...found.fields, number: `Observation ${clash[1].number} already exists; the next free number is ${nextObservationNumber(detail.record.observations.data)}.` } };
    if (!parsed.success || clash) {
      setErrors(found);
      const first = formFields.find((f) => found.fields[f]);
      if (first) document.getElementById(fid(first))?.focus();
      return;
    }
    setErrors(null);
    setPending(true);
    const outcome = await saver.save('observations', id, parsed.data);
    setPending(false);
    if (outcome === 'saved') onDone();
  }

  // The server's own refusals (a board not on this job, a number taken meanwhile) name the field as `<id>.<field>`.
  const serverIssues = state?.status === 'error' ? (state.issues ?? []) : [];
  const serverError = (field: FormField) => serverIssues.find((issue) => issue.path.split('.').slice(-1)[0] === field && issue.path.includes(id))?.message;
  const fieldError = (field: FormField) => errors?.fields[field] ?? serverError(field);
  const control = (field: FormField) => ({
    id: fid(field),
    name: field,
    'aria-invalid': fieldError(field) ? true : undefined,
    'aria-describedby': fieldError(field) ? `${fid(field)}-error` : undefined,
  });
  const errorText = (field: FormField) =>
    fieldError(field) ? (
      <p id={`${fid(field)}-error`} className="text-danger">
        {fieldError(field)}
      </p>
    ) : null;

  return (
    <form
      noValidate
      aria-label={existing ? `Observation ${existing.number}` : 'New observation'}
      onSubmit={(event) => void handleSubmit(event)}
      onKeyDown={(event) => {
        // Enter saves from any field but the description (where it starts a new line; Ctrl+Enter saves there).
        if (event.key !== 'Enter' || event.nativeEvent.isComposing) return;
        if (event.target instanceof HTMLTextAreaElement && !(event.ctrlKey || event.metaKey)) return;
        if (event.target instanceof HTMLButtonElement) return;
        event.preventDefault();
        event.currentTarget.requestSubmit();
      }}
      className="space-y-3"
    >
      <div className="grid gap-3 sm:grid-cols-[6rem_1fr]">
        <div className="space-y-1">
          <label htmlFor={fid('number')} className="block font-medium">
            Number
          </label>
          <input {...control('number')} defaultValue={initial.number} inputMode="numeric" autoComplete="off" className={controlClass} />
          {errorText('number')}
        </div>
        <div className="space-y-1">
          <label htmlFor={fid('code')} className="block font-medium">
            Code
          </label>
          <select {...control('code')} defaultValue={initial.code ?? ''} className={controlClass}>
            <option value="">Not coded yet</option>
            {observationCodes.map((code) => (
              <option key={code} value={code}>
                {code} — {codeMeanings[code]}
              </option>
            ))}
          </select>
          {errorText('code')}
        </div>
      </div>
      <div className="space-y-1">
        <label htmlFor={fid('text')} className="block font-medium">
          What was observed
        </label>
        <textarea {...control('text')} autoFocus defaultValue={initial.text} rows={3} className={controlClass} />
        {errorText('text')}
      </div>
      <div className="space-y-1">
        <label htmlFor={fid('location')} className="block font-medium">
          Where
        </label>
        <input {...control('location')} defaultValue={initial.location} autoComplete="off" className={controlClass} />
        {errorText('location')}
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        <div className="space-y-1">
          <label htmlFor={fid('boardId')} className="block font-medium">
            Board
          </label>
          <select
            {...control('boardId')}
            value={boardId ?? ''}
            onChange={(event) => setBoardId(event.target.value ? Number(event.target.value) : null)}
            className={controlClass}
          >
            <option value="">Not tied to a board</option>
            {detail.boards.map((board) => (
              <option key={board.id} value={board.id}>
                {board.reference}
                {board.location ? ` — ${board.location}` : ''}
              </option>
            ))}
          </select>
          {errorText('boardId')}
        </div>
        <div className="space-y-1">
          <label htmlFor={fid('circuitId')} className="block font-medium">
            Circuit
          </label>
          <select {...control('circuitId')} key={boardId ?? 'none'} defaultValue={initial.boardId === boardId ? (initial.circuitId ?? '') : ''} disabled={boardId === null} className={controlClass}>
            <option value="">{boardId === null ? 'Choose a board first' : circuits.isPending ? 'Loading circuits…' : 'The board as a whole'}</option>
            {(circuits.data ?? []).map((circuit) => (
              <option key={circuit.id} value={circuit.id}>
                {circuit.number} {circuit.description}
              </option>
            ))}
          </select>
          {errorText('circuitId')}
        </div>
      </div>
      <div className="space-y-1">
        <label htmlFor={fid('inspectionItem')} className="block font-medium">
          Inspection item
        </label>
        <select {...control('inspectionItem')} defaultValue={initial.inspectionItem ?? ''} className={controlClass}>
          <option value="">Not tied to an inspection item</option>
          {inspectionAreas.map((area) => (
            <optgroup key={area.id} label={`${area.id}. ${area.title}`}>
              {area.items.map((item) => (
                <option key={item.id} value={item.id}>
                  {item.id} {item.text}
                </option>
              ))}
            </optgroup>
          ))}
        </select>
        {errorText('inspectionItem')}
        {initial.inspectionItem && <p className="text-xs text-muted">Raised from item {initial.inspectionItem}: {inspectionItemsById.get(initial.inspectionItem)?.text}</p>}
      </div>
      <div className="space-y-2">
        <button type="submit" aria-disabled={pending || undefined} className="rounded bg-accent px-3 py-1.5 font-medium text-white hover:bg-accent-hover aria-disabled:opacity-70">
          {pending ? 'Saving…' : 'Save the observation'}
        </button>
        <p className="text-xs text-muted">Enter saves (Ctrl+Enter in the description) · Esc closes without saving</p>
        <div role="alert" className="text-danger empty:hidden">
          {state?.status === 'error' && !formFields.some((field) => serverError(field)) && state.message}
          {state?.status === 'conflict' && (
            <span className="flex flex-wrap items-center gap-2">
              <span>Someone else changed this observation since you opened it{theirsText(state.theirs)}.</span>
              <button
                type="button"
                className="rounded border border-line-strong bg-surface px-2 py-0.5 text-ink"
                onClick={() => void saver.keepMine('observations', id).then((outcome) => outcome === 'saved' && onDone())}
              >
                Keep mine
              </button>
              <button
                type="button"
                className="rounded border border-line-strong bg-surface px-2 py-0.5 text-ink"
                onClick={() => {
                  saver.takeTheirs('observations', id);
                  onDone();
                }}
              >
                Take theirs
              </button>
            </span>
          )}
        </div>
      </div>
    </form>
  );
}
