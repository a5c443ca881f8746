import { useCallback, useLayoutEffect, useState, type RefObject } from 'react';

/**
 * For a modal dialog that mounts when it opens: remembers what had the focus before it opened and
 * gives it back.
 *
 * The element is read while the dialog first renders, before any `autoFocus` inside it moves the
 * focus. `returnFocus()` gives it back at once (call it before running a command, so the command
 * starts from where the tester was); unmounting gives it back too, unless the focus has already
 * moved somewhere outside the dialog.
 */
export function useReturnFocus(dialogRef: RefObject<HTMLElement | null>): () => void {
  const [previous] = useState<Element | null>(() => (typeof document === 'object' ? document.activeElement : null));

  const returnFocus = useCallback(() => {
    if (previous instanceof HTMLElement && previous.isConnected) previous.focus();
  }, [previous]);

  useLayoutEffect(() => {
    const dialog = dialogRef.current;
    return () => {
      const active = document.activeElement;
      const focusIsLost = active === null || active === document.body || (dialog?.contains(active) ?? false);
      if (focusIsLost) returnFocus();
    };
  }, [dialogRef, returnFocus]);

  return returnFocus;
}
