/**
 * Runs `task` once, after the browser has drawn its next frame: from a key's handler, the work
 * waits until the key's effect is on screen. Where no frame comes (a hidden tab draws none, and
 * there may be no DOM at all), it runs after `fallbackMs` instead. Returns a function that
 * cancels the task if it has not run yet.
 */
export function afterNextFrame(task: () => void, fallbackMs = 100): () => void {
  let settled = false;
  const timers: Array<ReturnType<typeof setTimeout>> = [];
  let frame: number | null = null;
  const cancel = () => {
    settled = true;
    for (const timer of timers) clearTimeout(timer);
    if (frame !== null && typeof cancelAnimationFrame === 'function') cancelAnimationFrame(frame);
  };
  const run = () => {
    if (settled) return;
    cancel();
    task();
  };
  // A frame callback runs just before the frame is drawn; the timeout from it, just after.
  if (typeof requestAnimationFrame === 'function') {
    frame = requestAnimationFrame(() => {
      frame = null;
      timers.push(setTimeout(run, 0));
    });
  }
  timers.push(setTimeout(run, fallbackMs));
  return cancel;
}
