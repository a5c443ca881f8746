import { describe, expect, it } from 'vitest';
import { buildStep, rowsBeforeJump, rowsToRender } from '../../../../src/features/board-console/grid/rows-ahead.ts';

const range = (first: number, last: number) => Array.from({ length: last - first + 1 }, (_, i) => first + i);

describe('rowsBeforeJump', () => {
  // A 100-row board showing rows 20…39 (a 20-row view; its quarter is 5 rows), a page of 26 rows.
  const view = { visible: { first: 20, last: 39 }, count: 100, page: 26 };

  it('when the cursor is in the middle of the view, then nothing is built ahead', () => {
    expect(rowsBeforeJump({ ...view, active: 27 })).toEqual([]);
    expect(rowsBeforeJump({ ...view, active: 34 })).toEqual([]);
  });

  it('when the cursor nears the bottom of the view, then the page below is wanted, nearest first', () => {
    expect(rowsBeforeJump({ ...view, active: 35 })).toEqual(range(40, 65));
  });

  it('when the cursor nears the top of the view, then the page above is wanted, nearest first', () => {
    expect(rowsBeforeJump({ ...view, active: 24 })).toEqual(range(0, 19).reverse());
  });

  it('when the view shows the end of the board, then the first page is wanted (Enter goes on at the top of the next column)', () => {
    expect(rowsBeforeJump({ visible: { first: 80, last: 99 }, count: 100, page: 26, active: 90 })).toEqual(range(0, 25));
    // Near the bottom as well: nothing below the last row, still the first page.
    expect(rowsBeforeJump({ visible: { first: 80, last: 99 }, count: 100, page: 26, active: 98 })).toEqual(range(0, 25));
  });

  it('when the whole board is in view, or there is no cursor, then nothing is wanted', () => {
    expect(rowsBeforeJump({ visible: { first: 0, last: 11 }, count: 12, page: 26, active: 11 })).toEqual([]);
    expect(rowsBeforeJump({ ...view, active: -1 })).toEqual([]);
    expect(rowsBeforeJump({ visible: { first: 0, last: -1 }, count: 100, page: 26, active: 3 })).toEqual([]);
  });
});

describe('buildStep', () => {
  it('when rows are wanted, then a few are added per step in the order wanted, and the result is ascending', () => {
    const wanted = [19, 18, 17, 16, 15];
    const first = buildStep([], wanted, 2);
    expect(first).toEqual([18, 19]);
    const second = buildStep(first, wanted, 2);
    expect(second).toEqual([16, 17, 18, 19]);
    expect(buildStep(buildStep(second, wanted, 2), wanted, 2)).toEqual([15, 16, 17, 18, 19]);
  });

  it('when rows are no longer wanted, then they go in the same step', () => {
    expect(buildStep([40, 41, 42], [0, 1, 2], 2)).toEqual([0, 1]);
    expect(buildStep([40, 41, 42], [], 3)).toEqual([]);
  });
});

describe('rowsToRender', () => {
  it('when rows are built ahead on both sides, then the rows in view and those come once each, ascending', () => {
    expect(rowsToRender({ first: 5, last: 8 }, [0, 1, 7, 8, 9, 12], 20)).toEqual([0, 1, 5, 6, 7, 8, 9, 12]);
  });

  it('when the board got shorter, then rows beyond its end are left out', () => {
    expect(rowsToRender({ first: 2, last: 9 }, [10, 11], 6)).toEqual([2, 3, 4, 5]);
  });
});
