/**
 * The console grid's own state, kept apart from the board's data: where the cursor is, what range
 * is selected, and the edit in progress. Pure: a reducer and helpers, no React, no I/O.
 *
 * Positions are held by circuit id and column key, not by index, so a live update that inserts,
 * removes or reorders circuits never moves the cursor to another circuit. When the active circuit
 * itself disappears, the cursor falls back to the row index it last had.
 */
import type { ColumnKey } from '../../../../shared/schemas/columns.ts';

/** A cell of the grid: a circuit and a column. */
export interface GridPosition {
  circuitId: number;
  column: ColumnKey;
}

/**
 * How the edit in progress started, which decides what the arrow keys do:
 * - `replace`: started by typing a character over the cell. Arrows commit and move (a typist
 *   going down a column never needs a caret in a four-character reading).
 * - `in-place`: started with F2 on the current text. Left/Right move the caret; Up/Down commit and
 *   move (a one-line editor has no use for them).
 */
export type EditMode = 'replace' | 'in-place';

export interface EditState {
  mode: EditMode;
  /** The text being typed. */
  draft: string;
}

export interface GridState {
  active: GridPosition | null;
  /** The other corner of a range selection (Shift+arrows); null when only the active cell is selected. */
  anchor: GridPosition | null;
  edit: EditState | null;
  /** Row index the active cell last had: where the cursor lands if its circuit is removed. */
  lastRowIndex: number;
}

/** The shape of the grid the reducer moves over: circuit ids in order and column keys in order. */
export interface GridShape {
  rows: readonly number[];
  columns: readonly ColumnKey[];
}

export const initialGridState: GridState = { active: null, anchor: null, edit: null, lastRowIndex: 0 };

/** Index coordinates of a position in a shape. */
export interface CellIndex {
  row: number;
  col: number;
}

export type Direction = 'up' | 'down' | 'left' | 'right';

/**
 * What the cursor does:
 * - `down-column` (Enter): down the same column; from the last circuit, to the top of the next column.
 *   Given an `Applies` predicate, it passes the cells the predicate says no to (see `columnMove`).
 * - `up-column` (Shift+Enter): up; from the first circuit, to the bottom of the previous column.
 * - `next-cell` (Tab): right; from the last column, to the first column of the next circuit.
 * - `previous-cell` (Shift+Tab): left; from the first column, to the last column of the previous circuit.
 * - arrows move one cell and stop at the edges.
 */
export type Move =
  | Direction
  | 'down-column'
  | 'up-column'
  | 'next-cell'
  | 'previous-cell'
  | 'row-start'
  | 'row-end'
  | 'grid-start'
  | 'grid-end'
  | { page: number };

export type GridAction =
  | { type: 'focus'; position: GridPosition; extend?: boolean }
  | { type: 'move'; move: Move; extend?: boolean }
  | { type: 'start-edit'; mode: EditMode; draft: string }
  | { type: 'set-draft'; draft: string }
  | { type: 'end-edit' }
  | { type: 'select'; anchor: GridPosition | null; active: GridPosition }
  | { type: 'clear-selection' };

function clamp(value: number, low: number, high: number): number {
  return Math.max(low, Math.min(high, value));
}

/** Where the active cell is now in the shape, following the fallback rules; null on an empty grid. */
export function activeIndex(state: GridState, shape: GridShape): CellIndex | null {
  if (shape.rows.length === 0 || shape.columns.length === 0) return null;
  const active = state.active;
  let row = active ? shape.rows.indexOf(active.circuitId) : -1;
  if (row < 0) row = clamp(state.lastRowIndex, 0, shape.rows.length - 1);
  let col = active ? shape.columns.indexOf(active.column) : -1;
  if (col < 0) col = 0;
  return { row, col };
}

/** The active position as it resolves in the shape (never a removed circuit); null on an empty grid. */
export function resolveActive(state: GridState, shape: GridShape): GridPosition | null {
  const index = activeIndex(state, shape);
  return index ? positionAt(shape, index) : null;
}

export function positionAt(shape: GridShape, index: CellIndex): GridPosition {
  return { circuitId: shape.rows[index.row]!, column: shape.columns[index.col]! };
}

export function indexOf(shape: GridShape, position: GridPosition): CellIndex | null {
  const row = shape.rows.indexOf(position.circuitId);
  const col = shape.columns.indexOf(position.column);
  return row < 0 || col < 0 ? null : { row, col };
}

/**
 * Whether Enter stops at a cell, by row index and column key. The console answers yes for every
 * circuit-detail cell, for a reading the circuit needs (the checker's `requiredColumns`) and for any
 * reading cell that holds a value; no for an empty reading that does not apply to the circuit
 * (ring r1 on a radial, RCD time without an RCD…). Arrows, Tab and clicks ignore it.
 */
export type Applies = (row: number, column: ColumnKey) => boolean;

/** Where an Enter (or Shift+Enter) leads, and the cells it passed over on the way. */
export interface ColumnMove {
  to: CellIndex;
  /** The cells passed because they do not apply, in the order they were passed. */
  skipped: CellIndex[];
}

/**
 * Enter and Shift+Enter with skipping. The grid is read column by column (down each column, then
 * the next column from its top; Shift+Enter the reverse), and the cursor goes to the next cell in
 * that order that `applies`. A column in which no cell applies is passed whole. When no cell
 * further on applies, the cursor stays where it is and nothing counts as skipped.
 * Without `applies` every cell applies: one cell down, or the top of the next column.
 */
export function columnMove(from: CellIndex, direction: 'down' | 'up', shape: GridShape, applies?: Applies): ColumnMove {
  const rowCount = shape.rows.length;
  const colCount = shape.columns.length;
  const skipped: CellIndex[] = [];
  if (rowCount === 0 || colCount === 0) return { to: from, skipped };
  const step = direction === 'down' ? 1 : -1;
  let { row, col } = from;
  for (;;) {
    row += step;
    if (row >= rowCount || row < 0) {
      col += step;
      if (col >= colCount || col < 0) return { to: from, skipped: [] };
      row = step > 0 ? 0 : rowCount - 1;
    }
    const key = shape.columns[col]!;
    if (!applies || applies(row, key)) return { to: { row, col }, skipped };
    skipped.push({ row, col });
  }
}

/** How the status line names circuits and columns. */
export interface GridNames {
  circuit(row: number): string;
  column(key: ColumnKey): string;
}

/**
 * What a column move did, in words for the status line, when it passed cells that do not apply;
 * null when it passed none. Examples:
 * - "down to circuit 7 (skipped 3 circuits this reading does not apply to)"
 * - "on to Test V of circuit 1 (R2: no circuit needs it)"
 * - "on to Time of circuit 4 (skipped 3 cells that do not apply)"
 */
export function describeColumnMove(from: CellIndex, move: ColumnMove, direction: 'down' | 'up', shape: GridShape, names: GridNames): string | null {
  const { to, skipped } = move;
  if (skipped.length === 0) return null;
  const circuit = names.circuit(to.row);
  const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;
  if (to.col === from.col) {
    return `${direction} to circuit ${circuit} (skipped ${plural(skipped.length, 'circuit')} this reading does not apply to)`;
  }
  // Columns strictly between the two were passed whole; the rest were cells at either end.
  const low = Math.min(from.col, to.col);
  const high = Math.max(from.col, to.col);
  const passedColumns: string[] = [];
  for (let c = direction === 'down' ? low + 1 : high - 1; c > low && c < high; c += direction === 'down' ? 1 : -1) {
    passedColumns.push(names.column(shape.columns[c]!));
  }
  const cells = skipped.filter((cell) => cell.col === from.col || cell.col === to.col).length;
  const parts: string[] = [];
  if (cells > 0) parts.push(`skipped ${plural(cells, 'cell')} that ${cells === 1 ? 'does' : 'do'} not apply`);
  if (passedColumns.length > 0) parts.push(`${passedColumns.join(', ')}: no circuit needs ${passedColumns.length === 1 ? 'it' : 'them'}`);
  return `${direction === 'down' ? 'on' : 'back'} to ${names.column(shape.columns[to.col]!)} of circuit ${circuit} (${parts.join('; ')})`;
}

/** The index a move leads to from `from`, inside the shape (`applies`: see `columnMove`). */
export function moveIndex(from: CellIndex, move: Move, shape: GridShape, applies?: Applies): CellIndex {
  const lastRow = shape.rows.length - 1;
  const lastCol = shape.columns.length - 1;
  const { row, col } = from;
  if (typeof move === 'object') return { row: clamp(row + move.page, 0, lastRow), col };
  switch (move) {
    case 'up':
      return { row: Math.max(0, row - 1), col };
    case 'down':
      return { row: Math.min(lastRow, row + 1), col };
    case 'left':
      return { row, col: Math.max(0, col - 1) };
    case 'right':
      return { row, col: Math.min(lastCol, col + 1) };
    case 'down-column':
      return columnMove(from, 'down', shape, applies).to;
    case 'up-column':
      return columnMove(from, 'up', shape, applies).to;
    case 'next-cell':
      if (col < lastCol) return { row, col: col + 1 };
      return row < lastRow ? { row: row + 1, col: 0 } : { row, col };
    case 'previous-cell':
      if (col > 0) return { row, col: col - 1 };
      return row > 0 ? { row: row - 1, col: lastCol } : { row, col };
    case 'row-start':
      return { row, col: 0 };
    case 'row-end':
      return { row, col: lastCol };
    case 'grid-start':
      return { row: 0, col: 0 };
    case 'grid-end':
      return { row: lastRow, col: lastCol };
  }
}

/**
 * The grid's reducer. It needs the current shape to move, so it is built per shape:
 * `useReducer((s, a) => gridReducer(s, a, shapeRef.current), initialGridState)`.
 */
export function gridReducer(state: GridState, action: GridAction, shape: GridShape): GridState {
  switch (action.type) {
    case 'focus': {
      const index = indexOf(shape, action.position);
      if (!index) return state;
      const current = resolveActive(state, shape);
      const anchor = action.extend ? (state.anchor ?? current) : null;
      return { active: action.position, anchor, edit: null, lastRowIndex: index.row };
    }
    case 'move': {
      const from = activeIndex(state, shape);
      if (!from) return state;
      const to = moveIndex(from, action.move, shape);
      const current = positionAt(shape, from);
      const anchor = action.extend ? (state.anchor ?? current) : null;
      return { active: positionAt(shape, to), anchor, edit: null, lastRowIndex: to.row };
    }
    case 'start-edit': {
      const active = resolveActive(state, shape);
      if (!active) return state;
      return { ...state, active, anchor: null, edit: { mode: action.mode, draft: action.draft } };
    }
    case 'set-draft':
      return state.edit ? { ...state, edit: { ...state.edit, draft: action.draft } } : state;
    case 'end-edit':
      return state.edit ? { ...state, edit: null } : state;
    case 'select': {
      const index = indexOf(shape, action.active);
      if (!index) return state;
      return { active: action.active, anchor: action.anchor, edit: null, lastRowIndex: index.row };
    }
    case 'clear-selection':
      return state.anchor ? { ...state, anchor: null } : state;
  }
}

/** The selected rectangle in index space (the active cell alone when there is no anchor). */
export interface IndexRange {
  top: number;
  bottom: number;
  left: number;
  right: number;
}

export function selectionRange(state: GridState, shape: GridShape): IndexRange | null {
  const active = activeIndex(state, shape);
  if (!active) return null;
  const anchor = state.anchor ? indexOf(shape, state.anchor) : null;
  const other = anchor ?? active;
  return {
    top: Math.min(active.row, other.row),
    bottom: Math.max(active.row, other.row),
    left: Math.min(active.col, other.col),
    right: Math.max(active.col, other.col),
  };
}

export function rangeContains(range: IndexRange | null, row: number, col: number): boolean {
  return range !== null && row >= range.top && row <= range.bottom && col >= range.left && col <= range.right;
}

/** The positions of a range, row by row. */
export function rangePositions(range: IndexRange, shape: GridShape): GridPosition[][] {
  const rows: GridPosition[][] = [];
  for (let r = range.top; r <= range.bottom; r++) {
    const row: GridPosition[] = [];
    for (let c = range.left; c <= range.right; c++) row.push(positionAt(shape, { row: r, col: c }));
    rows.push(row);
  }
  return rows;
}

/** Circuit ids covered by the selection (the active circuit alone when nothing is selected). */
export function selectedCircuitIds(state: GridState, shape: GridShape): number[] {
  const range = selectionRange(state, shape);
  if (!range) return [];
  return shape.rows.slice(range.top, range.bottom + 1);
}
