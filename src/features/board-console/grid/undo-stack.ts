/**
 * Undo and redo of cell edits. One entry is one action of the typist: a single cell typed, or a
 * whole paste, fill or dictated line (undone together). Pure and immutable.
 */
import type { GridPosition } from './grid-state.ts';

/** One cell changed by an action: its text before and after, as the grid shows it. */
export interface CellChange extends GridPosition {
  before: string;
  after: string;
  /** The reason kept with a LIM before and after the change, when there was one. */
  beforeReason?: string | null;
  afterReason?: string | null;
}

/** A write that puts a cell back (undo) or forward (redo). */
export interface CellWrite {
  position: GridPosition;
  text: string;
  reason?: string | null;
}

export interface UndoEntry {
  /** What the action was, in words (shown when it is undone). */
  label: string;
  changes: readonly CellChange[];
  /**
   * How to undo or redo the action when it is not cell by cell through the sync engine: a file
   * import is undone as one batch on the server (one step of the history too). Answers what was
   * done, in words.
   */
  apply?: (direction: 'undo' | 'redo') => Promise<string>;
}

export interface UndoStack {
  past: readonly UndoEntry[];
  future: readonly UndoEntry[];
}

/** How many actions are remembered. */
export const undoLimit = 200;

export const emptyUndoStack: UndoStack = { past: [], future: [] };

/** Records an action; a new action clears what could be redone. Actions that changed nothing are dropped. */
export function pushUndo(stack: UndoStack, entry: UndoEntry): UndoStack {
  const changes = entry.changes.filter((c) => c.before !== c.after || (c.beforeReason ?? null) !== (c.afterReason ?? null));
  if (changes.length === 0) return stack;
  const past = [...stack.past, { ...entry, changes }];
  return { past: past.length > undoLimit ? past.slice(past.length - undoLimit) : past, future: [] };
}

/** The entry to undo and the stack after it; null when there is nothing to undo. */
export function popUndo(stack: UndoStack): { entry: UndoEntry; stack: UndoStack } | null {
  const entry = stack.past[stack.past.length - 1];
  if (!entry) return null;
  return { entry, stack: { past: stack.past.slice(0, -1), future: [...stack.future, entry] } };
}

/** The entry to redo and the stack after it; null when there is nothing to redo. */
export function popRedo(stack: UndoStack): { entry: UndoEntry; stack: UndoStack } | null {
  const entry = stack.future[stack.future.length - 1];
  if (!entry) return null;
  return { entry, stack: { past: [...stack.past, entry], future: stack.future.slice(0, -1) } };
}

/** The writes that undo an entry: each cell back to its text before, last change first. */
export function undoWrites(entry: UndoEntry): CellWrite[] {
  return [...entry.changes]
    .reverse()
    .map((c) => ({ position: { circuitId: c.circuitId, column: c.column }, text: c.before, reason: c.beforeReason }));
}

/** The writes that redo an entry: each cell to its text after, in the original order. */
export function redoWrites(entry: UndoEntry): CellWrite[] {
  return entry.changes.map((c) => ({ position: { circuitId: c.circuitId, column: c.column }, text: c.after, reason: c.afterReason }));
}
