import { useEffect, useId, useRef, useState, type KeyboardEvent as ReactKeyboardEvent, type Ref } from 'react';
import type { ColumnKey } from '../../../../shared/schemas/columns.ts';
import { describeShortcut, detectPlatform, type KeyPlatform } from '../../../lib/commands/shortcut.ts';
import {
  describeEntries,
  parseQuickEntry,
  previewCircuit,
  QUICK_ENTRY_UNDO_KEY,
  type QuickEntry,
  type QuickEntryCircuit,
} from './parse-quick-entry.ts';

export interface QuickEntryLineProps {
  circuits: ReadonlyArray<QuickEntryCircuit>;
  /** Where a value typed straight after a circuit number goes. */
  activeColumn: ColumnKey;
  /** A line was read without a mistake: write these cells (in the order typed). */
  onApply: (entries: QuickEntry[]) => void;
  /** The undo key was pressed on an empty line: take back the last entry applied. */
  onUndoLast: () => void;
  /** Esc was pressed: give the focus back to the grid. */
  onLeave: () => void;
  /**
   * The parent's own word on the last thing it did with an entry ("Undid Zs on circuit 7", "Circuit 7
   * is locked"): shown in the line's status whenever it changes, in place of the line's summary.
   */
  lastApplied?: string;
  /** As the line is typed: the circuit it is heading for (undefined while it names none), so the grid can follow. */
  onPreview?: (circuit: QuickEntryCircuit | undefined) => void;
  /** The input element, so the console can focus the line with its own key. */
  ref?: Ref<HTMLInputElement>;
  className?: string;
  platform?: KeyPlatform;
}

function withMod(event: ReactKeyboardEvent, platform: KeyPlatform): boolean {
  const mod = platform === 'apple' ? event.metaKey : event.ctrlKey;
  const other = platform === 'apple' ? event.ctrlKey : event.metaKey;
  return mod && !other && !event.altKey;
}

function isUndoKey(event: ReactKeyboardEvent, platform: KeyPlatform): boolean {
  return withMod(event, platform) && !event.shiftKey && event.key.toLowerCase() === 'z';
}

/** $mod+Z, $mod+Shift+Z, $mod+Y: the text field's own undo and redo while it holds text. */
function isTextUndoRedo(event: ReactKeyboardEvent, platform: KeyPlatform): boolean {
  const key = event.key.toLowerCase();
  return withMod(event, platform) && (key === 'z' || (key === 'y' && !event.shiftKey));
}

/**
 * The quick-entry line for dictation: "7 zs .44 ir >200" and Enter writes Zs and L-E of circuit 7.
 *
 * Keys in the line:
 * - Enter reads the line. A mistake is said in words (an alert) and the text stays for fixing; a
 *   good line is handed to `onApply`, cleared, and what went where is announced politely.
 * - $mod+Z on an empty line calls `onUndoLast`. With text in the line, $mod+Z (and redo) is the
 *   text field's own, and is kept from the page's key bindings (the grid's undo of cell edits).
 * - ↑ on an empty line brings back the last line applied (to fix a slip after undoing it).
 * - Esc calls `onLeave`; the text stays for when the typist comes back.
 *
 * The grammar is `parseQuickEntry`'s. Where the line sits and which key focuses it is the console's.
 */
export function QuickEntryLine({
  circuits,
  activeColumn,
  onApply,
  onUndoLast,
  onLeave,
  lastApplied,
  onPreview,
  ref,
  className,
  platform = detectPlatform(),
}: QuickEntryLineProps) {
  const [text, setText] = useState('');
  const [error, setError] = useState('');
  const [status, setStatus] = useState('');
  const lastLine = useRef('');
  const previewed = useRef<number | undefined>(undefined);
  const inputId = useId();
  const hintId = useId();
  const errorId = useId();

  useEffect(() => {
    if (lastApplied) setStatus(lastApplied);
  }, [lastApplied]);

  const preview = (line: string) => {
    if (!onPreview) return;
    const circuit = previewCircuit(line, { circuits, activeColumn });
    if (circuit?.id === previewed.current) return;
    previewed.current = circuit?.id;
    onPreview(circuit);
  };

  const apply = () => {
    const result = parseQuickEntry(text, { circuits, activeColumn });
    if (!result.ok) {
      setError(result.message);
      return;
    }
    onApply(result.entries);
    lastLine.current = text;
    setText('');
    setError('');
    setStatus(`${describeEntries(result.entries)}.`);
  };

  const onKeyDown = (event: ReactKeyboardEvent<HTMLInputElement>) => {
    if (event.nativeEvent.isComposing || event.defaultPrevented) return;
    if (event.key === 'Enter') {
      event.preventDefault();
      apply();
    } else if (event.key === 'Escape') {
      event.preventDefault();
      onLeave();
    } else if (text === '' && isUndoKey(event, platform)) {
      event.preventDefault();
      onUndoLast();
    } else if (text !== '' && isTextUndoRedo(event, platform)) {
      // The field undoes its own typing; the page's undo of cell edits must not hear this key.
      event.stopPropagation();
    } else if (text === '' && event.key === 'ArrowUp' && lastLine.current !== '') {
      event.preventDefault();
      setText(lastLine.current);
      preview(lastLine.current);
    }
  };

  return (
    <div className={className}>
      <div className="flex items-center gap-2">
        <label htmlFor={inputId} className="shrink-0 font-medium">
          Quick entry
        </label>
        <input
          ref={ref}
          id={inputId}
          type="text"
          autoComplete="off"
          autoCorrect="off"
          spellCheck={false}
          value={text}
          placeholder="e.g. 7 zs .44 ir >200"
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${errorId} ${hintId}` : hintId}
          onChange={(event) => {
            setText(event.target.value);
            setError('');
            preview(event.target.value);
          }}
          onKeyDown={onKeyDown}
          className="min-w-0 flex-1 rounded border border-line-strong bg-surface px-2 py-1 font-mono outline-none focus:border-accent aria-invalid:border-danger"
        />
      </div>
      <p id={hintId} className="mt-0.5 text-xs text-muted">
        Enter writes · {describeShortcut(QUICK_ENTRY_UNDO_KEY, platform)} on an empty line undoes the last entry · ↑ recalls
        the last line · Esc returns to the grid
      </p>
      {/* One line for the answer, of fixed height: a mistake replaces the last answer (it does not
          stack under it), and the grid below does not move when either appears. */}
      <div className="relative mt-0.5 h-5 text-sm">
        <p aria-live="polite" className={`truncate text-ok ${error ? 'invisible' : ''}`} title={status || undefined}>
          {error ? '' : status}
        </p>
        {error && (
          <p id={errorId} role="alert" className="absolute inset-0 truncate text-danger" title={error}>
            {error}
          </p>
        )}
      </div>
    </div>
  );
}
