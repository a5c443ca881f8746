import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { columns } from '../../../../shared/schemas/columns.ts';
import { activeCell, boardDetail, cellOf, circuit, renderConsole } from './console-fixture.tsx';

/** The label of the column right of `key` in the grid. */
function columnAfter(key: string): string {
  return columns[columns.findIndex((c) => c.key === key) + 1]!.label;
}

/** "circuit column" of the active cell, read from the grid's own headers. */
function where(grid: HTMLElement): string {
  const cell = activeCell(grid);
  if (!cell) return 'nowhere';
  const row = cell.closest('[role="row"]');
  const number = row?.querySelector('[role="rowheader"] span')?.textContent ?? '?';
  const header = grid.querySelector(`[role="row"][aria-rowindex="2"] [role="columnheader"][aria-colindex="${cell.getAttribute('aria-colindex')}"] span`);
  return `${number} ${header?.textContent ?? '?'}`;
}

function threeCircuits() {
  return boardDetail([
    circuit(11, '1', { zs: '0.44', ringR1: '0.39' }),
    circuit(12, '2', { zs: '0.61' }),
    circuit(13, '3', {}),
  ]);
}

describe('the grid keys', () => {
  it('when the board opens, then the grid has the focus on the first reading of the first circuit', () => {
    const { grid } = renderConsole(threeCircuits());
    expect(document.activeElement).toBe(grid);
    expect(where(grid)).toBe('1 r1');
  });

  it('when a value is typed and Enter pressed, then it is written and the cursor goes down the same column', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '2', 'Zs'));
    await user.keyboard('0.52{Enter}');
    expect(calls).toEqual([{ kind: 'cell', circuitId: 12, column: 'zs', text: '0.52', reason: null, how: 'typed' }]);
    expect(where(grid)).toBe('3 Zs');
    expect(cellOf(grid, '2', 'Zs')).toHaveTextContent('0.52');
    expect(document.activeElement).toBe(grid);
  });

  it('when a value starts with a bare point, then it is saved with its zero', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '3', 'Zs'));
    await user.keyboard('.47{Enter}');
    expect(calls[0]).toMatchObject({ circuitId: 13, column: 'zs', text: '0.47' });
  });

  it('when Enter is pressed on the last circuit of a reading column, then the cursor goes to the top of the next reading column, never into a circuit detail', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '3', 'Zs'));
    await user.keyboard('0.8{Enter}');
    expect(calls).toHaveLength(1);
    // The column after Zs is "Max Zs given", a circuit detail: Enter passes it.
    expect(columnAfter('zs')).toBe('Max Zs given');
    // These circuits have no RCD or AFDD, so no reading column after Zs applies: Enter stays and says so.
    expect(where(grid)).toBe('3 Zs');
    expect(screen.getByRole('status')).toHaveTextContent('Enter: no reading further on needs a value');
  });

  it('when Shift+Enter is pressed while typing, then the value is written and the cursor goes up', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '3', 'Zs'));
    await user.keyboard('0.9{Shift>}{Enter}{/Shift}');
    expect(calls[0]).toMatchObject({ circuitId: 13, column: 'zs', text: '0.9' });
    expect(where(grid)).toBe('2 Zs');
  });

  it('when Tab and Shift+Tab are pressed while typing, then the value is written and the cursor goes right, then left', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '1', 'r1'));
    await user.keyboard('0.4{Tab}');
    expect(where(grid)).toBe('1 rn');
    await user.keyboard('0.41{Shift>}{Tab}{/Shift}');
    expect(where(grid)).toBe('1 r1');
    expect(calls.map((c) => (c.kind === 'cell' ? `${c.column}=${c.text}` : ''))).toEqual(['ringR1=0.4', 'ringRn=0.41']);
  });

  it('when Esc is pressed while typing, then nothing is written and the old value stays', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '1', 'Zs'));
    await user.keyboard('9.99{Escape}');
    expect(calls).toEqual([]);
    expect(cellOf(grid, '1', 'Zs')).toHaveTextContent('0.44');
    expect(where(grid)).toBe('1 Zs');
    expect(document.activeElement).toBe(grid);
  });

  it('when F2 is pressed, then the cell is edited in place and the arrows move the caret', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '1', 'r1'));
    await user.keyboard('{F2}');
    const input = within(grid).getByRole('textbox');
    expect(input).toHaveValue('0.39');
    await user.keyboard('{ArrowLeft}5{Enter}');
    expect(calls[0]).toMatchObject({ circuitId: 11, column: 'ringR1', text: '0.359' });
    // Every circuit here is a radial: Enter passes the empty ring cells (r1 of 2 and 3, all of rn
    // and r2) and lands on the first reading they need.
    expect(where(grid)).toBe('1 R1+R2');
  });

  it('when an arrow is pressed after typing over a cell, then the value is written and the cursor moves', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '2', 'r1'));
    await user.keyboard('0.3{ArrowRight}');
    expect(calls[0]).toMatchObject({ circuitId: 12, column: 'ringR1', text: '0.3' });
    expect(where(grid)).toBe('2 rn');
  });

  it('when Delete is pressed, then the reading is emptied and a detail is cleared to none', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '1', 'Zs'));
    await user.keyboard('{Delete}');
    await user.click(cellOf(grid, '1', 'In'));
    await user.keyboard('{Backspace}');
    expect(calls).toEqual([
      { kind: 'cell', circuitId: 11, column: 'zs', text: '', reason: null, how: 'typed' },
      { kind: 'field', circuitId: 11, field: 'ratingA', value: null, how: 'typed' },
    ]);
  });

  it('when the same-as-above key is pressed, then the value above is written and the cursor goes down', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '2', 'Zs'));
    await user.keyboard("{Control>}'{/Control}");
    expect(calls).toEqual([{ kind: 'cell', circuitId: 12, column: 'zs', text: '0.44', reason: null, how: 'filled' }]);
    expect(where(grid)).toBe('3 Zs');
  });

  it('when a range is selected with Shift+arrows and filled down, then every cell below takes the top value', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '1', 'Zs'));
    await user.keyboard('{Shift>}{ArrowDown}{ArrowDown}{ArrowRight}{/Shift}');
    expect(cellOf(grid, '3', columnAfter('zs'))).toHaveAttribute('aria-selected', 'true');
    expect(cellOf(grid, '2', 'Zs')).toHaveAttribute('aria-selected', 'true');
    expect(cellOf(grid, '2', 'L-E')).toHaveAttribute('aria-selected', 'false');
    await user.keyboard('{Control>}d{/Control}');
    expect(calls.filter((c) => c.kind === 'cell')).toEqual([
      { kind: 'cell', circuitId: 12, column: 'zs', text: '0.44', reason: null, how: 'filled' },
      { kind: 'cell', circuitId: 13, column: 'zs', text: '0.44', reason: null, how: 'filled' },
    ]);
    // The column right of Zs is empty on every circuit: nothing to write there.
    expect(calls.filter((c) => c.kind === 'field')).toEqual([]);
  });

  it('when an edit is undone and redone, then the previous text is written back, then the new one again', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '1', 'Zs'));
    await user.keyboard('0.5{Enter}');
    await user.keyboard('{Control>}z{/Control}');
    expect(cellOf(grid, '1', 'Zs')).toHaveTextContent('0.44');
    expect(where(grid)).toBe('1 Zs');
    await user.keyboard('{Control>}{Shift>}z{/Shift}{/Control}');
    expect(cellOf(grid, '1', 'Zs')).toHaveTextContent('0.5');
    expect(calls.map((c) => (c.kind === 'cell' ? c.text : ''))).toEqual(['0.5', '0.44', '0.5']);
  });

  it('when a 2 × 3 block of tab-separated text is pasted, then six cells are written from the active cell', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '2', 'r1'));
    await user.paste('0.51\t0.52\t0.83\n0.61\t0.62\t1.01\n');
    expect(calls).toEqual([
      { kind: 'cell', circuitId: 12, column: 'ringR1', text: '0.51', reason: null, how: 'pasted' },
      { kind: 'cell', circuitId: 12, column: 'ringRn', text: '0.52', reason: null, how: 'pasted' },
      { kind: 'cell', circuitId: 12, column: 'ringR2', text: '0.83', reason: null, how: 'pasted' },
      { kind: 'cell', circuitId: 13, column: 'ringR1', text: '0.61', reason: null, how: 'pasted' },
      { kind: 'cell', circuitId: 13, column: 'ringRn', text: '0.62', reason: null, how: 'pasted' },
      { kind: 'cell', circuitId: 13, column: 'ringR2', text: '1.01', reason: null, how: 'pasted' },
    ]);
    expect(cellOf(grid, '3', 'r2')).toHaveAttribute('aria-selected', 'true');
    // One paste is one action: one undo takes all six back.
    await user.keyboard('{Control>}z{/Control}');
    expect(calls.slice(6).map((c) => (c.kind === 'cell' ? c.text : '?'))).toEqual(['', '', '', '', '', '']);
  });

  it('when a range is copied, then the clipboard holds it as tab-separated text', async () => {
    const { grid, user } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '1', 'r1'));
    await user.keyboard('{Shift>}{ArrowDown}{/Shift}');
    // The browser fires `copy` on Ctrl+C even with no text selected; user-event only does with a
    // selection, so the event is fired as the browser would.
    const store = new Map<string, string>();
    const clipboardData = { setData: (type: string, text: string) => store.set(type, text), getData: (type: string) => store.get(type) ?? '' };
    const notHandled = fireEvent.copy(grid, { clipboardData });
    expect(notHandled).toBe(false);
    expect(store.get('text/plain')).toBe('0.39\n');
    expect(screen.getByRole('status')).toHaveTextContent('Copied 2 × 1 cells.');
  });

  it('when text a detail column cannot take is typed, then it is refused at the cell and not saved', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '1', 'In'));
    await user.keyboard('thirty{Enter}');
    expect(calls).toEqual([]);
    const input = within(grid).getByRole('textbox');
    expect(input).toHaveAttribute('aria-invalid', 'true');
    expect(document.getElementById(input.getAttribute('aria-describedby') ?? '')).toHaveTextContent('In takes a number in A, not "thirty".');
    await user.clear(input);
    await user.keyboard('32{Enter}');
    expect(calls).toEqual([{ kind: 'field', circuitId: 11, field: 'ratingA', value: 32, how: 'typed' }]);
    expect(where(grid)).toBe('2 In');
  });

  it('when a choice is typed in any case, then the choice is saved', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '3', 'Kind'));
    await user.keyboard('RING{Enter}');
    expect(calls).toEqual([{ kind: 'field', circuitId: 13, field: 'kind', value: 'ring', how: 'typed' }]);
  });

  it('when the palette is opened in the middle of typing a value, then the value is saved and Esc brings the focus back to the grid', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '2', 'Zs'));
    await user.keyboard('0.77');
    await user.keyboard('{Control>}k{/Control}');
    await screen.findByRole('dialog', { name: 'Command palette' });
    expect(calls).toEqual([{ kind: 'cell', circuitId: 12, column: 'zs', text: '0.77', reason: null, how: 'typed' }]);
    await user.keyboard('{Escape}');
    await waitFor(() => expect(document.activeElement).toBe(grid));
    expect(where(grid)).toBe('2 Zs');
  });

  it('when the circuit being typed into is removed by someone else, then nothing is written elsewhere and the typist is told', async () => {
    const { grid, user, calls, remoteUpdate } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '2', 'Zs'));
    await user.keyboard('0.5');
    remoteUpdate((d) => ({ ...d, circuits: d.circuits.filter((c) => c.id !== 12) }));
    expect(within(grid).queryByRole('textbox')).toBeNull();
    expect(screen.getByRole('status')).toHaveTextContent('That circuit was removed by someone else meanwhile');
    expect(document.activeElement).toBe(grid);
    expect(where(grid)).toBe('3 Zs');
    expect(calls).toEqual([]);
  });

  it('when the board is locked, then typing does not start an edit and says why', async () => {
    const { grid, user, calls } = renderConsole(
      boardDetail([circuit(11, '1', { zs: '0.44' })], { state: 'locked', lockedBy: { id: 3, name: 'Ruth' } }),
    );
    await user.click(cellOf(grid, '1', 'Zs'));
    await user.keyboard('0.5');
    expect(within(grid).queryByRole('textbox')).toBeNull();
    expect(calls).toEqual([]);
    await waitFor(() => expect(screen.getByRole('status')).toHaveTextContent('Board DB-T is locked by Ruth'));
  });

  it('when another typist changes the board while a cell is being typed, then the cursor and the typing stay put', async () => {
    const { grid, user, calls, remoteUpdate } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '2', 'Zs'));
    await user.keyboard('0.5');
    remoteUpdate((d) => ({
      ...d,
      circuits: [
        circuit(10, '0', { zs: '0.3' }),
        ...d.circuits.map((c) => (c.id === 12 ? { ...c, description: 'Kitchen' } : c.id === 13 ? { ...c, cells: { ...c.cells, zs: { text: '0.7', reason: null, version: 2, updatedBy: { id: 9, name: 'Ruth' }, updatedAt: null } } } : c)),
      ],
    }));
    expect(within(grid).getByRole('textbox')).toHaveValue('0.5');
    expect(cellOf(grid, '3', 'Zs')).toHaveTextContent('0.7');
    await user.keyboard('1{Enter}');
    expect(calls).toEqual([{ kind: 'cell', circuitId: 12, column: 'zs', text: '0.51', reason: null, how: 'typed' }]);
    expect(where(grid)).toBe('3 Zs');
  });
});

describe('ticks', () => {
  it('when v or x is typed on a ✓/✗ cell, then the tick or cross is saved at once and the cursor goes down', async () => {
    const { grid, user, calls } = renderConsole(threeCircuits());
    await user.click(cellOf(grid, '1', 'Polarity'));
    await user.keyboard('vx');
    expect(calls).toEqual([
      { kind: 'cell', circuitId: 11, column: 'polarity', text: '✓', reason: null, how: 'typed' },
      { kind: 'cell', circuitId: 12, column: 'polarity', text: '✗', reason: null, how: 'typed' },
    ]);
    expect(activeCell(grid)).toBe(cellOf(grid, '3', 'Polarity'));
    await user.keyboard('na{Enter}');
    expect(calls[2]).toMatchObject({ circuitId: 13, column: 'polarity', text: 'N/A' });
  });
});
