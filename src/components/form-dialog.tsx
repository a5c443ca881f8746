import { useId, useLayoutEffect, useRef, type KeyboardEvent as ReactKeyboardEvent, type ReactNode } from 'react';
import { createPortal } from 'react-dom';
import { useReturnFocus } from '../lib/commands/use-return-focus.ts';

const FOCUSABLE = 'input:not([disabled]):not([type="hidden"]), select:not([disabled]), textarea:not([disabled]), button:not([disabled]), a[href], [tabindex]:not([tabindex="-1"])';

export interface FormDialogProps {
  title: string;
  onClose: () => void;
  children: ReactNode;
  /** A wide dialog (a table such as an import's preview) instead of a form's width. */
  wide?: boolean;
}

/**
 * A modal dialog around a form: the first field takes the cursor, Tab and Shift+Tab stay inside,
 * Esc closes it and the focus goes back to where it was. Keys pressed inside do not reach the
 * page's shortcuts.
 */
export function FormDialog({ title, onClose, children, wide = false }: FormDialogProps) {
  const dialogRef = useRef<HTMLDivElement>(null);
  const returnFocus = useReturnFocus(dialogRef);
  const titleId = useId();

  useLayoutEffect(() => {
    // A field that asked for the cursor (React's autoFocus) keeps it; otherwise the first field.
    if (dialogRef.current?.contains(document.activeElement)) return;
    const first = dialogRef.current?.querySelector<HTMLElement>('input, select, textarea');
    (first ?? dialogRef.current)?.focus();
  }, []);

  const close = () => {
    returnFocus();
    onClose();
  };

  const onKeyDown = (event: ReactKeyboardEvent<HTMLDivElement>) => {
    event.stopPropagation();
    if (event.nativeEvent.isComposing) return;
    if (event.key === 'Escape') {
      event.preventDefault();
      close();
    } else if (event.key === 'Tab') {
      const focusables = [...(dialogRef.current?.querySelectorAll<HTMLElement>(FOCUSABLE) ?? [])];
      if (focusables.length === 0) return;
      const index = focusables.indexOf(document.activeElement as HTMLElement);
      const last = focusables.length - 1;
      if (event.shiftKey && index <= 0) {
        event.preventDefault();
        focusables[last]!.focus();
      } else if (!event.shiftKey && index === last) {
        event.preventDefault();
        focusables[0]!.focus();
      }
    }
  };

  if (typeof document !== 'object') return null;
  return createPortal(
    <div
      className="fixed inset-0 z-40 flex items-start justify-center overflow-auto bg-ink/30 p-4 pt-[6vh]"
      onMouseDown={(event) => {
        if (event.target === event.currentTarget) close();
      }}
    >
      <div
        ref={dialogRef}
        role="dialog"
        aria-modal="true"
        aria-labelledby={titleId}
        tabIndex={-1}
        onKeyDown={onKeyDown}
        className={`w-full ${wide ? 'max-w-6xl' : 'max-w-xl'} rounded-md border border-line-strong bg-surface shadow-xl focus:outline-none`}
      >
        <div className="flex items-center justify-between border-b border-line px-4 py-2">
          <h2 id={titleId} className="font-semibold">
            {title}
          </h2>
          <button type="button" onClick={close} className="rounded border border-line-strong px-2 py-0.5 text-sm hover:bg-accent-soft">
            Close <span className="text-muted">(Esc)</span>
          </button>
        </div>
        <div className="px-4 py-3">{children}</div>
      </div>
    </div>,
    document.body,
  );
}
