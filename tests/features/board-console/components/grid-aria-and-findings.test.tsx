import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { columns } from '../../../../shared/schemas/columns.ts';
import type { Finding } from '../../../../shared/schemas/findings.ts';
import { activeCell, boardDetail, cellOf, circuit, renderConsole } from './console-fixture.tsx';

const zsOverMax: Finding = {
  code: 'zs-over-max',
  severity: 'error',
  circuitId: 12,
  columns: ['zs'],
  message: 'Zs 1.52 Ω is over the maximum 1.37 Ω for a B32 at 0.4 s.',
  limit: '≤ 1.37 Ω',
  source: 'BS 7671:2018 Table 41.3',
};

const insulationLow: Finding = {
  code: 'ir-near-minimum',
  severity: 'warning',
  circuitId: 13,
  columns: ['irLiveEarth'],
  message: 'IR L-E 2 MΩ is low for a new circuit.',
  limit: '≥ 1.0 MΩ',
  source: 'BS 7671:2018 Table 64',
};

const boardNote: Finding = {
  code: 'board-note',
  severity: 'note',
  circuitId: null,
  columns: [],
  message: 'Phase sequence not confirmed.',
  limit: null,
  source: 'common practice',
};

function board() {
  return boardDetail([
    circuit(11, '1', { zs: '0.44' }),
    circuit(12, '2', { zs: '1.52' }, { kind: 'ring', description: 'Kitchen sockets' }),
    circuit(13, '3', { irLiveEarth: '2' }),
  ]);
}

describe('the grid for screen readers', () => {
  it('when the board shows, then the grid names its rows, columns, header rows and the active cell', () => {
    const { grid } = renderConsole(board());
    expect(grid).toHaveAttribute('aria-rowcount', '5');
    expect(grid).toHaveAttribute('aria-colcount', String(columns.length + 1));
    expect(grid).toHaveAccessibleName('Schedule of test results, board DB-T');
    const rows = within(grid).getAllByRole('row');
    expect(rows[0]).toHaveAttribute('aria-rowindex', '1');
    const loopColumns = columns.filter((c) => c.group === 'loop').length;
    expect(within(rows[0]!).getByRole('columnheader', { name: 'Loop impedance' })).toHaveAttribute('aria-colspan', String(loopColumns));
    expect(within(rows[1]!).getByRole('columnheader', { name: 'Zs (Ω)' })).toBeDefined();
    expect(rows[2]).toHaveAttribute('aria-rowindex', '3');
    expect(within(rows[2]!).getByRole('rowheader')).toHaveTextContent('1');
    const active = activeCell(grid);
    expect(active).toHaveAttribute('role', 'gridcell');
    expect(active).toHaveAttribute('aria-selected', 'true');
    expect(grid.querySelectorAll('[role="gridcell"][aria-selected="true"]')).toHaveLength(1);
  });

  it('when a cell has an error finding, then it is aria-invalid, shows a symbol and is described by the finding', () => {
    const { grid } = renderConsole(board(), { findings: [zsOverMax, insulationLow, boardNote] });
    const zs = cellOf(grid, '2', 'Zs');
    expect(zs).toHaveAttribute('aria-invalid', 'true');
    expect(zs).toHaveTextContent('✕');
    expect(zs).toHaveAccessibleDescription('Error: Zs 1.52 Ω is over the maximum 1.37 Ω for a B32 at 0.4 s. Limit ≤ 1.37 Ω.');

    const le = cellOf(grid, '3', 'L-E');
    expect(le).not.toHaveAttribute('aria-invalid');
    expect(le).toHaveTextContent('!');
    expect(le).toHaveAccessibleDescription('Warning: IR L-E 2 MΩ is low for a new circuit. Limit ≥ 1.0 MΩ.');

    expect(cellOf(grid, '1', 'Zs')).not.toHaveAttribute('aria-describedby');
  });

  it('when the cursor is on a cell with a finding, then the status line gives the finding, its limit and its source', async () => {
    const { grid, user } = renderConsole(board(), { findings: [zsOverMax] });
    await user.click(cellOf(grid, '2', 'Zs'));
    const footer = screen.getByRole('region', { name: 'Status line' });
    expect(footer).toHaveTextContent('Circuit 2 · Kitchen sockets');
    expect(footer).toHaveTextContent('Zs (Ω) — Maximum measured earth fault loop impedance');
    expect(footer).toHaveTextContent('Error: Zs 1.52 Ω is over the maximum 1.37 Ω for a B32 at 0.4 s.');
    expect(footer).toHaveTextContent('Limit ≤ 1.37 Ω · Source: BS 7671:2018 Table 41.3');
    expect(footer).toHaveTextContent('saved');
  });
});

describe('the findings list', () => {
  it('when a finding is chosen with Enter, then the cursor jumps to its cell and the focus returns to the grid', async () => {
    const { grid, user } = renderConsole(board(), { findings: [insulationLow, zsOverMax, boardNote] });
    const list = screen.getByRole('list', { name: 'Findings' });
    const items = within(list).getAllByRole('button');
    // Worst first.
    expect(items[0]).toHaveTextContent('Circuit 2 · Zs');
    expect(items[1]).toHaveTextContent('Circuit 3 · L-E');
    await user.keyboard('{Control>}{Shift>}f{/Shift}{/Control}');
    expect(document.activeElement).toBe(items[0]);
    await user.keyboard('{ArrowDown}{Enter}');
    expect(document.activeElement).toBe(grid);
    expect(activeCell(grid)).toBe(cellOf(grid, '3', 'L-E'));
  });

  it('when a severity is switched off, then its findings leave the list', async () => {
    const { user } = renderConsole(board(), { findings: [insulationLow, zsOverMax, boardNote] });
    await user.click(screen.getByRole('button', { name: /Errors 1/ }));
    const list = screen.getByRole('list', { name: 'Findings' });
    expect(within(list).queryByText(/Circuit 2/)).toBeNull();
    expect(within(list).getByText(/Circuit 3/)).toBeDefined();
  });
});

describe('readings not recorded yet', () => {
  const missing = (circuitId: number, columns: string[]): Finding => ({
    code: 'cells-missing',
    severity: 'todo',
    circuitId,
    columns,
    message: `Not recorded yet: ${columns.join(', ')}.`,
    limit: null,
    source: 'common practice',
  });

  it('when a half-typed board has faults and missing readings, then the faults are listed first and the missing readings are counted per column', async () => {
    const { grid, user } = renderConsole(board(), { findings: [missing(11, ['polarity', 'zs']), missing(13, ['zs']), zsOverMax] });
    const list = screen.getByRole('list', { name: 'Findings' });
    const buttons = within(list).getAllByRole('button');
    expect(buttons[0]).toHaveTextContent('Circuit 2 · Zs');
    const toDo = within(list).getByRole('listitem', { name: 'Readings not recorded yet' });
    expect(toDo).toHaveTextContent('Not recorded yet (3)');
    const counts = within(toDo).getAllByRole('button');
    expect(counts.map((b) => b.textContent)).toEqual([expect.stringMatching(/^Polarity1 circuit/), expect.stringMatching(/^Zs2 circuits/)]);
    expect(screen.getByRole('heading', { name: /Findings/ })).toHaveTextContent('(1 · 3 readings to do)');
    // A count jumps to the first circuit (in board order) still lacking that reading.
    await user.click(counts[1]!);
    expect(activeCell(grid)).toBe(cellOf(grid, '1', 'Zs'));
    // A missing reading is marked quietly: not invalid.
    expect(cellOf(grid, '3', 'Zs')).not.toHaveAttribute('aria-invalid');
    expect(cellOf(grid, '3', 'Zs')).toHaveTextContent('○');
  });
});

describe('conflicts', () => {
  it('when someone else wrote a cell first, then the cell shows both values and the two choices reach the sync engine', async () => {
    const { grid, user, resolved } = renderConsole(board(), {
      conflicts: [{ editId: 'e1', circuitId: 11, column: 'zs', mine: '0.45', theirs: '0.47', theirsBy: 'Ruth' }],
    });
    const cell = cellOf(grid, '1', 'Zs');
    expect(cell).toHaveTextContent('⇄');
    expect(cell).toHaveAccessibleDescription('Conflict: Ruth wrote “0.47”, you wrote “0.45”.');
    await user.click(screen.getByRole('button', { name: 'Circuit 1 · Zs: keep their value 0.47' }));
    await user.click(screen.getByRole('button', { name: 'Circuit 1 · Zs: write my value 0.45' }));
    expect(resolved).toEqual([
      { editId: 'e1', choice: 'keep-theirs' },
      { editId: 'e1', choice: 'overwrite' },
    ]);
  });
});

describe('conflicts from the keyboard', () => {
  it('when the cursor is on a conflicting cell, then its choices show under it and the keys settle it', async () => {
    const { grid, user, resolved } = renderConsole(board(), {
      conflicts: [{ editId: 'e2', circuitId: 12, column: 'zs', mine: '1.1', theirs: '1.52', theirsBy: 'Ruth' }],
    });
    await user.click(cellOf(grid, '2', 'Zs'));
    const choices = within(grid).getByRole('group', { name: 'Conflict on this cell' });
    expect(choices).toHaveTextContent('Ruth wrote “1.52”; you wrote “1.1”.');
    await user.keyboard('{Alt>}{Shift>}T{/Shift}{/Alt}');
    await user.keyboard('{Alt>}{Shift>}M{/Shift}{/Alt}');
    expect(resolved).toEqual([
      { editId: 'e2', choice: 'keep-theirs' },
      { editId: 'e2', choice: 'overwrite' },
    ]);
    expect(document.activeElement).toBe(grid);
  });
});

describe('commands from the palette', () => {
  it('when a tester opens the palette, then locking is shown disabled with its reason', async () => {
    const { user } = renderConsole(board(), { role: 'tester' });
    await user.keyboard('{Control>}k{/Control}');
    const dialog = await screen.findByRole('dialog', { name: 'Command palette' });
    await user.keyboard('lock the board');
    const option = within(dialog).getByRole('option', { name: /Lock the board/ });
    expect(option).toHaveAccessibleName(/not available: Only a reviewer or an admin can lock a board/);
  });

  it('when a reviewer opens the palette on a board whose gate fails, then locking is disabled with every reason of the gate', async () => {
    const reasons = ['Zs not recorded on circuits 2, 3.', 'Circuit 1: LIM in Zs has no reason recorded.'];
    const { user } = renderConsole(board(), { role: 'reviewer', lockReasons: reasons });
    await user.keyboard('{Control>}k{/Control}');
    const dialog = await screen.findByRole('dialog', { name: 'Command palette' });
    await user.keyboard('lock the board');
    const option = within(dialog).getByRole('option', { name: /Lock the board/ });
    expect(option).toHaveAccessibleName(/not available: Not yet — 2 reasons: Zs not recorded on circuits 2, 3\. · Circuit 1: LIM in Zs has no reason recorded\./);
  });

  it('when a reviewer opens the palette on a board whose gate passes, then locking is offered', async () => {
    const { user } = renderConsole(board(), { role: 'reviewer', lockReasons: [] });
    await user.keyboard('{Control>}k{/Control}');
    const dialog = await screen.findByRole('dialog', { name: 'Command palette' });
    await user.keyboard('lock the board');
    expect(within(dialog).getByRole('option', { name: /Lock the board/ })).not.toHaveAccessibleName(/not available/);
  });

  it('when a reviewer chooses to lock, then it asks first, listing what still stands; "No" leaves the board open', async () => {
    const findings = [
      { code: 'zs-over-80-percent', severity: 'warning' as const, circuitId: 11, columns: ['zs'], message: 'Zs near the limit', limit: null, source: null },
      { code: 'ir-below-2-megohm', severity: 'note' as const, circuitId: 12, columns: ['irLiveEarth'], message: 'IR low-ish', limit: null, source: null },
    ];
    const detail = board();
    const { user } = renderConsole({ ...detail, findings }, { role: 'reviewer', lockReasons: [] });
    await user.keyboard('{Control>}k{/Control}');
    const dialog = await screen.findByRole('dialog', { name: 'Command palette' });
    await user.keyboard('lock the board{Enter}');
    expect(within(dialog).getByRole('option', { name: /Yes, lock it — still standing: 1 warning, 1 note/ })).toBeDefined();
    await user.keyboard('{ArrowDown}{Enter}');
    await waitFor(() => expect(screen.getByRole('status')).toHaveTextContent('left open'));
  });

  it('when a limitation is marked with a reason, then LIM and the reason are written on the active cell', async () => {
    const { grid, user, calls } = renderConsole(board());
    await user.click(cellOf(grid, '3', 'Zs'));
    await user.keyboard('{Control>}k{/Control}');
    await screen.findByRole('dialog', { name: 'Command palette' });
    await user.keyboard('mark a limitation{Enter}');
    await user.keyboard('No access: locked plant room{Enter}');
    await waitFor(() => expect(calls).toEqual([{ kind: 'cell', circuitId: 13, column: 'zs', text: 'LIM', reason: 'No access: locked plant room', how: 'typed' }]));
    expect(document.activeElement).toBe(grid);
    expect(cellOf(grid, '3', 'Zs')).toHaveAttribute('title', 'Limitation: No access: locked plant room');
  });

  it('when a spur is linked, then its kind, ring, origin point, length and fuse are written', async () => {
    const { grid, user, calls } = renderConsole(board());
    await user.click(cellOf(grid, '3', 'Zs'));
    await user.keyboard('{Control>}k{/Control}');
    await screen.findByRole('dialog', { name: 'Command palette' });
    await user.keyboard('link a spur{Enter}');
    await user.keyboard('Kitchen{Enter}');
    await user.keyboard('socket 4{Enter}');
    await user.keyboard('7{Enter}');
    await user.keyboard('{Enter}');
    // Fused or unfused: the first choice, unfused.
    await user.keyboard('{Enter}');
    await waitFor(() =>
      expect(calls).toEqual([
        { kind: 'field', circuitId: 13, field: 'kind', value: 'spur', how: 'typed' },
        { kind: 'field', circuitId: 13, field: 'spurRingId', value: 12, how: undefined },
        { kind: 'field', circuitId: 13, field: 'spurOriginPoint', value: 'socket 4', how: undefined },
        { kind: 'field', circuitId: 13, field: 'spurLengthM', value: 7, how: undefined },
        { kind: 'field', circuitId: 13, field: 'spurProtection', value: 'unfused', how: undefined },
      ]),
    );
  });

  it('when the keys overlay is opened with ?, then it lists the grid keys and the commands', async () => {
    const { user } = renderConsole(board());
    await user.keyboard('{Shift>}?{/Shift}');
    const dialog = await screen.findByRole('dialog', { name: 'Keys' });
    expect(within(dialog).getByText('Same as above, then down')).toBeDefined();
    expect(within(dialog).getByText(/Save and go down the column/)).toBeDefined();
  });

  it('when a circuit that is not on the board is asked for, then the answer is in words', async () => {
    const { grid, user } = renderConsole(board());
    await user.keyboard('{Control>}g{/Control}');
    await screen.findByRole('dialog', { name: 'Command palette' });
    await user.keyboard('17{Enter}');
    await waitFor(() => expect(screen.getByRole('status')).toHaveTextContent('There is no circuit 17 on this board.'));
    await user.keyboard('{Control>}g{/Control}');
    await screen.findByRole('dialog', { name: 'Command palette' });
    await user.keyboard('3{Enter}');
    await waitFor(() => expect(activeCell(grid)?.closest('[role="row"]')).toHaveAttribute('aria-rowindex', '5'));
  });
});

describe('the quick-entry line in the console', () => {
  it('when a line is dictated, then its values are written as dictated, the cursor goes to the last cell written, and the undo key takes them back', async () => {
    const { grid, user, calls } = renderConsole(board());
    await user.click(cellOf(grid, '1', 'Zs'));
    await user.keyboard('{Control>}j{/Control}');
    const line = screen.getByRole('textbox', { name: 'Quick entry' });
    expect(document.activeElement).toBe(line);
    await user.keyboard('1 .41 3 zs .62 le >200{Enter}');
    expect(calls).toEqual([
      { kind: 'cell', circuitId: 11, column: 'zs', text: '0.41', reason: null, how: 'dictated' },
      { kind: 'cell', circuitId: 13, column: 'zs', text: '0.62', reason: null, how: 'dictated' },
      { kind: 'cell', circuitId: 13, column: 'irLiveEarth', text: '>200', reason: null, how: 'dictated' },
    ]);
    expect(activeCell(grid)).toBe(cellOf(grid, '3', 'L-E'));
    await user.keyboard('{Control>}z{/Control}');
    expect(calls.slice(3).map((c) => (c.kind === 'cell' ? `${c.circuitId} ${c.column}=${c.text}` : ''))).toEqual(['13 irLiveEarth=2', '13 zs=', '11 zs=0.44']);
    await user.keyboard('17 .5{Enter}');
    expect(screen.getByRole('alert')).toHaveTextContent(/no circuit 17/);
    expect(calls).toHaveLength(6);
    await user.keyboard('{Escape}');
    expect(document.activeElement).toBe(grid);
  });
});
