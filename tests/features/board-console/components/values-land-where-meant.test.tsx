import { screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { activeCell, boardDetail, cellOf, circuit, renderConsole, type SyncCall } from './console-fixture.tsx';

// Which readings a circuit needs (R1+R2, insulation, polarity, Zs; r1/rn/r2 on rings; the RCD
// time and button with an RCD) is the checker's `requiredColumns`: the schedule of test results
// of BS 7671:2018 Appendix 6 asks for them — common practice for which apply to which circuit.

function writes(calls: SyncCall[]): string[] {
  return calls.map((c) => (c.kind === 'cell' ? `${c.circuitId} ${c.column}=${c.text}` : `${c.circuitId} ${c.field}=${String(c.value)}`));
}

function house() {
  return boardDetail([
    circuit(41, '1', {}, { kind: 'ring', ratingA: 32, rcdType: 'A', rcdRatedResidualMa: 30 }),
    circuit(42, '2', {}, { kind: 'radial', ratingA: 6, rcdType: 'A', rcdRatedResidualMa: 30 }),
    circuit(43, '3', {}, { kind: 'radial', ratingA: 20, rcdType: 'A', rcdRatedResidualMa: 30 }),
  ]);
}

describe('values land where the typist means them', () => {
  it('when Enter finishes the Zs column, then it goes on to the next reading column and a correction typed next lands there, not in "Max Zs given"', async () => {
    const { grid, user, calls } = renderConsole(house());
    await user.click(cellOf(grid, '3', 'Zs'));
    await user.keyboard('1.2{Enter}');
    // Zs is followed by the detail "Max Zs given": passed; the next reading every circuit needs is the RCD time.
    expect(activeCell(grid)).toBe(cellOf(grid, '1', 'Time'));
    await user.keyboard('18{Enter}');
    expect(writes(calls)).toEqual(['43 zs=1.2', '41 rcdTimeMs=18']);
    expect(calls.some((c) => c.kind === 'field' && c.field === 'maxZsByHandOhm')).toBe(false);
  });

  it('when the typist jumps to a circuit from a detail column, then the cursor lands on a reading that circuit needs, and says so', async () => {
    const { grid, user } = renderConsole(house());
    await user.click(cellOf(grid, '1', 'Max Zs given'));
    await user.keyboard('{Control>}g{/Control}');
    await screen.findByRole('dialog', { name: 'Command palette' });
    await user.keyboard('2{Enter}');
    // Circuit 2 is a radial with nothing typed: its first needed reading is R1+R2.
    await waitFor(() => expect(activeCell(grid)).toBe(cellOf(grid, '2', 'R1+R2')));
    expect(screen.getByRole('status')).toHaveTextContent('Max Zs given is not a reading it needs');
  });

  it('when the typist jumps from a ring reading to a radial, then the ring column is not kept', async () => {
    const { grid, user } = renderConsole(house());
    await user.click(cellOf(grid, '1', 'rn'));
    await user.keyboard('{Control>}g{/Control}');
    await screen.findByRole('dialog', { name: 'Command palette' });
    await user.keyboard('3{Enter}');
    await waitFor(() => expect(activeCell(grid)).toBe(cellOf(grid, '3', 'R1+R2')));
  });

  it('when the typist jumps from Zs to another circuit, then the column is kept', async () => {
    const { grid, user } = renderConsole(house());
    await user.click(cellOf(grid, '1', 'Zs'));
    await user.keyboard('{Control>}g{/Control}');
    await screen.findByRole('dialog', { name: 'Command palette' });
    await user.keyboard('3{Enter}');
    await waitFor(() => expect(activeCell(grid)).toBe(cellOf(grid, '3', 'Zs')));
  });
});

describe('units and stray text', () => {
  it('when a reading is typed with its unit, then the unit is taken off and the status line says so', async () => {
    const { grid, user, calls } = renderConsole(house());
    await user.click(cellOf(grid, '1', 'Zs'));
    await user.keyboard('0.44Ω{Enter}');
    expect(writes(calls)).toEqual(['41 zs=0.44']);
    expect(screen.getByRole('status')).toHaveTextContent('took off the unit “Ω” (saved 0.44)');
  });

  it('when a lone dash or a unit of another column is typed, then nothing is saved and the reason shows', async () => {
    const { grid, user, calls } = renderConsole(house());
    await user.click(cellOf(grid, '1', 'Zs'));
    await user.keyboard('-{Enter}');
    expect(calls).toEqual([]);
    expect(screen.getByRole('status')).toHaveTextContent('A dash is not a reading');
    await user.keyboard('{Escape}');
    await user.keyboard('24 ms{Enter}');
    expect(calls).toEqual([]);
    expect(screen.getByRole('status')).toHaveTextContent('Zs is in Ω, not ms');
  });

  it('when a block with units, a dash and a trailing comma is pasted, then the values are cleaned the same way and the dash is refused', async () => {
    const { grid, user, calls } = renderConsole(house());
    await user.click(cellOf(grid, '1', 'L-E'));
    grid.focus();
    const paste = new Event('paste', { bubbles: true, cancelable: true }) as Event & { clipboardData: { getData: () => string } };
    Object.defineProperty(paste, 'clipboardData', { value: { getData: () => '>200 MΩ\n-\n150,\n' } });
    document.dispatchEvent(paste);
    await waitFor(() => expect(writes(calls)).toEqual(['41 irLiveEarth=>200', '43 irLiveEarth=150']));
    expect(screen.getByRole('status')).toHaveTextContent('Pasted 2 of 3 cells');
    expect(screen.getByRole('status')).toHaveTextContent('dash is not a reading');
  });
});

describe('ticks move the way the typist moves', () => {
  it('when the typist works along a row with Tab, then a tick moves on along the row', async () => {
    const { grid, user, calls } = renderConsole(house());
    await user.click(cellOf(grid, '2', 'L-L'));
    await user.keyboard('>200{Tab}>200{Tab}');
    expect(activeCell(grid)).toBe(cellOf(grid, '2', 'Polarity'));
    await user.keyboard('v');
    expect(activeCell(grid)).toBe(cellOf(grid, '2', 'Zs'));
    expect(writes(calls)).toEqual(['42 irLiveLive=>200', '42 irLiveEarth=>200', '42 polarity=✓']);
  });

  it('when the typist works down a column with Enter, then a tick moves down', async () => {
    const { grid, user } = renderConsole(house());
    await user.click(cellOf(grid, '1', 'Polarity'));
    await user.keyboard('{ArrowDown}{ArrowUp}v');
    expect(activeCell(grid)).toBe(cellOf(grid, '2', 'Polarity'));
    await user.keyboard('{Tab}{Shift>}{Tab}{/Shift}{Enter}');
    // After Tab the pass is along the row; Enter makes it a column pass again.
    expect(activeCell(grid)).toBe(cellOf(grid, '3', 'Polarity'));
    await user.keyboard('x');
    // A column pass from the last circuit goes on to the top of the next reading column.
    expect(activeCell(grid)).toBe(cellOf(grid, '1', 'Zs'));
  });
});

describe('quick entry', () => {
  it('when "r2" is said of a radial with commas between pairs, then it goes to R2 (long lead) and the answer says so', async () => {
    const { grid, user, calls } = renderConsole(house());
    await user.click(cellOf(grid, '1', 'Zs'));
    await user.keyboard('{Control>}j{/Control}');
    await user.keyboard('2 r2 .31, zs 1.9,{Enter}');
    expect(writes(calls)).toEqual(['42 r2=0.31', '42 zs=1.9']);
    expect(screen.getByText(/r2 on a radial is R2/)).toBeDefined();
    // The grid follows to where the values landed.
    expect(activeCell(grid)).toBe(cellOf(grid, '2', 'Zs'));
    await user.keyboard('1 r2 .52{Enter}');
    expect(writes(calls).at(-1)).toBe('41 ringR2=0.52');
  });

  it('when a line is wrong, then its message replaces the last answer instead of stacking under it', async () => {
    const { grid, user } = renderConsole(house());
    await user.click(cellOf(grid, '1', 'Zs'));
    await user.keyboard('{Control>}j{/Control}');
    await user.keyboard('1 .4{Enter}');
    expect(screen.getByText(/Wrote Zs 0?\.4 to circuit 1/)).toBeVisible();
    await user.keyboard('17 .5{Enter}');
    expect(screen.getByRole('alert')).toHaveTextContent(/no circuit 17/);
    expect(screen.queryByText(/Wrote Zs/)).toBeNull();
  });

  it('when the cursor is on a numeric detail column, then a bare figure is refused rather than written there', async () => {
    const { grid, user, calls } = renderConsole(house());
    await user.click(cellOf(grid, '1', 'Max Zs given'));
    await user.keyboard('{Control>}j{/Control}');
    await user.keyboard('1 .44{Enter}');
    expect(calls).toEqual([]);
    expect(screen.getByRole('alert')).toHaveTextContent('a circuit detail: name the column');
  });
});

describe('the grid fits a laptop', () => {
  it('when a group is folded with its key, then it shows as one summary column, the description stays, and the choice is remembered for that person', async () => {
    localStorage.clear();
    const first = renderConsole(house(), { personId: 7 });
    await first.user.click(cellOf(first.grid, '1', 'Zs'));
    await first.user.keyboard('{Alt>}{Shift>}2{/Shift}{/Alt}');
    expect(() => cellOf(first.grid, '1', 'BS (EN)')).toThrow();
    const summary = cellOf(first.grid, '1', 'Protective device ▸');
    // The device of circuit 1 side by side: standard, type, rating, breaking capacity.
    expect(summary).toHaveTextContent('60898 B 32 6');
    expect(cellOf(first.grid, '1', 'Description')).toBeDefined();
    // Typing on a summary is refused with the way out.
    await first.user.click(summary);
    await first.user.keyboard('7');
    expect(first.calls).toEqual([]);
    expect(screen.getByRole('status')).toHaveTextContent('Protective device is folded: unfold the group to type here');
    first.unmount();

    const again = renderConsole(house(), { personId: 7 });
    expect(cellOf(again.grid, '1', 'Protective device ▸')).toBeDefined();
    again.unmount();
    const someoneElse = renderConsole(house(), { personId: 8 });
    expect(cellOf(someoneElse.grid, '1', 'BS (EN)')).toBeDefined();
    someoneElse.unmount();
    localStorage.clear();
  });

  it('when Enter passes a folded reading group, then it skips the summary and goes on to the next reading', async () => {
    localStorage.clear();
    const { grid, user } = renderConsole(house(), { personId: 9 });
    await user.click(cellOf(grid, '3', 'Polarity'));
    await user.keyboard('{Alt>}{Shift>}5{/Shift}{/Alt}');
    await user.click(cellOf(grid, '3', 'Polarity'));
    await user.keyboard('v');
    // Loop impedance (Zs) is folded: the pass goes on to the RCD time.
    expect(activeCell(grid)).toBe(cellOf(grid, '1', 'Time'));
    localStorage.clear();
  });

  it('when the findings panel key is pressed, then the panel goes narrow, then hidden, then wide', async () => {
    localStorage.clear();
    const { user } = renderConsole(house(), { personId: 10 });
    const panel = () => screen.queryByRole('region', { name: /^Findings/ });
    expect(panel()).toHaveClass('w-80');
    await user.keyboard('{Alt>}{Shift>}F{/Shift}{/Alt}');
    expect(panel()).toHaveClass('w-56');
    await user.keyboard('{Alt>}{Shift>}F{/Shift}{/Alt}');
    expect(panel()).toBeNull();
    await user.keyboard('{Alt>}{Shift>}F{/Shift}{/Alt}');
    expect(panel()).toHaveClass('w-80');
    localStorage.clear();
  });
});

describe('every circuit detail folded', () => {
  it('when Alt+Shift+0 is pressed, then the details are one summary column beside the description and every reading column stays', async () => {
    localStorage.clear();
    const { grid, user } = renderConsole(house(), { personId: 11 });
    await user.keyboard('{Alt>}{Shift>}0{/Shift}{/Alt}');
    const details = cellOf(grid, '1', 'Details ▸');
    expect(details).toHaveTextContent(/ring .*60898 B 32 6/);
    for (const label of ['r1', 'rn', 'r2', 'R1+R2', 'R2', 'Test V', 'L-L', 'L-E', 'Polarity', 'Zs', 'Time', 'Time 5×', 'RCD btn', 'AFDD btn']) {
      expect(cellOf(grid, '1', label)).toBeDefined();
    }
    for (const label of ['Kind', 'BS (EN)', 'Max Zs given', 'RCD type', 'IΔn', 'AFDD', 'Remarks']) {
      expect(() => cellOf(grid, '1', label)).toThrow();
    }
    expect(cellOf(grid, '1', 'Description')).toBeDefined();
    localStorage.clear();
  });
});

describe('inserting a circuit', () => {
  it('when a circuit is inserted below another, then it starts with the device (and RCD) of the circuit above', async () => {
    const { grid, user, inserted } = renderConsole(house());
    await user.click(cellOf(grid, '2', 'Zs'));
    await user.keyboard('{Control>}k{/Control}');
    await screen.findByRole('dialog', { name: 'Command palette' });
    await user.keyboard('insert a circuit{Enter}');
    await user.keyboard('2a{Enter}');
    await waitFor(() => expect(inserted).toHaveLength(1));
    expect(inserted[0]).toEqual({
      afterId: 42,
      fields: { number: '2a', deviceStandard: '60898', deviceType: 'B', ratingA: 6, breakingKa: 6, rcdType: 'A', rcdRatedResidualMa: 30 },
    });
    await waitFor(() => expect(screen.getByRole('status')).toHaveTextContent('Circuit 2a inserted with the device of circuit 2 (60898 B 6 A)'));
  });
});

describe('spur links in the rows', () => {
  it('when a spur hangs off a ring, then the spur names its ring, origin and fuse, and the ring lists its spurs', () => {
    const { grid } = renderConsole(
      boardDetail([
        circuit(71, '1', {}, { kind: 'ring', description: 'Sockets', ratingA: 32 }),
        circuit(72, '2', {}, { kind: 'spur', description: 'Garage socket', spurRingId: 71, spurOriginPoint: 'socket 4', spurProtection: 'unfused' }),
        circuit(73, '3', {}, { kind: 'spur', description: 'Boiler', spurRingId: 71, spurOriginPoint: 'socket 2', spurProtection: 'fused' }),
      ]),
    );
    expect(cellOf(grid, '2', 'Description')).toHaveTextContent('Garage socket · spur of 1 from socket 4, unfused');
    expect(cellOf(grid, '1', 'Description')).toHaveTextContent('Sockets · spurs: 2 (unfused), 3 (fused)');
  });

  it('when a spur is linked from the palette, then fused or unfused is asked for and written with the link', async () => {
    const { grid, user, calls } = renderConsole(house());
    await user.click(cellOf(grid, '2', 'Zs'));
    await user.keyboard('{Control>}k{/Control}');
    await screen.findByRole('dialog', { name: 'Command palette' });
    await user.keyboard('link a spur{Enter}');
    await user.keyboard('{Enter}'); // the only ring: circuit 1
    await user.keyboard('socket 4{Enter}{Enter}{Enter}');
    await user.keyboard('unfused{Enter}');
    await waitFor(() => expect(calls.some((c) => c.kind === 'field' && c.field === 'spurProtection' && c.value === 'unfused')).toBe(true));
    expect(screen.getByRole('status')).toHaveTextContent('Circuit 2 is an unfused spur of ring 1 from socket 4');
  });
});
