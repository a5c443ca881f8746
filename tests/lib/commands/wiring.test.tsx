import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { StrictMode, useMemo, useState } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { CommandPalette } from '../../../src/components/command-palette.tsx';
import { KeysOverlay } from '../../../src/components/keys-overlay.tsx';
import { createGeneralCommands } from '../../../src/lib/commands/general-commands.ts';
import { createRegistry } from '../../../src/lib/commands/registry.ts';
import type { Command } from '../../../src/lib/commands/types.ts';
import { useCommandKeys } from '../../../src/lib/commands/use-command-keys.ts';

interface Ctx {
  circuit: string;
}

/** How an app puts the pieces together: one registry, its keys, the palette and the overlay. */
function Console({ markLimitation }: { markLimitation: Command<Ctx>['run'] }) {
  const [palette, setPalette] = useState<{ open: boolean; commandId?: string }>({ open: false });
  const [keysOpen, setKeysOpen] = useState(false);
  const registry = useMemo(
    () =>
      createRegistry<Ctx>([
        ...createGeneralCommands<Ctx>({ openPalette: () => setPalette({ open: true }), showKeys: () => setKeysOpen(true) }),
        {
          id: 'cells.mark-limitation',
          label: 'Mark a limitation',
          group: 'Cells',
          shortcut: 'Alt+m',
          params: [{ name: 'reason', label: 'Reason', kind: 'text', required: true }],
          run: markLimitation,
        },
      ]),
    [markLimitation],
  );
  const ctx = { circuit: '7' };
  useCommandKeys(registry, ctx, { onNeedsArgs: (command) => setPalette({ open: true, commandId: command.id }) });
  return (
    <>
      <button type="button">Zs of circuit 7</button>
      <CommandPalette
        open={palette.open}
        commandId={palette.commandId}
        onOpenChange={(open) => setPalette({ open })}
        registry={registry}
        ctx={ctx}
        platform="other"
      />
      <KeysOverlay open={keysOpen} onOpenChange={setKeysOpen} registry={registry} ctx={ctx} platform="other" />
    </>
  );
}

describe('registry, keys, palette and overlay together', () => {
  it('runs everything from the keyboard and always comes back to the cell', async () => {
    const markLimitation = vi.fn();
    const user = userEvent.setup();
    render(
      <StrictMode>
        <Console markLimitation={markLimitation} />
      </StrictMode>,
    );
    const cell = screen.getByRole('button', { name: 'Zs of circuit 7' });
    cell.focus();

    await user.keyboard('{Control>}k{/Control}');
    const palette = screen.getByRole('dialog', { name: 'Command palette' });
    await user.keyboard('limitation{Enter}');
    expect(within(palette).getByRole('textbox', { name: 'Reason' })).toHaveFocus();
    await user.keyboard('no access{Enter}');
    expect(markLimitation).toHaveBeenLastCalledWith({ circuit: '7' }, { reason: 'no access' });
    expect(cell).toHaveFocus();

    await user.keyboard('{Alt>}m{/Alt}');
    expect(screen.getByRole('textbox', { name: 'Reason' })).toHaveFocus();
    await user.keyboard('locked cupboard{Enter}');
    expect(markLimitation).toHaveBeenLastCalledWith({ circuit: '7' }, { reason: 'locked cupboard' });
    expect(cell).toHaveFocus();

    await user.keyboard('{Shift>}?{/Shift}');
    const overlay = screen.getByRole('dialog', { name: 'Keys' });
    expect(within(overlay).getByText('Mark a limitation')).toBeInTheDocument();
    expect(within(overlay).getByText('Open the command palette')).toBeInTheDocument();
    await user.keyboard('{Escape}');
    expect(screen.queryByRole('dialog')).not.toBeInTheDocument();
    expect(cell).toHaveFocus();
  });
});
