import { useCallback, useLayoutEffect, useState, type RefObject } from 'react';

/**
 * For a modal dialog that mounts when it opens: remembers what had the focus before it opened and
 * gives it back.
 *
 * The element is read while the dialog first renders, before any `autoFocus` inside it moves the
 * focus. `returnFocus()` gives it back at once (call it before running a command, so the command
 * starts from where the tester was); unmounting (the parent closed the dialog) gives it back too,
 * unless the focus has already gone somewhere else on the page.
 */
export function useReturnFocus(dialogRef: RefObject<HTMLElement | null>): () => void {
  const [previous] = useState<Element | null>(() => (typeof document === 'object' ? document.activeElement : null));

  const returnFocus = useCallback(() => {
    if (previous instanceof HTMLElement && previous.isConnected) previous.focus();
  }, [previous]);

  useLayoutEffect(() => {
    const dialog = dialogRef.current;
    return () => {
      // Decide once React has finished: StrictMode rehearses an unmount in development without
      // removing the dialog, and then the focus must stay where it is.
      queueMicrotask(() => {
        if (dialog?.isConnected) return;
        const active = document.activeElement;
        if (active === null || active === document.body) returnFocus();
      });
    };
  }, [dialogRef, returnFocus]);

  return returnFocus;
}
