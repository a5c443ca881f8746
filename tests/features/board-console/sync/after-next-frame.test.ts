import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { afterNextFrame } from '../../../../src/features/board-console/sync/after-next-frame.ts';

beforeEach(() => vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'requestAnimationFrame', 'cancelAnimationFrame'] }));
afterEach(() => vi.useRealTimers());

describe('afterNextFrame', () => {
  it('when the next frame is drawn, then the task runs just after it, once', () => {
    const task = vi.fn();
    afterNextFrame(task);
    expect(task).not.toHaveBeenCalled();
    vi.advanceTimersToNextFrame();
    expect(task).not.toHaveBeenCalled();
    vi.advanceTimersByTime(1);
    expect(task).toHaveBeenCalledTimes(1);
    vi.advanceTimersByTime(1000);
    expect(task).toHaveBeenCalledTimes(1);
  });

  it('when no frame comes (a hidden tab), then the task runs after the fallback wait', () => {
    const frames = vi.spyOn(globalThis, 'requestAnimationFrame').mockImplementation(() => 1);
    const task = vi.fn();
    afterNextFrame(task, 100);
    vi.advanceTimersByTime(99);
    expect(task).not.toHaveBeenCalled();
    vi.advanceTimersByTime(1);
    expect(task).toHaveBeenCalledTimes(1);
    frames.mockRestore();
  });

  it('when cancelled before it ran, then the task never runs', () => {
    const task = vi.fn();
    const cancel = afterNextFrame(task);
    cancel();
    vi.advanceTimersToNextFrame();
    vi.advanceTimersByTime(1000);
    expect(task).not.toHaveBeenCalled();
  });
});
