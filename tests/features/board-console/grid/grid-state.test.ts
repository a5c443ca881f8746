import { describe, expect, it } from 'vitest';
import {
  activeIndex,
  columnMove,
  describeColumnMove,
  gridReducer,
  initialGridState,
  moveIndex,
  resolveActive,
  selectedCircuitIds,
  selectionRange,
  type GridShape,
  type GridState,
  type Move,
} from '../../../../src/features/board-console/grid/grid-state.ts';

const shape: GridShape = { rows: [10, 20, 30], columns: ['ringR1', 'ringRn', 'zs'] };
const at = (row: number, col: number) => ({ row, col });

describe('moveIndex', () => {
  it.each<[string, { row: number; col: number }, Move, { row: number; col: number }]>([
    ['Enter goes down the column', at(0, 1), 'down-column', at(1, 1)],
    ['Enter on the last circuit goes to the top of the next column', at(2, 1), 'down-column', at(0, 2)],
    ['Enter on the very last cell stays', at(2, 2), 'down-column', at(2, 2)],
    ['Shift+Enter goes up', at(2, 0), 'up-column', at(1, 0)],
    ['Shift+Enter on the first circuit goes to the bottom of the previous column', at(0, 1), 'up-column', at(2, 0)],
    ['Tab goes right', at(1, 0), 'next-cell', at(1, 1)],
    ['Tab on the last column wraps to the next circuit', at(1, 2), 'next-cell', at(2, 0)],
    ['Shift+Tab on the first column wraps to the previous circuit', at(1, 0), 'previous-cell', at(0, 2)],
    ['arrows stop at the edges', at(0, 0), 'up', at(0, 0)],
    ['arrows stop at the edges (right)', at(0, 2), 'right', at(0, 2)],
    ['a page down stops at the last circuit', at(0, 1), { page: 20 }, at(2, 1)],
    ['Home goes to the first column', at(1, 2), 'row-start', at(1, 0)],
    ['Ctrl+End goes to the last cell', at(0, 0), 'grid-end', at(2, 2)],
  ])('%s', (_name, from, move, to) => {
    expect(moveIndex(from, move, shape)).toEqual(to);
  });
});

describe('gridReducer', () => {
  const start: GridState = gridReducer(initialGridState, { type: 'focus', position: { circuitId: 20, column: 'ringRn' } }, shape);

  it('when the cursor moves with Shift, then a range is selected from where it was', () => {
    const s1 = gridReducer(start, { type: 'move', move: 'down', extend: true }, shape);
    const s2 = gridReducer(s1, { type: 'move', move: 'right', extend: true }, shape);
    expect(selectionRange(s2, shape)).toEqual({ top: 1, bottom: 2, left: 1, right: 2 });
    expect(selectedCircuitIds(s2, shape)).toEqual([20, 30]);
    const s3 = gridReducer(s2, { type: 'move', move: 'up' }, shape);
    expect(s3.anchor).toBeNull();
  });

  it('when the active circuit is removed by someone else, then the cursor stays at the same row index', () => {
    const smaller: GridShape = { rows: [10, 30], columns: shape.columns };
    expect(resolveActive(start, smaller)).toEqual({ circuitId: 30, column: 'ringRn' });
  });

  it('when a circuit is inserted above, then the cursor stays on its circuit', () => {
    const larger: GridShape = { rows: [5, 10, 20, 30], columns: shape.columns };
    expect(activeIndex(start, larger)).toEqual({ row: 2, col: 1 });
  });

  it('when an edit starts and ends, then the draft is kept in between and dropped after', () => {
    const editing = gridReducer(start, { type: 'start-edit', mode: 'replace', draft: '0' }, shape);
    expect(editing.edit).toEqual({ mode: 'replace', draft: '0' });
    expect(gridReducer(editing, { type: 'end-edit' }, shape).edit).toBeNull();
  });
});

describe('Enter and Shift+Enter passing cells that do not apply', () => {
  // Four circuits × four columns: a detail column (kind), two ring readings and Zs.
  // Rows 0 and 3 are rings, rows 1 and 2 radials; Zs applies to all; the detail column always.
  const wide: GridShape = { rows: [1, 2, 3, 4], columns: ['kind', 'ringR1', 'ringR2', 'zs'] };
  const rings = new Set([0, 3]);
  const applies = (row: number, column: string) => column === 'kind' || column === 'zs' || rings.has(row);
  const names = { circuit: (row: number) => String(wide.rows[row]), column: (key: string) => key };

  it.each<[string, { row: number; col: number }, 'down' | 'up', { row: number; col: number }, number]>([
    ['Enter from the first ring goes to the next ring, past the radials', at(0, 1), 'down', at(3, 1), 2],
    ['Enter from the last ring goes to the first ring of the next column', at(3, 1), 'down', at(0, 2), 0],
    ['Enter from a radial standing on a ring column goes to the next ring', at(1, 1), 'down', at(3, 1), 1],
    ['Enter in a column that applies everywhere goes one down', at(1, 3), 'down', at(2, 3), 0],
    ['Enter at the end of a detail column goes to the top of the next column', at(3, 0), 'down', at(0, 1), 0],
    ['Shift+Enter from the last ring goes up to the first, past the radials', at(3, 2), 'up', at(0, 2), 2],
    ['Shift+Enter from the first ring goes to the last ring of the previous column', at(0, 2), 'up', at(3, 1), 0],
    ['Enter on the very last cell stays', at(3, 3), 'down', at(3, 3), 0],
  ])('%s', (_name, from, direction, to, skipped) => {
    const move = columnMove(from, direction, wide, applies);
    expect(move.to).toEqual(to);
    expect(move.skipped).toHaveLength(skipped);
    expect(moveIndex(from, direction === 'down' ? 'down-column' : 'up-column', wide, applies)).toEqual(to);
  });

  it('when no circuit needs a column, then Enter passes the whole column', () => {
    const noRings = (_row: number, column: string) => column === 'kind' || column === 'zs';
    const move = columnMove(at(3, 0), 'down', wide, noRings);
    expect(move.to).toEqual(at(0, 3));
    expect(move.skipped).toHaveLength(8);
    expect(describeColumnMove(at(3, 0), move, 'down', wide, names)).toBe('on to zs of circuit 1 (ringR1, ringR2: no circuit needs them)');
  });

  it('when nothing further on applies, then the cursor stays and nothing counts as skipped', () => {
    const onlyFirst = (row: number) => row === 0;
    expect(columnMove(at(0, 3), 'down', wide, onlyFirst)).toEqual({ to: at(0, 3), skipped: [] });
    expect(columnMove(at(0, 0), 'up', wide, onlyFirst)).toEqual({ to: at(0, 0), skipped: [] });
  });

  it('without a predicate, every cell applies (the plain column order)', () => {
    expect(columnMove(at(0, 1), 'down', wide)).toEqual({ to: at(1, 1), skipped: [] });
    expect(columnMove(at(3, 1), 'down', wide)).toEqual({ to: at(0, 2), skipped: [] });
    expect(columnMove(at(0, 1), 'up', wide)).toEqual({ to: at(3, 0), skipped: [] });
  });

  it('says what was skipped in words for the status line, and nothing when nothing was', () => {
    const down = columnMove(at(0, 1), 'down', wide, applies);
    expect(describeColumnMove(at(0, 1), down, 'down', wide, names)).toBe('down to circuit 4 (skipped 2 circuits this reading does not apply to)');
    const up = columnMove(at(3, 2), 'up', wide, applies);
    expect(describeColumnMove(at(3, 2), up, 'up', wide, names)).toBe('up to circuit 1 (skipped 2 circuits this reading does not apply to)');
    const oneDown = columnMove(at(1, 3), 'down', wide, applies);
    expect(describeColumnMove(at(1, 3), oneDown, 'down', wide, names)).toBeNull();
    // With one ring only, Enter from it passes the two radials below and goes on to the next column.
    const shortWide: GridShape = { rows: [1, 2, 3], columns: ['kind', 'ringR1', 'ringR2', 'zs'] };
    const wrap = columnMove(at(0, 1), 'down', shortWide, applies);
    expect(wrap.to).toEqual(at(0, 2));
    expect(describeColumnMove(at(0, 1), wrap, 'down', shortWide, names)).toBe('on to ringR2 of circuit 1 (skipped 2 cells that do not apply)');
  });
});
