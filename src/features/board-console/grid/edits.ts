/**
 * What the grid's editing keys change, worked out as a list of cell changes (text before and
 * after) before anything is written. The console then writes the list through the sync engine and
 * records it as one undoable action. Pure.
 */
import { positionAt, type CellIndex, type GridPosition, type GridShape, type IndexRange } from './grid-state.ts';
import type { CellChange } from './undo-stack.ts';

/** Reads the text a cell shows now. */
export type ReadCell = (position: GridPosition) => string;

function change(position: GridPosition, before: string, after: string): CellChange {
  return { circuitId: position.circuitId, column: position.column, before, after };
}

/** The active cell takes the value of the cell above it; null on the first circuit. */
export function fillFromAboveChange(at: CellIndex, shape: GridShape, read: ReadCell): CellChange | null {
  if (at.row === 0) return null;
  const here = positionAt(shape, at);
  const above = positionAt(shape, { row: at.row - 1, col: at.col });
  return change(here, read(here), read(above));
}

/**
 * Fill down: every column of the range takes the value of the range's top cell. A range of one
 * circuit fills from the circuit above it instead (so the key does something on a single cell).
 */
export function fillDownChanges(range: IndexRange, shape: GridShape, read: ReadCell): CellChange[] {
  const top = range.top === range.bottom ? range.top - 1 : range.top;
  if (top < 0) return [];
  const changes: CellChange[] = [];
  for (let col = range.left; col <= range.right; col++) {
    const source = read(positionAt(shape, { row: top, col }));
    for (let row = top + 1; row <= range.bottom; row++) {
      const target = positionAt(shape, { row, col });
      changes.push(change(target, read(target), source));
    }
  }
  return changes;
}

/** Every cell of the range emptied. */
export function clearChanges(range: IndexRange, shape: GridShape, read: ReadCell): CellChange[] {
  const changes: CellChange[] = [];
  for (let row = range.top; row <= range.bottom; row++) {
    for (let col = range.left; col <= range.right; col++) {
      const target = positionAt(shape, { row, col });
      changes.push(change(target, read(target), ''));
    }
  }
  return changes;
}

/**
 * A block of text rows pasted with its top-left corner at the range's top-left cell, cut off at the
 * grid's edges. A single value pasted over a selected range fills the whole range, as spreadsheets do.
 * Returns the changes and the range that was written.
 */
export function pasteChanges(
  block: readonly (readonly string[])[],
  range: IndexRange,
  shape: GridShape,
  read: ReadCell,
): { changes: CellChange[]; written: IndexRange | null } {
  const height = block.length;
  const width = Math.max(0, ...block.map((r) => r.length));
  if (height === 0 || width === 0) return { changes: [], written: null };
  const single = height === 1 && width === 1;
  const fillsRange = single && (range.bottom > range.top || range.right > range.left);
  const bottom = fillsRange ? range.bottom : Math.min(shape.rows.length - 1, range.top + height - 1);
  const right = fillsRange ? range.right : Math.min(shape.columns.length - 1, range.left + width - 1);
  const changes: CellChange[] = [];
  for (let row = range.top; row <= bottom; row++) {
    for (let col = range.left; col <= right; col++) {
      const text = fillsRange ? block[0]![0]! : block[row - range.top]?.[col - range.left];
      if (text === undefined) continue;
      const target = positionAt(shape, { row, col });
      changes.push(change(target, read(target), text));
    }
  }
  return { changes, written: { top: range.top, bottom, left: range.left, right } };
}

/** The range's cells as rows of text, for copying. */
export function rangeTexts(range: IndexRange, shape: GridShape, read: ReadCell): string[][] {
  const rows: string[][] = [];
  for (let row = range.top; row <= range.bottom; row++) {
    const cells: string[] = [];
    for (let col = range.left; col <= range.right; col++) cells.push(read(positionAt(shape, { row, col })));
    rows.push(cells);
  }
  return rows;
}
