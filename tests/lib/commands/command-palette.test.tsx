import { act, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { StrictMode, useState } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { CommandPalette } from '../../../src/components/command-palette.tsx';
import { createRegistry, type CommandRegistry } from '../../../src/lib/commands/registry.ts';
import type { Command } from '../../../src/lib/commands/types.ts';

interface Ctx {
  role: 'tester' | 'reviewer';
}

function commands(overrides: { lock?: Command<Ctx>['run']; polarity?: Command<Ctx>['run']; spur?: Command<Ctx>['run']; lim?: Command<Ctx>['run'] } = {}) {
  const list: Command<Ctx>[] = [
    { id: 'cells.polarity', label: 'Tick polarity on the selected circuits', group: 'Cells', keywords: ['pol', 'tick'], shortcut: 'Alt+p', run: overrides.polarity ?? (() => {}) },
    {
      id: 'cells.lim',
      label: 'Mark a limitation',
      group: 'Cells',
      keywords: ['lim'],
      params: [{ name: 'reason', label: 'Reason', kind: 'text', required: true, placeholder: 'why the test could not be done' }],
      run: overrides.lim ?? (() => {}),
    },
    {
      id: 'circuits.link-spur',
      label: 'Link a spur to its ring',
      group: 'Circuits',
      params: [
        { name: 'ring', label: 'Ring', kind: 'choice', required: true, options: () => [{ value: '4', label: 'Circuit 4 · Kitchen sockets' }, { value: '9', label: 'Circuit 9 · Upstairs sockets' }] },
        { name: 'origin', label: 'Origin point', kind: 'text', required: true, initial: 'socket 1' },
        { name: 'lengthM', label: 'Spur length (m)', kind: 'number' },
        { name: 'csa', label: 'Spur csa', kind: 'choice', options: () => [{ value: '2.5', label: '2.5 mm²' }, { value: '4', label: '4 mm²' }] },
      ],
      run: overrides.spur ?? (() => {}),
    },
    {
      id: 'board.lock',
      label: 'Lock the board',
      group: 'Board',
      when: (ctx) => (ctx.role === 'reviewer' ? true : 'Only a reviewer can lock a board.'),
      run: overrides.lock ?? (() => {}),
    },
  ];
  return createRegistry(list);
}

function Harness({ registry, ctx, commandId }: { registry: CommandRegistry<Ctx>; ctx: Ctx; commandId?: string }) {
  const [open, setOpen] = useState(false);
  return (
    <>
      <button type="button" onClick={() => setOpen(true)}>
        Open palette
      </button>
      <CommandPalette open={open} onOpenChange={setOpen} registry={registry} ctx={ctx} commandId={commandId} platform="other" />
      {open && (
        <button type="button" onClick={() => setOpen(false)}>
          Close from outside
        </button>
      )}
    </>
  );
}

async function openPalette(registry: CommandRegistry<Ctx>, ctx: Ctx = { role: 'tester' }, commandId?: string) {
  const user = userEvent.setup();
  // StrictMode, as in the app: its rehearsed unmount must not move the focus out of the palette.
  render(
    <StrictMode>
      <Harness registry={registry} ctx={ctx} commandId={commandId} />
    </StrictMode>,
  );
  const opener = screen.getByRole('button', { name: 'Open palette' });
  opener.focus();
  await user.keyboard('{Enter}');
  return { user, opener, dialog: screen.getByRole('dialog', { name: 'Command palette' }) };
}

const optionNames = (dialog: HTMLElement) => within(dialog).queryAllByRole('option').map((o) => o.getAttribute('aria-label'));

describe('CommandPalette', () => {
  it('lists every command under its group, with its shortcut, and the search field has the focus', async () => {
    const { dialog } = await openPalette(commands());
    expect(within(dialog).getByRole('combobox')).toHaveFocus();
    expect(within(dialog).getByRole('group', { name: 'Cells' })).toBeInTheDocument();
    expect(within(dialog).getByRole('group', { name: 'Board' })).toBeInTheDocument();
    expect(optionNames(dialog)).toEqual([
      'Tick polarity on the selected circuits, Alt+P',
      'Mark a limitation…',
      'Link a spur to its ring…',
      'Lock the board, not available: Only a reviewer can lock a board.',
    ]);
  });

  it('filters as you type (keywords too) and runs the chosen command on Enter, giving the focus back first', async () => {
    let focusedWhenRun: Element | null = null;
    const polarity = vi.fn(() => {
      focusedWhenRun = document.activeElement;
    });
    const { user, dialog, opener } = await openPalette(commands({ polarity }));
    await user.keyboard('pol');
    expect(optionNames(dialog)).toEqual(['Tick polarity on the selected circuits, Alt+P']);
    await user.keyboard('{Enter}');
    expect(polarity).toHaveBeenCalledWith({ role: 'tester' }, {});
    expect(screen.queryByRole('dialog')).not.toBeInTheDocument();
    expect(focusedWhenRun).toBe(opener);
    expect(opener).toHaveFocus();
  });

  it('shows a disabled command greyed with its reason; Enter on it says why and runs nothing', async () => {
    const lock = vi.fn();
    const { user, dialog } = await openPalette(commands({ lock }));
    const item = within(dialog).getByRole('option', { name: /Lock the board/ });
    expect(item).toHaveAttribute('data-unavailable', 'true');
    expect(item).toHaveTextContent('Not available: Only a reviewer can lock a board.');
    await user.keyboard('lock');
    expect(optionNames(dialog)).toEqual(['Lock the board, not available: Only a reviewer can lock a board.']);
    expect(within(dialog).getByRole('option', { name: /Lock the board/ })).toHaveAttribute('aria-selected', 'true');
    await user.keyboard('{Enter}');
    expect(lock).not.toHaveBeenCalled();
    expect(within(dialog).getByRole('status')).toHaveTextContent('Lock the board: Only a reviewer can lock a board.');
    expect(screen.getByRole('dialog')).toBeInTheDocument();
    // The filter is left clean for the next try.
    expect(within(dialog).getByRole('combobox')).toHaveValue('');
  });

  it('runs the same command for a reviewer', async () => {
    const lock = vi.fn();
    const { user } = await openPalette(commands({ lock }), { role: 'reviewer' });
    await user.keyboard('lock{Enter}');
    expect(lock).toHaveBeenCalledTimes(1);
  });

  it('asks for each param in turn in the same dialog and passes the values to run', async () => {
    const spur = vi.fn();
    const { user, dialog } = await openPalette(commands({ spur }));
    await user.keyboard('spur{Enter}');

    // A choice: a filtered list.
    const ring = within(dialog).getByRole('combobox', { name: 'Ring' });
    expect(ring).toHaveFocus();
    await user.keyboard('upstairs');
    expect(within(dialog).getAllByRole('option').map((o) => o.textContent)).toEqual(['Circuit 9 · Upstairs sockets']);
    await user.keyboard('{Enter}');

    // A required text with an initial value.
    const origin = within(dialog).getByRole('textbox', { name: 'Origin point' });
    expect(origin).toHaveFocus();
    expect(origin).toHaveValue('socket 1');
    await user.clear(origin);
    await user.keyboard('{Enter}');
    expect(within(dialog).getByRole('alert')).toHaveTextContent('Origin point is required.');
    await user.keyboard('socket 4{Enter}');

    // An optional number: checked, then given.
    const length = within(dialog).getByRole('textbox', { name: /Spur length/ });
    await user.keyboard('two{Enter}');
    expect(within(dialog).getByRole('alert')).toHaveTextContent('Spur length (m) must be a number');
    await user.clear(length);
    await user.keyboard('3.5{Enter}');

    // An optional choice: the options first, then a way to leave it empty.
    expect(within(dialog).getAllByRole('option').map((o) => o.textContent)).toEqual(['2.5 mm²', '4 mm²', 'Leave empty']);
    await user.keyboard('4{Enter}');

    expect(spur).toHaveBeenCalledWith({ role: 'tester' }, { ring: '9', origin: 'socket 4', lengthM: '3.5', csa: '4' });
    expect(screen.queryByRole('dialog')).not.toBeInTheDocument();
  });

  it('leaves an optional param out when it is left empty', async () => {
    const spur = vi.fn();
    const { user } = await openPalette(commands({ spur }));
    await user.keyboard('spur{Enter}{Enter}{Enter}{Enter}empty{Enter}');
    expect(spur).toHaveBeenCalledWith({ role: 'tester' }, { ring: '4', origin: 'socket 1' });
  });

  it('goes back one step on Esc keeping what was typed, then to the list, then closes and gives the focus back', async () => {
    const lim = vi.fn();
    const { user, dialog, opener } = await openPalette(commands({ lim }));
    await user.keyboard('spur{Enter}{Enter}');
    expect(within(dialog).getByRole('textbox', { name: 'Origin point' })).toHaveFocus();
    await user.keyboard('{Escape}');
    expect(within(dialog).getByRole('combobox', { name: 'Ring' })).toHaveFocus();
    expect(within(dialog).getByRole('option', { name: 'Circuit 4 · Kitchen sockets' })).toHaveAttribute('aria-selected', 'true');
    await user.keyboard('{Escape}');
    expect(within(dialog).getByRole('combobox', { name: 'Commands' })).toHaveFocus();
    expect(within(dialog).getByRole('option', { name: 'Link a spur to its ring…' })).toHaveAttribute('aria-selected', 'true');
    await user.keyboard('{Escape}');
    expect(screen.queryByRole('dialog')).not.toBeInTheDocument();
    expect(opener).toHaveFocus();
    expect(lim).not.toHaveBeenCalled();
  });

  it('opens straight at a command’s first param when asked, and Esc there closes', async () => {
    const lim = vi.fn();
    const { user, dialog, opener } = await openPalette(commands({ lim }), { role: 'tester' }, 'cells.lim');
    const reason = within(dialog).getByRole('textbox', { name: 'Reason' });
    expect(reason).toHaveFocus();
    await user.keyboard('{Escape}');
    expect(screen.queryByRole('dialog')).not.toBeInTheDocument();
    expect(opener).toHaveFocus();
    await user.keyboard('{Enter}');
    await user.keyboard('no access behind the kitchen units{Enter}');
    expect(lim).toHaveBeenCalledWith({ role: 'tester' }, { reason: 'no access behind the kitchen units' });
  });

  it('keeps Tab inside the dialog and keys from reaching the page', async () => {
    const { user, dialog } = await openPalette(commands());
    const onPageKey = vi.fn();
    window.addEventListener('keydown', onPageKey);
    await user.keyboard('{Tab}x');
    expect(within(dialog).getByRole('combobox')).toHaveFocus();
    expect(onPageKey).not.toHaveBeenCalled();
    window.removeEventListener('keydown', onPageKey);
  });

  it('gives the focus back when the app closes it', async () => {
    const { dialog, opener } = await openPalette(commands());
    expect(within(dialog).getByRole('combobox')).toHaveFocus();
    act(() => screen.getByRole('button', { name: 'Close from outside' }).click());
    await waitFor(() => expect(opener).toHaveFocus());
    expect(screen.queryByRole('dialog')).not.toBeInTheDocument();
  });

  describe('ranking and loose matches', () => {
    function rankingCommands(removed = vi.fn()) {
      return createRegistry<Ctx>([
        { id: 't.lock', label: 'Lock the board', group: 'Board', changesData: true, when: () => 'Only a reviewer can lock a board.', run: () => {} },
        { id: 't.locate', label: 'Show where the board is located', group: 'Board', run: () => {} },
        { id: 't.block', label: 'Fill a block of cells', group: 'Cells', changesData: true, run: () => {} },
        { id: 't.remove', label: 'Remove the circuit', group: 'Circuits', changesData: true, run: removed },
        { id: 't.rename', label: 'Rename the circuit', group: 'Circuits', run: () => {} },
      ]);
    }

    it('when words are typed, then commands that can run come first, and a prefix ranks above a word inside, above a loose match', async () => {
      const { user, dialog } = await openPalette(rankingCommands());
      await user.keyboard('loc');
      // "loc" starts "located" (prefix) and is inside "block" (a word inside); "Lock" is a prefix too
      // but cannot run now, so it comes last.
      expect(optionNames(dialog)).toEqual(['Show where the board is located', 'Fill a block of cells', 'Lock the board, not available: Only a reviewer can lock a board.']);
      expect(within(dialog).getAllByRole('option')[0]).toHaveAttribute('aria-selected', 'true');
    });

    it('when a command that removes data is chosen by a loose match, then it asks first; Esc goes back and nothing runs', async () => {
      const removed = vi.fn();
      const { user, dialog } = await openPalette(rankingCommands(removed));
      await user.keyboard('rmvc');
      expect(within(dialog).getAllByRole('option')[0]).toHaveAttribute('data-match', 'fuzzy');
      expect(optionNames(dialog)[0]).toBe('Remove the circuit');
      await user.keyboard('{Enter}');
      expect(removed).not.toHaveBeenCalled();
      expect(within(dialog).getByText(/only loosely matches this command/)).toBeInTheDocument();
      await user.keyboard('{Escape}');
      expect(removed).not.toHaveBeenCalled();
      expect(within(dialog).getByRole('combobox')).toBeInTheDocument();
    });

    it('when it is confirmed with Enter, then it runs; chosen by its words it runs without asking', async () => {
      const removed = vi.fn();
      const { user, dialog } = await openPalette(rankingCommands(removed));
      await user.keyboard('rmvc{Enter}');
      expect(within(dialog).getByRole('button', { name: /Yes, go on/ })).toHaveFocus();
      await user.keyboard('{Enter}');
      expect(removed).toHaveBeenCalledTimes(1);
      await user.click(screen.getByRole('button', { name: 'Open palette' }));
      await user.keyboard('remove{Enter}');
      expect(removed).toHaveBeenCalledTimes(2);
    });
  });
});
