import { useCallback, useEffect, useMemo, useReducer, useRef, useState, type FocusEvent, type KeyboardEvent } from 'react';
import { flushSync } from 'react-dom';
import type { BoardDetail, Circuit } from '../../../../shared/schemas/boards.ts';
import { columnByKey, columns as allColumns, isReadingKey, type ColumnDef } from '../../../../shared/schemas/columns.ts';
import { cellText } from '../grid/cell-value.ts';
import { clearChanges, fillDownChanges, fillFromAboveChange, pasteChanges, rangeTexts } from '../grid/edits.ts';
import { enterStopsAt } from '../grid/enter-stops.ts';
import {
  activeIndex as activeIndexOf,
  columnMove,
  describeColumnMove,
  gridReducer,
  indexOf,
  initialGridState,
  positionAt,
  resolveActive,
  selectionRange,
  type Applies,
  type GridAction,
  type GridPosition,
  type GridShape,
  type GridState,
  type IndexRange,
  type Move,
} from '../grid/grid-state.ts';
import { formatTsv, parseTsv } from '../grid/tsv.ts';
import { emptyUndoStack, popRedo, popUndo, pushUndo, redoWrites, undoWrites, type CellChange, type CellWrite, type UndoEntry, type UndoStack } from '../grid/undo-stack.ts';
import type { BoardSync, EntryMethod } from '../sync/types.ts';
import { cellKey } from './dom-ids.ts';
import type { GridColumn } from '../layout/console-layout.ts';
import { writeCellText } from './write-cell-text.ts';

/** A short message for the status line (what a key just did, or why it could not). */
export interface Notice {
  tone: 'info' | 'error';
  text: string;
  /** Changes on every notice, so the same text twice is still announced. */
  id: number;
}

/** Rows a Page Up / Page Down moves. */
const pageRows = 20;

export interface GridControllerOptions {
  sync: Pick<BoardSync, 'writeCell' | 'writeField'>;
  detail: BoardDetail;
  /** A locked board refuses every edit before it is tried. */
  lockedReason: string | null;
  /** Single characters that run a command (e.g. "?"), so typing them on a cell does not start an edit. */
  commandCharacters: ReadonlySet<string>;
  columns?: readonly ColumnDef[];
}

export interface ApplyResult {
  written: number;
  refused: Array<{ position: GridPosition; message: string }>;
  /** Cells whose text lost something unambiguous on the way in (a unit, a dictation comma), in words. */
  stripped: Array<{ position: GridPosition; message: string }>;
}

/**
 * How the typist is moving through the grid: down columns (Enter, ↑/↓) or along rows (Tab,
 * ←/→). A tick or a cross moves the same way.
 */
export type PassDirection = 'column' | 'row';

/**
 * The console grid's behaviour: cursor, selection, editing, and every edit key (commit and move,
 * clear, fill, copy, paste, undo, redo). Writes go through the sync engine only.
 */
export function useGridController(options: GridControllerOptions) {
  const { sync, detail, lockedReason, commandCharacters } = options;
  const columns = options.columns ?? allColumns;
  const circuits = detail.circuits;

  // The shape changes only when circuits are added, removed or reordered, not on every value typed,
  // so what depends on it (the findings list, the key handlers) is not rebuilt on each keystroke.
  const rowsKey = circuits.map((c) => c.id).join(',');
  const shape: GridShape = useMemo(
    () => ({ rows: rowsKey === '' ? [] : rowsKey.split(',').map(Number), columns: columns.map((c) => c.key) }),
    [rowsKey, columns],
  );
  const circuitById = useMemo(() => new Map(circuits.map((c) => [c.id, c])), [circuits]);

  // Refs hold the latest values for handlers that run between renders (keys arrive faster than frames).
  const shapeRef = useRef(shape);
  shapeRef.current = shape;
  const circuitsRef = useRef(circuitById);
  circuitsRef.current = circuitById;
  const syncRef = useRef(sync);
  syncRef.current = sync;
  const lockedRef = useRef(lockedReason);
  lockedRef.current = lockedReason;
  /** Folded groups' summary columns, by key, with the words that say how to unfold them. */
  const summariesRef = useRef<ReadonlyMap<string, string>>(new Map());
  summariesRef.current = useMemo(
    () => new Map(columns.filter((c) => (c as GridColumn).summaryOf).map((c) => [c.key, `${c.label.replace(/ ▸$/, '')} is folded: unfold the group to type here`])),
    [columns],
  );

  const [state, dispatchRaw] = useReducer(
    (s: GridState, a: GridAction) => gridReducer(s, a, shapeRef.current),
    initialGridState,
  );
  const stateRef = useRef(state);
  stateRef.current = state;
  /** Dispatch that also updates the ref at once, so a second key in the same frame sees the first. */
  const dispatch = useCallback((action: GridAction) => {
    stateRef.current = gridReducer(stateRef.current, action, shapeRef.current);
    dispatchRaw(action);
  }, []);

  const [cellErrors, setCellErrors] = useState<ReadonlyMap<string, string>>(() => new Map());
  const [notice, setNotice] = useState<Notice | null>(null);
  const noticeId = useRef(0);
  const say = useCallback((text: string, tone: Notice['tone'] = 'info') => {
    noticeId.current += 1;
    setNotice({ text, tone, id: noticeId.current });
    return noticeId.current;
  }, []);

  const undoRef = useRef<UndoStack>(emptyUndoStack);
  const [undoDepth, setUndoDepth] = useState({ past: 0, future: 0 });
  const setUndo = (stack: UndoStack) => {
    undoRef.current = stack;
    setUndoDepth({ past: stack.past.length, future: stack.future.length });
  };

  const gridRef = useRef<HTMLDivElement | null>(null);
  const editorRef = useRef<HTMLInputElement | null>(null);

  // Put the cursor on the first reading of the first circuit once there is a board to show, and
  // the keyboard focus in the grid, so typing can start at once.
  useEffect(() => {
    if (!state.active && shape.rows.length > 0) {
      const first = columns.findIndex((c) => c.storage === 'reading');
      dispatch({ type: 'focus', position: positionAt(shape, { row: 0, col: Math.max(0, first) }) });
      const focused = document.activeElement;
      if (!focused || focused === document.body || focused.id === 'main') gridRef.current?.focus({ preventScroll: true });
    }
  }, [state.active, shape, columns, dispatch]);

  // The circuit being typed into was removed by someone else: the edit has nowhere to go.
  useEffect(() => {
    const s = stateRef.current;
    if (s.edit && s.active && !indexOf(shape, s.active)) {
      say('That circuit was removed by someone else meanwhile: what you typed was not saved.', 'error');
      dispatch({ type: 'end-edit' });
      gridRef.current?.focus({ preventScroll: true });
    }
  }, [shape, dispatch, say]);

  /** Enter's stops (see enter-stops.ts) from a cell of column `from`, read from the board as it is when the key arrives. */
  const appliesFrom = useCallback(
    (from: ColumnDef['key']): Applies =>
      (row, column) => {
        if (summariesRef.current.has(column)) return false;
        const circuit = circuitsRef.current.get(shapeRef.current.rows[row] ?? -1);
        return circuit ? enterStopsAt(circuit, column, from) : true;
      },
    [],
  );

  /** Down columns or along rows: set by the keys that move, read by a tick. */
  const passRef = useRef<PassDirection>('column');
  const notePass = (move: Move) => {
    if (move === 'next-cell' || move === 'previous-cell' || move === 'left' || move === 'right') passRef.current = 'row';
    else if (move === 'up' || move === 'down' || move === 'down-column' || move === 'up-column') passRef.current = 'column';
  };

  /** The notice of the last Enter that skipped cells: the next Enter that skips none clears it. */
  const skipNoticeRef = useRef<number | null>(null);

  /**
   * Enter, Shift+Enter (and a tick, same-as-above) move down or up the column to the next cell that
   * applies to its circuit, and say on the status line what they passed over.
   */
  const stepColumn = useCallback(
    (direction: 'down' | 'up', keyName: string) => {
      const shapeNow = shapeRef.current;
      const from = activeIndexOf(stateRef.current, shapeNow);
      if (!from) return;
      passRef.current = 'column';
      const move = columnMove(from, direction, shapeNow, appliesFrom(shapeNow.columns[from.col]!));
      dispatch({ type: 'focus', position: positionAt(shapeNow, move.to) });
      const words = describeColumnMove(from, move, direction, shapeNow, {
        circuit: (row) => circuitsRef.current.get(shapeNow.rows[row] ?? -1)?.number ?? '',
        column: (key) => columnByKey[key].label,
      });
      if (move.to.row === from.row && move.to.col === from.col) {
        skipNoticeRef.current = say(`${keyName}: no reading ${direction === 'down' ? 'further on' : 'before this'} needs a value — this is the ${direction === 'down' ? 'last' : 'first'} reading cell of the pass.`);
      } else if (words) {
        skipNoticeRef.current = say(`${keyName}: ${words}`);
      } else if (skipNoticeRef.current !== null) {
        const stale = skipNoticeRef.current;
        skipNoticeRef.current = null;
        setNotice((current) => (current?.id === stale ? null : current));
      }
    },
    [appliesFrom, dispatch, say],
  );

  const read = useCallback((position: GridPosition) => {
    const circuit = circuitsRef.current.get(position.circuitId);
    return circuit ? cellText(circuit, position.column) : '';
  }, []);

  const setCellError = useCallback((position: GridPosition, message: string | null) => {
    setCellErrors((current) => {
      const key = cellKey(position.circuitId, position.column);
      if (message === null && !current.has(key)) return current;
      const next = new Map(current);
      if (message === null) next.delete(key);
      else next.set(key, message);
      return next;
    });
  }, []);

  const focusGrid = useCallback(() => {
    gridRef.current?.focus({ preventScroll: true });
  }, []);

  const refuseIfLocked = useCallback((): boolean => {
    if (lockedRef.current) {
      say(lockedRef.current, 'error');
      return true;
    }
    return false;
  }, [say]);

  /**
   * Writes a list of cell changes as one undoable action. Text a detail column cannot take is
   * refused at its cell; the rest is written.
   */
  const applyChanges = useCallback(
    (changes: readonly CellChange[], how: EntryMethod, label: string, record = true): ApplyResult => {
      const result: ApplyResult = { written: 0, refused: [], stripped: [] };
      if (changes.length === 0) return result;
      if (refuseIfLocked()) {
        result.refused = changes.map((c) => ({ position: c, message: lockedRef.current ?? '' }));
        return result;
      }
      const done: CellChange[] = [];
      for (const change of changes) {
        const circuit = circuitsRef.current.get(change.circuitId);
        if (!circuit) continue;
        const before = cellText(circuit, change.column);
        const beforeReason = isReadingKey(change.column) ? (circuit.cells[change.column]?.reason ?? null) : null;
        const outcome = writeCellText(syncRef.current, circuit, change.column, change.after, { how, reason: change.afterReason });
        if (!outcome.ok) {
          result.refused.push({ position: change, message: outcome.message });
          setCellError(change, outcome.message);
          continue;
        }
        setCellError(change, null);
        if (outcome.written) result.written += 1;
        if (outcome.stripped) {
          result.stripped.push({ position: change, message: `${columnByKey[change.column].label} of circuit ${circuit.number}: ${outcome.stripped} (saved ${outcome.text})` });
        }
        done.push({ circuitId: change.circuitId, column: change.column, before, after: outcome.text, beforeReason, afterReason: outcome.reason });
      }
      if (record) setUndo(pushUndo(undoRef.current, { label, changes: done }));
      return result;
    },
    [refuseIfLocked, setCellError],
  );

  const describeRefusals = (refused: ApplyResult['refused']): string => {
    const first = refused[0];
    if (!first) return '';
    return refused.length === 1 ? first.message : `${refused.length} cells not saved; first: ${first.message}`;
  };

  const startEdit = useCallback(
    (mode: 'replace' | 'in-place', draft?: string) => {
      if (refuseIfLocked()) return;
      const position = resolveActive(stateRef.current, shapeRef.current);
      if (!position) return;
      const folded = summariesRef.current.get(position.column);
      if (folded) {
        say(`${folded}.`, 'error');
        return;
      }
      const text = draft ?? read(position);
      // Synchronously, so the text box exists and has the focus before the next key arrives.
      flushSync(() => dispatch({ type: 'start-edit', mode, draft: text }));
    },
    [dispatch, read, refuseIfLocked, say],
  );

  const cancelEdit = useCallback(() => {
    const s = stateRef.current;
    if (!s.edit) return;
    const position = resolveActive(s, shapeRef.current);
    if (position) setCellError(position, null);
    dispatch({ type: 'end-edit' });
    focusGrid();
  }, [dispatch, focusGrid, setCellError]);

  /**
   * Saves the edit in progress and moves; returns false (and stays) when the text was refused.
   * `keepFocus` leaves the keyboard focus where it is (the edit is being saved because the focus
   * went elsewhere: the palette, the quick-entry line, another window).
   */
  const commitEdit = useCallback(
    (move: Move | null, keepFocus = false): boolean => {
      const s = stateRef.current;
      if (!s.edit) return true;
      if (s.active && !indexOf(shapeRef.current, s.active)) {
        // Someone else removed the circuit while this typist was typing into it: nothing to save into.
        say('That circuit was removed by someone else meanwhile: what you typed was not saved.', 'error');
        dispatch({ type: 'end-edit' });
        if (!keepFocus) focusGrid();
        return true;
      }
      const position = resolveActive(s, shapeRef.current);
      if (!position) return true;
      const text = editorRef.current?.value ?? s.edit.draft;
      const label = `${columnByKey[position.column].label} of circuit ${circuitsRef.current.get(position.circuitId)?.number ?? ''}`;
      const result = applyChanges([{ ...position, before: read(position), after: text }], 'typed', `typed into ${label}`);
      if (result.refused.length > 0) {
        say(`Not saved — ${describeRefusals(result.refused)}`, 'error');
        if (!keepFocus) editorRef.current?.focus();
        return false;
      }
      dispatch({ type: 'end-edit' });
      if (move === 'down-column') stepColumn('down', 'Enter');
      else if (move === 'up-column') stepColumn('up', 'Shift+Enter');
      else if (move) {
        notePass(move);
        dispatch({ type: 'move', move });
      }
      const stripped = result.stripped[0];
      if (stripped) say(`Saved — ${stripped.message}.`);
      if (!keepFocus) focusGrid();
      return true;
    },
    [applyChanges, dispatch, focusGrid, read, say, stepColumn],
  );

  const moveTo = useCallback(
    (position: GridPosition, extend = false) => {
      if (stateRef.current.edit && !commitEdit(null)) return;
      dispatch({ type: 'focus', position, extend });
    },
    [commitEdit, dispatch],
  );

  const currentRange = (): IndexRange | null => selectionRange(stateRef.current, shapeRef.current);

  const clearSelection = useCallback(() => {
    const range = currentRange();
    if (!range) return;
    // A folded group's summary stands for several cells the typist cannot see: it is not cleared.
    const result = applyChanges(
      clearChanges(range, shapeRef.current, read).filter((c) => !summariesRef.current.has(c.column)),
      'typed',
      'cleared',
    );
    if (result.refused.length > 0) say(`Not cleared — ${describeRefusals(result.refused)}`, 'error');
  }, [applyChanges, read, say]);

  /** Same as above: the active cell takes the value above it, and the cursor goes down (ditto). */
  const fillFromAbove = useCallback(() => {
    const s = stateRef.current;
    if (s.edit) cancelEdit();
    const at = activeIndexOf(stateRef.current, shapeRef.current);
    if (!at) return;
    const change = fillFromAboveChange(at, shapeRef.current, read);
    if (!change) {
      say('The first circuit has nothing above it to copy.', 'error');
      return;
    }
    const result = applyChanges([change], 'filled', 'filled from above');
    if (result.refused.length > 0) {
      say(`Not saved — ${describeRefusals(result.refused)}`, 'error');
      return;
    }
    stepColumn('down', 'Same as above');
    focusGrid();
  }, [applyChanges, cancelEdit, focusGrid, read, say, stepColumn]);

  const fillDown = useCallback(() => {
    if (stateRef.current.edit) cancelEdit();
    const range = currentRange();
    if (!range) return;
    const changes = fillDownChanges(range, shapeRef.current, read);
    if (changes.length === 0) {
      say('Select cells below a value to fill down (Shift+↓), or stand below the value to copy.', 'error');
      return;
    }
    const result = applyChanges(changes, 'filled', 'filled down');
    say(result.refused.length > 0 ? `Filled ${result.written}; ${describeRefusals(result.refused)}` : `Filled ${changes.length} cell${changes.length === 1 ? '' : 's'} down.`, result.refused.length > 0 ? 'error' : 'info');
    focusGrid();
  }, [applyChanges, cancelEdit, focusGrid, read, say]);

  const copyText = useCallback((): string | null => {
    const range = currentRange();
    if (!range) return null;
    return formatTsv(rangeTexts(range, shapeRef.current, read));
  }, [read]);

  const pasteText = useCallback(
    (text: string, how: EntryMethod = 'pasted') => {
      const range = currentRange();
      if (!range) return;
      const block = parseTsv(text);
      const pasted = pasteChanges(block, range, shapeRef.current, read);
      const written = pasted.written;
      const changes = pasted.changes.filter((c) => !summariesRef.current.has(c.column));
      if (changes.length === 0) {
        say('Nothing to paste.', 'error');
        return;
      }
      const result = applyChanges(changes, how, 'pasted');
      if (written) {
        const shapeNow = shapeRef.current;
        dispatch({
          type: 'select',
          anchor: positionAt(shapeNow, { row: written.bottom, col: written.right }),
          active: positionAt(shapeNow, { row: written.top, col: written.left }),
        });
      }
      const strippedWords =
        result.stripped.length === 0 ? '' : ` ${result.stripped.length === 1 ? result.stripped[0]!.message : `${result.stripped.length} cells cleaned; first: ${result.stripped[0]!.message}`}.`;
      say(
        result.refused.length > 0
          ? `Pasted ${changes.length - result.refused.length} of ${changes.length} cells; ${describeRefusals(result.refused)}${strippedWords}`
          : `Pasted ${changes.length} cell${changes.length === 1 ? '' : 's'}.${strippedWords}`,
        result.refused.length > 0 ? 'error' : 'info',
      );
    },
    [applyChanges, dispatch, read, say],
  );

  const replay = useCallback(
    (writes: CellWrite[], label: string) => {
      const changes: CellChange[] = writes.map((w) => ({ ...w.position, before: read(w.position), after: w.text, afterReason: w.reason }));
      const result = applyChanges(changes, 'typed', label, false);
      const first = writes[writes.length - 1]?.position;
      if (first && indexOf(shapeRef.current, first)) dispatch({ type: 'focus', position: first });
      return result;
    },
    [applyChanges, dispatch, read],
  );

  const undo = useCallback(() => {
    if (stateRef.current.edit) cancelEdit();
    if (refuseIfLocked()) return;
    const popped = popUndo(undoRef.current);
    if (!popped) {
      say('Nothing to undo.');
      return;
    }
    setUndo(popped.stack);
    if (popped.entry.apply) {
      say(`Undoing ${popped.entry.label}…`);
      popped.entry.apply('undo').then((words) => say(words), (error: unknown) => say(`Not undone — ${error instanceof Error ? error.message : String(error)}`, 'error'));
      focusGrid();
      return;
    }
    replay(undoWrites(popped.entry), `undo ${popped.entry.label}`);
    say(`Undone: ${popped.entry.label} (${popped.entry.changes.length} cell${popped.entry.changes.length === 1 ? '' : 's'}).`);
    focusGrid();
  }, [cancelEdit, focusGrid, refuseIfLocked, replay, say]);

  const redo = useCallback(() => {
    if (stateRef.current.edit) cancelEdit();
    if (refuseIfLocked()) return;
    const popped = popRedo(undoRef.current);
    if (!popped) {
      say('Nothing to redo.');
      return;
    }
    setUndo(popped.stack);
    if (popped.entry.apply) {
      popped.entry.apply('redo').then((words) => say(words), (error: unknown) => say(`Not redone — ${error instanceof Error ? error.message : String(error)}`, 'error'));
      focusGrid();
      return;
    }
    replay(redoWrites(popped.entry), `redo ${popped.entry.label}`);
    say(`Redone: ${popped.entry.label}.`);
    focusGrid();
  }, [cancelEdit, focusGrid, refuseIfLocked, replay, say]);

  /**
   * A tick or cross typed on a ✓/✗ cell: saved at once, and the cursor moves on the way the typist
   * is moving — down the column in a column pass, to the next cell along the row in a row pass.
   */
  const tick = useCallback(
    (position: GridPosition, key: string) => {
      const circuit = circuitsRef.current.get(position.circuitId);
      const label = `${columnByKey[position.column].label} of circuit ${circuit?.number ?? ''}`;
      const result = applyChanges([{ ...position, before: read(position), after: key }], 'typed', `typed into ${label}`);
      if (result.refused.length > 0) {
        say(`Not saved — ${describeRefusals(result.refused)}`, 'error');
        return;
      }
      if (passRef.current === 'row') {
        const at = activeIndexOf(stateRef.current, shapeRef.current);
        const shapeNow = shapeRef.current;
        if (at && !(at.row === shapeNow.rows.length - 1 && at.col === shapeNow.columns.length - 1)) dispatch({ type: 'move', move: 'next-cell' });
        return;
      }
      stepColumn('down', /^[vV✓]$/.test(key) ? 'Tick' : 'Cross');
    },
    [applyChanges, dispatch, read, say, stepColumn],
  );

  const onKeyDown = useCallback(
    (event: KeyboardEvent<HTMLDivElement>) => {
      const native = event.nativeEvent;
      if (native.isComposing || event.key === 'Process' || event.defaultPrevented) return;
      const s = stateRef.current;
      const mod = event.ctrlKey || event.metaKey;
      const plain = !mod && !event.altKey;

      if (s.edit) {
        const key = event.key;
        if (key === 'Enter' && plain) {
          event.preventDefault();
          commitEdit(event.shiftKey ? 'up-column' : 'down-column');
        } else if (key === 'Tab' && plain) {
          event.preventDefault();
          commitEdit(event.shiftKey ? 'previous-cell' : 'next-cell');
        } else if (key === 'Escape') {
          event.preventDefault();
          event.stopPropagation();
          cancelEdit();
        } else if ((key === 'ArrowUp' || key === 'ArrowDown') && plain && !event.shiftKey) {
          event.preventDefault();
          commitEdit(key === 'ArrowUp' ? 'up' : 'down');
        } else if ((key === 'ArrowLeft' || key === 'ArrowRight') && plain && !event.shiftKey && s.edit.mode === 'replace') {
          event.preventDefault();
          commitEdit(key === 'ArrowLeft' ? 'left' : 'right');
        } else if (mod && !event.altKey && ['z', 'y', 'a', 'c', 'v', 'x'].includes(key.toLowerCase())) {
          // Text editing keys belong to the text box while editing, not to the console's commands.
          event.stopPropagation();
        }
        return;
      }

      const move = (m: Move, extend = event.shiftKey) => {
        event.preventDefault();
        notePass(m);
        dispatch({ type: 'move', move: m, extend });
      };
      switch (event.key) {
        case 'ArrowUp':
        case 'ArrowDown':
        case 'ArrowLeft':
        case 'ArrowRight': {
          if (event.altKey) return;
          const direction = event.key.slice(5).toLowerCase() as 'up' | 'down' | 'left' | 'right';
          if (mod) {
            const far: Record<typeof direction, Move> = { up: { page: -1e6 }, down: { page: 1e6 }, left: 'row-start', right: 'row-end' };
            move(far[direction]);
          } else move(direction);
          return;
        }
        case 'Enter':
          if (!plain) return;
          event.preventDefault();
          stepColumn(event.shiftKey ? 'up' : 'down', event.shiftKey ? 'Shift+Enter' : 'Enter');
          return;
        case 'Tab': {
          if (!plain) return;
          const at = activeIndexOf(s, shapeRef.current);
          const shapeNow = shapeRef.current;
          // At the very first or last cell, Tab leaves the grid like any other widget.
          if (at && !event.shiftKey && at.row === shapeNow.rows.length - 1 && at.col === shapeNow.columns.length - 1) return;
          if (at && event.shiftKey && at.row === 0 && at.col === 0) return;
          move(event.shiftKey ? 'previous-cell' : 'next-cell', false);
          return;
        }
        case 'Home':
          if (event.altKey) return;
          move(mod ? 'grid-start' : 'row-start');
          return;
        case 'End':
          if (event.altKey) return;
          move(mod ? 'grid-end' : 'row-end');
          return;
        case 'PageUp':
          if (!plain) return;
          move({ page: -pageRows });
          return;
        case 'PageDown':
          if (!plain) return;
          move({ page: pageRows });
          return;
        case 'F2':
          if (!plain) return;
          event.preventDefault();
          startEdit('in-place');
          return;
        case 'Delete':
        case 'Backspace':
          if (!plain) return;
          event.preventDefault();
          clearSelection();
          return;
        case 'Escape':
          if (s.anchor) {
            event.preventDefault();
            dispatch({ type: 'clear-selection' });
          }
          return;
      }
      const altGraph = native.getModifierState?.('AltGraph') ?? false;
      if (event.key.length === 1 && (plain || altGraph) && !commandCharacters.has(event.key)) {
        event.preventDefault();
        const position = resolveActive(s, shapeRef.current);
        // In a ✓/✗ column one key is the whole value: v (or ✓) ticks, x (or ✗) crosses, and the
        // cursor goes on down at once. Anything else (N/A, LIM…) is typed as usual.
        if (position && columnByKey[position.column].valueKind === 'pass-fail' && /^[vVxX✓✗]$/.test(event.key)) {
          tick(position, event.key);
          return;
        }
        startEdit('replace', event.key);
      }
    },
    [cancelEdit, clearSelection, commandCharacters, commitEdit, dispatch, startEdit, stepColumn, tick],
  );

  // Copy and paste of ranges: the browser's own copy/paste events (they carry the clipboard
  // without asking permission), while the grid has the focus and no cell is being edited.
  useEffect(() => {
    const gridHasFocus = () => {
      const grid = gridRef.current;
      return grid !== null && document.activeElement === grid && !stateRef.current.edit;
    };
    const onCopy = (event: ClipboardEvent) => {
      if (!gridHasFocus() || !event.clipboardData) return;
      const text = copyText();
      if (text === null) return;
      event.preventDefault();
      event.clipboardData.setData('text/plain', text);
      const range = currentRange();
      if (range) say(`Copied ${range.bottom - range.top + 1} × ${range.right - range.left + 1} cells.`);
    };
    const onPaste = (event: ClipboardEvent) => {
      if (!gridHasFocus() || !event.clipboardData) return;
      event.preventDefault();
      pasteText(event.clipboardData.getData('text/plain'));
    };
    document.addEventListener('copy', onCopy);
    document.addEventListener('paste', onPaste);
    return () => {
      document.removeEventListener('copy', onCopy);
      document.removeEventListener('paste', onPaste);
    };
  }, [copyText, pasteText, say]);

  /** The text box lost the focus to something outside the grid: what was typed is saved, not dropped. */
  const onEditorBlur = useCallback(
    (event: FocusEvent<HTMLInputElement>) => {
      if (!stateRef.current.edit || event.currentTarget !== editorRef.current) return;
      const next = event.relatedTarget;
      if (next instanceof Node && gridRef.current?.contains(next)) return;
      commitEdit(null, true);
    },
    [commitEdit],
  );

  const onCellPointerDown = useCallback(
    (position: GridPosition, extend: boolean) => {
      const s = stateRef.current;
      const active = resolveActive(s, shapeRef.current);
      if (s.edit && active && active.circuitId === position.circuitId && active.column === position.column) return;
      moveTo(position, extend);
      focusGrid();
    },
    [focusGrid, moveTo],
  );

  const onCellDoubleClick = useCallback(
    (position: GridPosition) => {
      moveTo(position);
      startEdit('in-place');
    },
    [moveTo, startEdit],
  );

  const active = resolveActive(state, shape);
  const activeIdx = activeIndexOf(state, shape);
  const range = selectionRange(state, shape);
  const activeCircuit: Circuit | null = active ? (circuitById.get(active.circuitId) ?? null) : null;

  return {
    shape,
    columns,
    state,
    stateRef,
    dispatch,
    active,
    activeIndex: activeIdx,
    activeCircuit,
    range,
    cellErrors,
    notice,
    say,
    gridRef,
    editorRef,
    canUndo: undoDepth.past > 0,
    canRedo: undoDepth.future > 0,
    read,
    focusGrid,
    moveTo,
    startEdit,
    cancelEdit,
    commitEdit,
    applyChanges,
    clearSelection,
    fillFromAbove,
    fillDown,
    copyText,
    pasteText,
    undo,
    redo,
    /** Records an action done outside the grid (a file import) as one step of the undo. */
    recordUndo: (entry: UndoEntry) => setUndo(pushUndo(undoRef.current, entry)),
    onKeyDown,
    onEditorBlur,
    onCellPointerDown,
    onCellDoubleClick,
  };
}

export type GridController = ReturnType<typeof useGridController>;
