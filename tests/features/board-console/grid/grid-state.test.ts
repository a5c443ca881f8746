import { describe, expect, it } from 'vitest';
import {
  activeIndex,
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
