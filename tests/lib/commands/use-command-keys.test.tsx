import { fireEvent, render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { createRegistry, type CommandRegistry } from '../../../src/lib/commands/registry.ts';
import type { Command } from '../../../src/lib/commands/types.ts';
import { useCommandKeys, type CommandKeysOptions } from '../../../src/lib/commands/use-command-keys.ts';

interface Ctx {
  locked: boolean;
}

function Harness({ registry, ctx, options }: { registry: CommandRegistry<Ctx>; ctx: Ctx; options?: CommandKeysOptions<Ctx> }) {
  useCommandKeys(registry, ctx, options);
  return (
    <div>
      <button type="button">grid</button>
      <input aria-label="Quick entry" />
      <textarea aria-label="Remarks" />
      <div aria-label="Editable" contentEditable suppressContentEditableWarning>
        text
      </div>
      <input aria-label="Tick" type="checkbox" />
    </div>
  );
}

function setup(commands: Command<Ctx>[], ctx: Ctx = { locked: false }, options?: CommandKeysOptions<Ctx>) {
  const registry = createRegistry(commands);
  const utils = render(<Harness registry={registry} ctx={ctx} options={options} />);
  return { ...utils, user: userEvent.setup(), registry };
}

describe('useCommandKeys', () => {
  it('runs a command on its key, with the ctx of the latest render', async () => {
    const run = vi.fn();
    const palette: Command<Ctx> = { id: 'palette', label: 'Open the palette', group: 'General', shortcut: '$mod+k', run };
    const { user, rerender, registry } = setup([palette]);
    rerender(<Harness registry={registry} ctx={{ locked: true }} />);
    screen.getByRole('button', { name: 'grid' }).focus();
    await user.keyboard('{Control>}k{/Control}');
    expect(run).toHaveBeenCalledTimes(1);
    expect(run).toHaveBeenCalledWith({ locked: true }, {});
  });

  it('binds a shortcut written with odd case (shift+?) so that it fires', async () => {
    const run = vi.fn();
    const { user } = setup([{ id: 'keys', label: 'Show keys', group: 'Help', shortcut: 'shift+?', run }]);
    await user.keyboard('{Shift>}?{/Shift}');
    expect(run).toHaveBeenCalledTimes(1);
  });

  it('ignores keys typed while an input method is composing', () => {
    const run = vi.fn();
    setup([{ id: 'palette', label: 'Palette', group: 'General', shortcut: '$mod+k', run }]);
    fireEvent.keyDown(window, { key: 'k', code: 'KeyK', ctrlKey: true, isComposing: true });
    fireEvent.keyDown(window, { key: 'k', code: 'KeyK', ctrlKey: true, keyCode: 229 });
    expect(run).not.toHaveBeenCalled();
    fireEvent.keyDown(window, { key: 'k', code: 'KeyK', ctrlKey: true });
    expect(run).toHaveBeenCalledTimes(1);
  });

  it('ignores events already handled', () => {
    const run = vi.fn();
    setup([{ id: 'palette', label: 'Palette', group: 'General', shortcut: '$mod+k', run }]);
    const grid = screen.getByRole('button', { name: 'grid' });
    grid.addEventListener('keydown', (event) => event.preventDefault());
    fireEvent.keyDown(grid, { key: 'k', code: 'KeyK', ctrlKey: true });
    expect(run).not.toHaveBeenCalled();
  });

  it('lets plain keys type in text fields, but not shortcuts with a modifier', async () => {
    const keys = vi.fn();
    const palette = vi.fn();
    const { user } = setup([
      { id: 'keys', label: 'Show keys', group: 'Help', shortcut: 'Shift+?', run: keys },
      { id: 'palette', label: 'Palette', group: 'General', shortcut: '$mod+k', run: palette },
    ]);
    const line = screen.getByRole('textbox', { name: 'Quick entry' });
    await user.click(line);
    await user.keyboard('7 zs ?');
    expect(line).toHaveValue('7 zs ?');
    await user.click(screen.getByRole('textbox', { name: 'Remarks' }));
    await user.keyboard('{Shift>}?{/Shift}');
    fireEvent.keyDown(screen.getByLabelText('Editable'), { key: '?', shiftKey: true });
    expect(keys).not.toHaveBeenCalled();

    await user.click(screen.getByRole('checkbox', { name: 'Tick' }));
    await user.keyboard('{Shift>}?{/Shift}');
    expect(keys).toHaveBeenCalledTimes(1);

    await user.click(line);
    await user.keyboard('{Control>}k{/Control}');
    expect(palette).toHaveBeenCalledTimes(1);
  });

  it("does nothing on a disabled command's key but report the reason", async () => {
    const run = vi.fn();
    const onUnavailable = vi.fn();
    const { user } = setup(
      [{ id: 'lock', label: 'Lock the board', group: 'Board', shortcut: 'Alt+l', when: (ctx) => (ctx.locked ? 'The board is locked.' : true), run }],
      { locked: true },
      { onUnavailable },
    );
    await user.keyboard('{Alt>}l{/Alt}');
    expect(run).not.toHaveBeenCalled();
    expect(onUnavailable).toHaveBeenCalledWith(expect.objectContaining({ id: 'lock' }), 'The board is locked.');
  });

  it('hands a command with params to onNeedsArgs instead of running it', async () => {
    const run = vi.fn();
    const onNeedsArgs = vi.fn();
    const { user } = setup(
      [{ id: 'lim', label: 'Mark a limitation', group: 'Cells', shortcut: 'Alt+m', params: [{ name: 'reason', label: 'Reason', kind: 'text', required: true }], run }],
      { locked: false },
      { onNeedsArgs },
    );
    await user.keyboard('{Alt>}m{/Alt}');
    expect(run).not.toHaveBeenCalled();
    expect(onNeedsArgs).toHaveBeenCalledWith(expect.objectContaining({ id: 'lim' }));
  });

  it('refuses to bind a command with params when nothing can ask for them', () => {
    const registry = createRegistry<Ctx>([
      { id: 'lim', label: 'Mark a limitation', group: 'Cells', shortcut: 'Alt+m', params: [{ name: 'reason', label: 'Reason', kind: 'text' }], run: () => {} },
    ]);
    const spy = vi.spyOn(console, 'error').mockImplementation(() => {});
    expect(() => render(<Harness registry={registry} ctx={{ locked: false }} />)).toThrow(/pass onNeedsArgs/);
    spy.mockRestore();
  });

  it('unbinds when disabled and on unmount', async () => {
    const run = vi.fn();
    const registry = createRegistry<Ctx>([{ id: 'palette', label: 'Palette', group: 'General', shortcut: '$mod+k', run }]);
    const user = userEvent.setup();
    const { rerender, unmount } = render(<Harness registry={registry} ctx={{ locked: false }} options={{ enabled: false }} />);
    await user.keyboard('{Control>}k{/Control}');
    expect(run).not.toHaveBeenCalled();
    rerender(<Harness registry={registry} ctx={{ locked: false }} />);
    await user.keyboard('{Control>}k{/Control}');
    expect(run).toHaveBeenCalledTimes(1);
    unmount();
    fireEvent.keyDown(window, { key: 'k', ctrlKey: true });
    expect(run).toHaveBeenCalledTimes(1);
  });
});
