import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { activeCell, boardDetail, cellOf, circuit, renderConsole } from './console-fixture.tsx';

/** Ring, radial, ring; only circuit 3 has an RCD. */
function ringRadialRing() {
  return boardDetail([
    circuit(21, '1', {}, { kind: 'ring', description: 'Kitchen sockets' }),
    circuit(22, '2', {}, { kind: 'radial', description: 'Lights' }),
    circuit(23, '3', {}, { kind: 'ring', description: 'Upstairs sockets', rcdType: 'A', rcdRatedResidualMa: 30 }),
  ]);
}

function cellWrites(calls: ReturnType<typeof renderConsole>['calls']): string[] {
  return calls.map((c) => (c.kind === 'cell' ? `${c.circuitId} ${c.column}=${c.text}` : `${c.circuitId} ${c.field}`));
}

describe('Enter passes the cells a reading does not apply to', () => {
  it('when the r1 column of a ring, a radial and a ring is typed down, then the values land on the two rings', async () => {
    const { grid, user, calls } = renderConsole(ringRadialRing());
    expect(activeCell(grid)).toBe(cellOf(grid, '1', 'r1'));
    await user.keyboard('.52{Enter}');
    expect(activeCell(grid)).toBe(cellOf(grid, '3', 'r1'));
    expect(screen.getByRole('status')).toHaveTextContent('Enter: down to circuit 3 (skipped 1 circuit this reading does not apply to)');
    await user.keyboard('.61{Enter}');
    // After the last ring, the top of the next column (rn of circuit 1, a ring).
    expect(activeCell(grid)).toBe(cellOf(grid, '1', 'rn'));
    expect(cellWrites(calls)).toEqual(['21 ringR1=0.52', '23 ringR1=0.61']);
    expect(cellOf(grid, '2', 'r1')).toHaveTextContent('');
  });

  it('when Enter skips nothing, then the skip message is cleared from the status line', async () => {
    const { grid, user } = renderConsole(ringRadialRing());
    await user.keyboard('{Enter}');
    expect(screen.getByRole('status')).toHaveTextContent('skipped 1 circuit');
    await user.click(cellOf(grid, '1', 'Zs'));
    await user.keyboard('.44{Enter}');
    expect(activeCell(grid)).toBe(cellOf(grid, '2', 'Zs'));
    expect(screen.getByRole('status').textContent).toBe('');
  });

  it('when Shift+Enter is pressed on the last ring, then the cursor goes up to the first ring', async () => {
    const { grid, user, calls } = renderConsole(ringRadialRing());
    await user.click(cellOf(grid, '3', 'r2'));
    await user.keyboard('.83{Shift>}{Enter}{/Shift}');
    expect(activeCell(grid)).toBe(cellOf(grid, '1', 'r2'));
    expect(cellWrites(calls)).toEqual(['23 ringR2=0.83']);
    expect(screen.getByRole('status')).toHaveTextContent('Shift+Enter: up to circuit 1 (skipped 1 circuit this reading does not apply to)');
  });

  it('when an arrow goes to a cell that does not apply, then N/A can be typed there, and Enter visits it afterwards', async () => {
    const { grid, user, calls } = renderConsole(ringRadialRing());
    await user.keyboard('{ArrowDown}');
    expect(activeCell(grid)).toBe(cellOf(grid, '2', 'r1'));
    await user.keyboard('na{ArrowUp}');
    expect(cellWrites(calls)).toEqual(['22 ringR1=N/A']);
    expect(activeCell(grid)).toBe(cellOf(grid, '1', 'r1'));
    // The radial's r1 now holds a value: Enter stops there so it can be corrected.
    await user.keyboard('{Enter}');
    expect(activeCell(grid)).toBe(cellOf(grid, '2', 'r1'));
  });

  it('when Tab is pressed, then it reaches every cell, whether it applies or not', async () => {
    const { grid, user } = renderConsole(ringRadialRing());
    await user.click(cellOf(grid, '2', 'r1'));
    expect(activeCell(grid)).toBe(cellOf(grid, '2', 'r1'));
    await user.keyboard('{Tab}');
    expect(activeCell(grid)).toBe(cellOf(grid, '2', 'rn'));
  });

  it('when a tick is typed in the RCD button column, then the cursor goes on to the next circuit with an RCD', async () => {
    const { grid, user, calls } = renderConsole(
      boardDetail([
        circuit(31, '1', {}, { rcdType: 'A', rcdRatedResidualMa: 30 }),
        circuit(32, '2', {}),
        circuit(33, '3', {}),
        circuit(34, '4', {}, { rcdType: 'A', rcdRatedResidualMa: 30 }),
      ]),
    );
    await user.click(cellOf(grid, '1', 'RCD btn'));
    await user.keyboard('v');
    expect(activeCell(grid)).toBe(cellOf(grid, '4', 'RCD btn'));
    expect(screen.getByRole('status')).toHaveTextContent('Tick: down to circuit 4 (skipped 2 circuits this reading does not apply to)');
    await user.keyboard('v');
    expect(cellWrites(calls)).toEqual(['31 rcdButton=✓', '34 rcdButton=✓']);
    // No circuit has an AFDD and a reading pass never enters a detail column (the AFDD yes/no):
    // nothing further applies, so the cursor stays on the last tick.
    expect(activeCell(grid)).toBe(cellOf(grid, '4', 'RCD btn'));
  });

  it('when the last R1+R2 is typed on a board with no long-lead R2, then Enter passes R2 and says so', async () => {
    const { grid, user } = renderConsole(ringRadialRing());
    await user.click(cellOf(grid, '3', 'R1+R2'));
    await user.keyboard('.3{Enter}');
    expect(activeCell(grid)).toBe(cellOf(grid, '1', 'Test V'));
    expect(screen.getByRole('status')).toHaveTextContent('Enter: on to Test V of circuit 1 (R2: no circuit needs it)');
  });

  it('when the keys overlay is opened, then it states the rule for Enter', async () => {
    const { user } = renderConsole(ringRadialRing());
    await user.keyboard('{Shift>}?{/Shift}');
    const dialog = await screen.findByRole('dialog', { name: 'Keys' });
    expect(within(dialog).getByText(/Save and go down the column to the next circuit the reading applies to/)).toBeDefined();
  });
});
