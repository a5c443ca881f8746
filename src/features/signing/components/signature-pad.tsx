import { useEffect, useRef, type KeyboardEvent, type PointerEvent, type RefObject } from 'react';

/** The pad's drawing size in canvas pixels (scaled to the box on screen; the PNG is this size). */
export const padWidth = 600;
export const padHeight = 200;

/**
 * A box to sign in with a mouse, a pen or a finger (pointer events, so all three work the same
 * way). It is focusable: Delete or Backspace clears it, and the Clear button does too. The parent
 * reads the drawing from `canvasRef` (a transparent PNG, ink only) when the form is sent.
 */
export function SignaturePad({
  canvasRef,
  label,
  describedBy,
  onInkChange,
}: {
  canvasRef: RefObject<HTMLCanvasElement | null>;
  label: string;
  describedBy?: string;
  onInkChange: (hasInk: boolean) => void;
}) {
  const drawing = useRef<{ x: number; y: number } | null>(null);

  useEffect(() => {
    const context = canvasRef.current?.getContext('2d');
    if (!context) return;
    context.lineCap = 'round';
    context.lineJoin = 'round';
    context.lineWidth = 3;
    context.strokeStyle = '#14181d';
  }, [canvasRef]);

  /** Where the pointer is in canvas pixels, whatever size the box is shown at. */
  function point(canvas: HTMLCanvasElement, clientX: number, clientY: number) {
    const box = canvas.getBoundingClientRect();
    return {
      x: ((clientX - box.left) / (box.width || padWidth)) * canvas.width,
      y: ((clientY - box.top) / (box.height || padHeight)) * canvas.height,
    };
  }

  function handlePointerDown(event: PointerEvent<HTMLCanvasElement>) {
    if (event.button !== 0) return;
    event.preventDefault();
    event.currentTarget.focus();
    event.currentTarget.setPointerCapture?.(event.pointerId);
    const at = point(event.currentTarget, event.clientX, event.clientY);
    drawing.current = at;
    const context = event.currentTarget.getContext('2d');
    if (!context) return;
    // A dot for a tap, so a full stop or the dot of an i shows.
    context.beginPath();
    context.arc(at.x, at.y, context.lineWidth / 2, 0, Math.PI * 2);
    context.fillStyle = context.strokeStyle;
    context.fill();
    onInkChange(true);
  }

  function handlePointerMove(event: PointerEvent<HTMLCanvasElement>) {
    const from = drawing.current;
    if (!from) return;
    const context = event.currentTarget.getContext('2d');
    if (!context) return;
    // Coalesced events keep a fast stroke smooth where the browser offers them.
    const events = event.nativeEvent.getCoalescedEvents?.() ?? [];
    const canvas = event.currentTarget;
    const points = (events.length > 0 ? events : [event]).map((e) => point(canvas, e.clientX, e.clientY));
    context.beginPath();
    context.moveTo(from.x, from.y);
    for (const p of points) context.lineTo(p.x, p.y);
    context.stroke();
    drawing.current = points[points.length - 1]!;
  }

  function handlePointerEnd() {
    drawing.current = null;
  }

  function handleKeyDown(event: KeyboardEvent<HTMLCanvasElement>) {
    if (event.key === 'Delete' || event.key === 'Backspace') {
      event.preventDefault();
      clearPad(canvasRef.current);
      onInkChange(false);
    }
  }

  return (
    <canvas
      ref={canvasRef}
      width={padWidth}
      height={padHeight}
      tabIndex={0}
      role="img"
      aria-label={label}
      aria-describedby={describedBy}
      onPointerDown={handlePointerDown}
      onPointerMove={handlePointerMove}
      onPointerUp={handlePointerEnd}
      onPointerCancel={handlePointerEnd}
      onKeyDown={handleKeyDown}
      // touch-action none: a finger draws instead of scrolling the page.
      className="block aspect-[3/1] w-full max-w-xl cursor-crosshair touch-none rounded border border-dashed border-line-strong bg-surface"
    />
  );
}

export function clearPad(canvas: HTMLCanvasElement | null): void {
  canvas?.getContext('2d')?.clearRect(0, 0, canvas.width, canvas.height);
}

/** The drawing as a PNG (null when the browser cannot make one). */
export function padToPng(canvas: HTMLCanvasElement): Promise<Blob | null> {
  return new Promise((resolve) => canvas.toBlob((blob) => resolve(blob), 'image/png'));
}
