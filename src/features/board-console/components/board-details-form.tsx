import { useId, useState, type FormEvent, type KeyboardEvent } from 'react';
import { boardSchema, updateBoardBodySchema, type BoardDetail, type UpdateBoardBody } from '../../../../shared/schemas/boards.ts';
import { ApiError } from '../../../lib/api-client.ts';
import { updateBoard } from '../api/update-board.ts';

type Board = BoardDetail['board'];

interface Draft {
  zdbOhm: string;
  ipfKa: string;
  location: string;
  suppliedFrom: string;
  instruments: string;
  polarityConfirmed: boolean;
  phaseSequenceConfirmed: boolean;
}

const draftOf = (board: Board): Draft => ({
  zdbOhm: board.zdbOhm === null ? '' : String(board.zdbOhm),
  ipfKa: board.ipfKa === null ? '' : String(board.ipfKa),
  location: board.location,
  suppliedFrom: board.suppliedFrom,
  instruments: board.instruments,
  polarityConfirmed: board.polarityConfirmed,
  phaseSequenceConfirmed: board.phaseSequenceConfirmed,
});

/** A number field's text as the schema wants it: empty is "not recorded"; units typed are taken off. */
function numberOrNull(text: string, unit: RegExp): number | null | string {
  const t = text.trim().replace(unit, '').trim();
  if (t === '') return null;
  return /^(\d+\.?\d*|\.\d+)$/.test(t) ? Number(t) : text;
}

/** Only the fields that differ from the board as loaded. */
function changesOf(board: Board, draft: Draft): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  const zdb = numberOrNull(draft.zdbOhm, /(Ω|ohms?)$/i);
  const ipf = numberOrNull(draft.ipfKa, /ka$/i);
  if (zdb !== board.zdbOhm) out.zdbOhm = zdb;
  if (ipf !== board.ipfKa) out.ipfKa = ipf;
  for (const key of ['location', 'suppliedFrom', 'instruments'] as const) if (draft[key] !== board[key]) out[key] = draft[key];
  for (const key of ['polarityConfirmed', 'phaseSequenceConfirmed'] as const) if (draft[key] !== board[key]) out[key] = draft[key];
  return out;
}

export interface BoardDetailsFormProps {
  board: Board;
  onClose: (message?: string) => void;
}

/**
 * The board's own details, edited in the console's header: Zdb, Ipf, location, supplied from,
 * instruments, polarity and phase sequence confirmed. Saved with the board's version, as every
 * change to the board is: if someone changed them meanwhile (409), their values are put in the
 * form and nothing of mine is lost from view — the typist looks and saves again. Enter saves from
 * any field, Esc closes without saving. Errors show at their field, in words.
 */
export function BoardDetailsForm({ board, onClose }: BoardDetailsFormProps) {
  const [base, setBase] = useState(board);
  const [draft, setDraft] = useState(() => draftOf(board));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState('');
  const [saving, setSaving] = useState(false);
  const id = useId();

  const set = <K extends keyof Draft>(key: K, value: Draft[K]) => {
    setDraft((d) => ({ ...d, [key]: value }));
    setErrors((e) => ({ ...e, [key]: '' }));
  };

  const submit = async (event?: FormEvent) => {
    event?.preventDefault();
    const changes = changesOf(base, draft);
    if (Object.keys(changes).length === 0) {
      onClose('Board details unchanged.');
      return;
    }
    const parsed = updateBoardBodySchema.safeParse({ version: base.version, changes });
    if (!parsed.success) {
      const next: Record<string, string> = {};
      for (const issue of parsed.error.issues) next[String(issue.path[issue.path.length - 1] ?? '')] = issue.message.startsWith('Invalid input') ? 'Write a number, e.g. 0.35.' : issue.message;
      setErrors(next);
      return;
    }
    setSaving(true);
    try {
      await updateBoard(base.id, parsed.data as UpdateBoardBody);
      onClose('Board details saved.');
    } catch (error) {
      if (error instanceof ApiError && error.status === 409) {
        const current = boardSchema.safeParse((error.details as { current?: { board?: unknown } } | undefined)?.current?.board ?? (error.details as { current?: unknown })?.current);
        if (current.success) {
          setBase(current.data);
          setDraft(draftOf(current.data));
        }
        setMessage(`${error.message} The form now shows what is saved; type your change again and save.`);
      } else if (error instanceof ApiError && error.issues.length > 0) {
        const next: Record<string, string> = {};
        for (const issue of error.issues) next[issue.path.replace(/^changes\./, '')] = issue.message;
        setErrors(next);
      } else {
        setMessage(error instanceof Error ? error.message : 'Not saved.');
      }
    } finally {
      setSaving(false);
    }
  };

  const onKeyDown = (event: KeyboardEvent<HTMLFormElement>) => {
    event.stopPropagation();
    if (event.key === 'Escape') {
      event.preventDefault();
      onClose();
    }
  };

  const text = (key: 'zdbOhm' | 'ipfKa' | 'location' | 'suppliedFrom' | 'instruments', label: string, width: string, autoFocus = false) => (
    <div className="flex flex-col">
      <label htmlFor={`${id}-${key}`} className="text-xs text-muted">
        {label}
      </label>
      <input
        id={`${id}-${key}`}
        autoFocus={autoFocus}
        value={draft[key]}
        onChange={(e) => set(key, e.target.value)}
        aria-invalid={errors[key] ? true : undefined}
        aria-describedby={errors[key] ? `${id}-${key}-error` : undefined}
        className={`${width} rounded border border-line-strong px-1.5 py-0.5 outline-none focus:border-accent aria-invalid:border-danger`}
      />
      {errors[key] && (
        <span id={`${id}-${key}-error`} className="text-xs text-danger">
          {errors[key]}
        </span>
      )}
    </div>
  );

  return (
    <form aria-label="Board details" onSubmit={submit} onKeyDown={onKeyDown} className="shrink-0 border-b border-line bg-paper px-3 py-2">
      <div className="flex flex-wrap items-end gap-3">
        {text('zdbOhm', 'Zdb (Ω)', 'w-20', true)}
        {text('ipfKa', 'Ipf (kA)', 'w-20')}
        {text('location', 'Location', 'w-40')}
        {text('suppliedFrom', 'Supplied from', 'w-40')}
        {text('instruments', 'Instruments (serial, calibration date)', 'w-72')}
        <label className="flex items-center gap-1 text-sm">
          <input type="checkbox" checked={draft.polarityConfirmed} onChange={(e) => set('polarityConfirmed', e.target.checked)} />
          Polarity confirmed
        </label>
        {base.phases === 3 && (
          <label className="flex items-center gap-1 text-sm">
            <input type="checkbox" checked={draft.phaseSequenceConfirmed} onChange={(e) => set('phaseSequenceConfirmed', e.target.checked)} />
            Phase sequence confirmed
          </label>
        )}
        <button type="submit" disabled={saving} className="rounded border border-accent bg-accent px-2 py-0.5 text-white disabled:opacity-60">
          {saving ? 'Saving…' : 'Save (Enter)'}
        </button>
        <button type="button" onClick={() => onClose()} className="rounded border border-line-strong px-2 py-0.5">
          Close (Esc)
        </button>
      </div>
      {message && (
        <p role="alert" className="mt-1 text-sm text-danger">
          {message}
        </p>
      )}
    </form>
  );
}
