import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { StrictMode, useState } from 'react';
import { describe, expect, it } from 'vitest';
import { KeysOverlay, type KeysSection } from '../../../src/components/keys-overlay.tsx';
import { createRegistry } from '../../../src/lib/commands/registry.ts';
import type { Command } from '../../../src/lib/commands/types.ts';

interface Ctx {
  role: 'tester' | 'reviewer';
}

const commands: Command<Ctx>[] = [
  { id: 'general.palette', label: 'Open the command palette', group: 'General', shortcut: '$mod+k', run: () => {} },
  { id: 'general.keys', label: 'Show the keys', group: 'General', shortcut: 'Shift+?', run: () => {} },
  { id: 'circuits.insert', label: 'Insert a circuit', group: 'Circuits', run: () => {} },
  {
    id: 'board.lock',
    label: 'Lock the board',
    group: 'Board',
    shortcut: 'Alt+l',
    when: (ctx) => (ctx.role === 'reviewer' ? true : 'Only a reviewer can lock a board.'),
    run: () => {},
  },
];

const gridKeys: KeysSection = {
  title: 'Grid',
  rows: [
    { label: 'Commit and move down the column', keys: ['Enter'] },
    { label: 'Commit and move up', keys: ['Shift+Enter'] },
  ],
};
const words: KeysSection = {
  title: 'Quick-entry column words',
  note: 'Type a circuit, then column words and values.',
  rows: [{ label: 'Zs: Maximum measured earth fault loop impedance', words: ['zs'] }],
};

/** The text of an element as a screen reader reads it: aria-hidden parts left out, blocks spaced. */
function spokenText(element: Element): string {
  const parts: string[] = [];
  const visit = (node: Node) => {
    if (node instanceof Element && node.getAttribute('aria-hidden') === 'true') return;
    const block = node instanceof HTMLElement && node.classList.contains('block');
    if (block) parts.push(' ');
    if (node.nodeType === Node.TEXT_NODE) parts.push(node.textContent ?? '');
    else node.childNodes.forEach(visit);
    if (block) parts.push(' ');
  };
  element.childNodes.forEach(visit);
  return parts.join('').replace(/\s+/g, ' ').trim();
}

function Harness() {
  const [open, setOpen] = useState(false);
  return (
    <>
      <button type="button" onClick={() => setOpen(true)}>
        Keys
      </button>
      <KeysOverlay
        open={open}
        onOpenChange={setOpen}
        registry={createRegistry(commands)}
        ctx={{ role: 'tester' }}
        sections={[gridKeys, words]}
        platform="other"
      />
    </>
  );
}

describe('KeysOverlay', () => {
  it('lists every command with a shortcut under its group, then the extra sections; Esc closes', async () => {
    const user = userEvent.setup();
    render(
      <StrictMode>
        <Harness />
      </StrictMode>,
    );
    const opener = screen.getByRole('button', { name: 'Keys' });
    opener.focus();
    await user.keyboard('{Enter}');

    const dialog = screen.getByRole('dialog', { name: 'Keys' });
    expect(dialog).toHaveFocus();
    const rows = (name: string) =>
      within(within(dialog).getByRole('region', { name }))
        .getAllByRole('row')
        .slice(1)
        .map((row) => within(row).getAllByRole('cell').map(spokenText).join(' | '));

    expect(rows('General')).toEqual(['Ctrl+K | Open the command palette', 'Shift+? | Show the keys']);
    expect(rows('Board')).toEqual(['Alt+L | Lock the board Not now: Only a reviewer can lock a board.']);
    expect(within(dialog).queryByRole('region', { name: 'Circuits' })).not.toBeInTheDocument();
    expect(within(dialog).queryByText('Insert a circuit')).not.toBeInTheDocument();
    expect(rows('Grid')).toEqual(['Enter | Commit and move down the column', 'Shift+Enter | Commit and move up']);
    expect(rows('Quick-entry column words')).toEqual(['zs | Zs: Maximum measured earth fault loop impedance']);

    await user.keyboard('{Tab}');
    expect(within(dialog).getByRole('button', { name: /Close/ })).toHaveFocus();
    await user.keyboard('{Escape}');
    expect(screen.queryByRole('dialog')).not.toBeInTheDocument();
    expect(opener).toHaveFocus();
  });
});
