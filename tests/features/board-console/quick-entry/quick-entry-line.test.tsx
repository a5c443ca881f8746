import { fireEvent, render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createRef } from 'react';
import { describe, expect, it, vi } from 'vitest';
import type { ColumnKey } from '../../../../shared/schemas/columns.ts';
import type { QuickEntryCircuit } from '../../../../src/features/board-console/quick-entry/parse-quick-entry.ts';
import { QuickEntryLine } from '../../../../src/features/board-console/quick-entry/quick-entry-line.tsx';

const circuits: QuickEntryCircuit[] = [
  { id: 107, number: '7' },
  { id: 108, number: '8' },
  { id: 202, number: '3L2' },
];

function setup(props: { activeColumn?: ColumnKey; lastApplied?: string } = {}) {
  const onApply = vi.fn();
  const onUndoLast = vi.fn();
  const onLeave = vi.fn();
  const onPreview = vi.fn();
  const ref = createRef<HTMLInputElement>();
  const element = (extra: { lastApplied?: string }) => (
    <QuickEntryLine
      ref={ref}
      circuits={circuits}
      activeColumn={props.activeColumn ?? 'zs'}
      onApply={onApply}
      onUndoLast={onUndoLast}
      onLeave={onLeave}
      onPreview={onPreview}
      lastApplied={extra.lastApplied}
      platform="other"
    />
  );
  const utils = render(element({ lastApplied: props.lastApplied }));
  const input = screen.getByRole('textbox', { name: 'Quick entry' });
  return {
    ...utils,
    user: userEvent.setup(),
    input,
    ref,
    onApply,
    onUndoLast,
    onLeave,
    onPreview,
    rerenderWith: (extra: { lastApplied?: string }) => utils.rerender(element(extra)),
  };
}

describe('QuickEntryLine', () => {
  it('is a labelled input with an example and hands its ref to the console', () => {
    const { input, ref } = setup();
    expect(input).toHaveAttribute('placeholder', expect.stringContaining('7 zs .44'));
    expect(ref.current).toBe(input);
  });

  it('on Enter applies the entries, clears, and says what went where', async () => {
    const { user, input, onApply } = setup();
    input.focus();
    await user.keyboard('7 zs .44 ir >200 3l2 .31{Enter}');
    expect(onApply).toHaveBeenCalledWith([
      { circuitId: 107, circuitNumber: '7', column: 'zs', text: '.44' },
      { circuitId: 107, circuitNumber: '7', column: 'irLiveEarth', text: '>200' },
      { circuitId: 202, circuitNumber: '3L2', column: 'zs', text: '.31' },
    ]);
    expect(input).toHaveValue('');
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
    expect(screen.getByText('Wrote Zs .44, L-E >200 to circuit 7; Zs .31 to circuit 3L2.')).toHaveAttribute('aria-live', 'polite');
  });

  it('on a mistake says it in words, keeps the text and writes nothing', async () => {
    const { user, input, onApply } = setup();
    input.focus();
    await user.keyboard('17 .44{Enter}');
    expect(screen.getByRole('alert')).toHaveTextContent('there is no circuit 17 on this board');
    expect(input).toHaveValue('17 .44');
    expect(input).toHaveAttribute('aria-invalid', 'true');
    expect(input).toHaveAccessibleDescription(expect.stringContaining('there is no circuit 17 on this board'));
    expect(onApply).not.toHaveBeenCalled();
    // Fixing the text clears the message.
    await user.keyboard('{Home}{Delete}');
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
    await user.keyboard('{Enter}');
    expect(onApply).toHaveBeenCalledWith([{ circuitId: 107, circuitNumber: '7', column: 'zs', text: '.44' }]);
  });

  it('undoes the last entry with Ctrl+Z on an empty line; with text, Ctrl+Z is the field’s own', async () => {
    const { user, input, onUndoLast } = setup();
    const pageKeys = vi.fn();
    window.addEventListener('keydown', pageKeys);
    input.focus();
    await user.keyboard('7 .4');
    pageKeys.mockClear();
    await user.keyboard('{Control>}z{/Control}{Control>}{Shift>}z{/Shift}{/Control}');
    expect(onUndoLast).not.toHaveBeenCalled();
    // The page's own undo (of cell edits) does not hear the field's undo and redo.
    expect(pageKeys.mock.calls.map(([e]) => (e as KeyboardEvent).key.toLowerCase())).not.toContain('z');
    await user.clear(input);
    await user.keyboard('{Control>}z{/Control}');
    expect(onUndoLast).toHaveBeenCalledTimes(1);
    window.removeEventListener('keydown', pageKeys);
  });

  it('brings back the last line applied with ↑ on an empty line', async () => {
    const { user, input } = setup();
    input.focus();
    await user.keyboard('7 zs .44{Enter}{ArrowUp}');
    expect(input).toHaveValue('7 zs .44');
  });

  it('leaves for the grid on Esc, keeping the text', async () => {
    const { user, input, onLeave } = setup();
    input.focus();
    await user.keyboard('7 zs{Escape}');
    expect(onLeave).toHaveBeenCalledTimes(1);
    expect(input).toHaveValue('7 zs');
  });

  it('does not apply while an input method is composing', () => {
    const { input, onApply } = setup();
    fireEvent.change(input, { target: { value: '7 .44' } });
    fireEvent.keyDown(input, { key: 'Enter', isComposing: true });
    expect(onApply).not.toHaveBeenCalled();
    fireEvent.keyDown(input, { key: 'Enter' });
    expect(onApply).toHaveBeenCalledTimes(1);
  });

  it('tells the console which circuit the line is heading for as it is typed', async () => {
    const { user, input, onPreview } = setup();
    input.focus();
    await user.keyboard('7 zs .44 8');
    expect(onPreview.mock.calls.map(([c]) => c?.number)).toEqual(['7', '8']);
  });

  it("shows the console's own word on the last entry when it changes", async () => {
    const { rerenderWith } = setup();
    rerenderWith({ lastApplied: 'Undid Zs .44 on circuit 7.' });
    expect(screen.getByText('Undid Zs .44 on circuit 7.')).toHaveAttribute('aria-live', 'polite');
  });
});
