import { useVirtualizer } from '@tanstack/react-virtual';
import { memo, startTransition, useCallback, useEffect, useLayoutEffect, useMemo, useRef, useState, type KeyboardEvent, type FocusEvent, type MouseEvent, type RefObject, type UIEvent } from 'react';
import type { Circuit } from '../../../../shared/schemas/boards.ts';
import { columnGroups, type ColumnDef } from '../../../../shared/schemas/columns.ts';
import type { Severity } from '../../../../shared/schemas/findings.ts';
import { cellText } from '../grid/cell-value.ts';
import { severitySymbol, severityWord, type CellFindings, type FindingsIndex, type RowFindings } from '../grid/findings-index.ts';
import type { CellIndex, EditState, GridPosition, IndexRange } from '../grid/grid-state.ts';
import { buildStep, rowsBeforeJump, rowsToRender } from '../grid/rows-ahead.ts';
import { afterNextFrame } from '../sync/after-next-frame.ts';
import type { Conflict } from '../sync/types.ts';
import { frozenColumn, type GridColumn } from '../layout/console-layout.ts';
import { cellDomId, cellErrorDomId, cellFindingDomId, cellKey, rowHeaderDomId } from './dom-ids.ts';

/** Fixed row height (px): dense, and what the virtualiser counts on. */
export const rowHeight = 28;
const groupHeaderHeight = 22;
const columnHeaderHeight = 34;
export const headerHeight = groupHeaderHeight + columnHeaderHeight;
export const rowHeaderWidth = 68;
/** Rows built beyond those in view on each side (the virtualiser's overscan). */
const overscan = 6;
/** Rows built ahead of a jump per frame (see rows-ahead.ts): a few milliseconds of work. */
const rowsAheadPerFrame = 3;

/** Colours per severity; each also shows its symbol (see severitySymbol), never colour alone. */
export const severityCellClass: Readonly<Record<Severity, string>> = {
  error: 'bg-danger-soft text-danger',
  warning: 'bg-amber-50 text-amber-900',
  note: 'bg-sky-50 text-sky-900',
  // A reading still to type: a quiet mark, so real faults stand out on a half-typed board.
  todo: 'text-muted',
};

export const severityBadgeClass: Readonly<Record<Severity, string>> = {
  error: 'bg-danger text-white',
  warning: 'bg-amber-500 text-black',
  note: 'bg-sky-700 text-white',
  todo: 'border border-line-strong text-muted',
};

export interface BoardGridProps {
  /** Accessible name of the grid, e.g. "Schedule of test results, board DB-1". */
  label: string;
  circuits: readonly Circuit[];
  columns: readonly ColumnDef[];
  activeIndex: CellIndex | null;
  range: IndexRange | null;
  edit: EditState | null;
  findings: FindingsIndex;
  /** Conflicts by circuit id, then column key. */
  conflicts: ReadonlyMap<number, ReadonlyMap<string, Conflict>>;
  /** Messages for text refused at a cell (not saved), by `cellKey`. */
  cellErrors: ReadonlyMap<string, string>;
  /** Columns with an edit not yet on the server, per circuit, as " key key " (absent when none). */
  pending: ReadonlyMap<number, string>;
  /** Settles the conflict on a cell (from the choices shown under the active cell). */
  onResolveConflict: (conflict: Conflict, choice: 'keep-theirs' | 'overwrite') => void;
  gridRef: RefObject<HTMLDivElement | null>;
  editorRef: RefObject<HTMLInputElement | null>;
  onKeyDown: (event: KeyboardEvent<HTMLDivElement>) => void;
  /** The cell editor lost the focus. */
  onEditorBlur: (event: FocusEvent<HTMLInputElement>) => void;
  onCellPointerDown: (position: GridPosition, extend: boolean) => void;
  onCellDoubleClick: (position: GridPosition) => void;
}

const emptyRowFindings: RowFindings = new Map();
const emptyRowConflicts: ReadonlyMap<string, Conflict> = new Map();
const emptyRowErrors: ReadonlyMap<string, string> = new Map();

/**
 * The schedule as an ARIA grid: two header rows (groups, then columns with their units), one row
 * per circuit with its number as a sticky row header, virtualised so only the rows in view exist.
 *
 * Focus: the grid element keeps the keyboard focus and names the active cell with
 * `aria-activedescendant`; while a cell is being edited, its text box inside the cell has the focus
 * and its keys still reach the grid's handler by bubbling.
 */
export function BoardGrid(props: BoardGridProps) {
  const { circuits, columns, activeIndex, range, edit, findings, conflicts, cellErrors, gridRef } = props;

  const offsets = useMemo(() => {
    const lefts: number[] = [];
    let x = rowHeaderWidth;
    for (const c of columns) {
      lefts.push(x);
      x += c.width;
    }
    return { lefts, total: x };
  }, [columns]);

  const virtualizer = useVirtualizer({
    count: circuits.length,
    getScrollElement: () => gridRef.current,
    estimateSize: () => rowHeight,
    overscan,
    scrollMargin: headerHeight,
    getItemKey: (index) => circuits[index]?.id ?? index,
    // The virtualiser re-renders on its scroll notice; with flushSync (its default) that render ran
    // inside the scroll event, on top of the frame PageDown had already built. Batched, it joins
    // React's next render.
    useFlushSync: false,
  });

  // The rows in view (with the virtualiser's overscan) are built at once; the rows the cursor's
  // next jump will show are built beforehand, a few per frame (see rows-ahead.ts).
  const inViewItems = virtualizer.getVirtualItems();
  const inView = { first: inViewItems[0]?.index ?? 0, last: inViewItems[inViewItems.length - 1]?.index ?? -1 };
  const visible = virtualizer.range;
  const wantedAhead = rowsBeforeJump({
    active: activeIndex?.row ?? -1,
    visible: visible ? { first: visible.startIndex, last: visible.endIndex } : { first: 0, last: -1 },
    count: circuits.length,
    page: Math.ceil((virtualizer.scrollRect?.height ?? 0) / rowHeight) + overscan,
  });
  const builtAhead = useRowsBuiltAhead(wantedAhead.join(','));
  const rowIndices = rowsToRender(inView, builtAhead, circuits.length);

  // Where the grid is scrolled and how big it is, kept from scroll and resize events, so moving
  // the cursor never has to ask the browser for a fresh layout in the middle of a keystroke.
  const viewport = useRef({ top: 0, left: 0, width: 0, height: 0 });
  useLayoutEffect(() => {
    const el = gridRef.current;
    if (!el) return;
    viewport.current = { top: el.scrollTop, left: el.scrollLeft, width: el.clientWidth, height: el.clientHeight };
    const observer = new ResizeObserver(() => {
      viewport.current.width = el.clientWidth;
      viewport.current.height = el.clientHeight;
    });
    observer.observe(el);
    return () => observer.disconnect();
  }, [gridRef]);
  const onScroll = (event: UIEvent<HTMLDivElement>) => {
    viewport.current.top = event.currentTarget.scrollTop;
    viewport.current.left = event.currentTarget.scrollLeft;
  };

  // Bring the active cell into view when the cursor moves (not when data changes: a live update
  // never scrolls the typist away). Vertically it jumps by most of a page rather than a row at a
  // time, so typing down a long column scrolls once every dozen values and shows the rows ahead.
  const activeRow = activeIndex?.row ?? -1;
  const activeCol = activeIndex?.col ?? -1;
  useLayoutEffect(() => {
    const el = gridRef.current;
    if (!el || activeRow < 0 || activeCol < 0) return;
    const view = viewport.current;
    const top = headerHeight + activeRow * rowHeight;
    const bodyHeight = Math.max(rowHeight, view.height - headerHeight);
    const lead = Math.floor(bodyHeight / 3 / rowHeight) * rowHeight;
    if (top - headerHeight < view.top) el.scrollTop = view.top = Math.max(0, top - headerHeight - Math.max(0, bodyHeight - lead - rowHeight));
    else if (top + rowHeight > view.top + view.height) el.scrollTop = view.top = top - headerHeight - lead;
    const left = offsets.lefts[activeCol] ?? 0;
    const width = columns[activeCol]?.width ?? 0;
    // The circuit number and the description stay at the left: a cell must clear them to be seen.
    const frozenWidth = rowHeaderWidth + (columns[0]?.key === frozenColumn && activeCol > 0 ? columns[0].width : 0);
    if (left - frozenWidth < view.left) el.scrollLeft = view.left = Math.max(0, left - frozenWidth);
    else if (left + width > view.left + view.width) el.scrollLeft = view.left = left + width - view.width;
  }, [activeRow, activeCol, gridRef, offsets, columns]);

  const activeCircuit = activeRow >= 0 ? circuits[activeRow] : undefined;
  const activeColumn = activeCol >= 0 ? columns[activeCol] : undefined;
  const activeDescendant = activeCircuit && activeColumn && !edit ? cellDomId(activeCircuit.id, activeColumn.key) : undefined;

  const linkNotes = useMemo(() => spurLinkNotes(circuits), [circuits]);

  const groups = useMemo(
    () =>
      columnGroups
        .map((g) => {
          const first = columns.findIndex((c) => c.group === g.id);
          const span = columns.filter((c) => c.group === g.id).length;
          const width = columns.filter((c) => c.group === g.id).reduce((sum, c) => sum + c.width, 0);
          return { ...g, first, span, width };
        })
        .filter((g) => g.span > 0),
    [columns],
  );

  return (
    <div
      ref={gridRef}
      role="grid"
      aria-label={props.label}
      aria-rowcount={circuits.length + 2}
      aria-colcount={columns.length + 1}
      aria-multiselectable="true"
      aria-activedescendant={activeDescendant}
      tabIndex={0}
      onKeyDown={props.onKeyDown}
      onScroll={onScroll}
      className="relative min-h-0 flex-1 overflow-auto bg-surface focus:outline-none focus-visible:ring-2 focus-visible:ring-accent focus-visible:ring-inset"
    >
      <GridHeader columns={columns} groups={groups} width={offsets.total} activeCol={activeCol} />
      <div role="presentation" className="relative" style={{ height: virtualizer.getTotalSize() - headerHeight, width: offsets.total }}>
        {rowIndices.map((index) => {
          const circuit = circuits[index];
          if (!circuit) return null;
          const isActiveRow = index === activeRow;
          const inRange = range !== null && index >= range.top && index <= range.bottom;
          return (
            <GridRow
              key={circuit.id}
              circuit={circuit}
              index={index}
              top={index * rowHeight}
              width={offsets.total}
              columns={columns}
              activeCol={isActiveRow ? activeCol : -1}
              edit={isActiveRow ? edit : null}
              rangeLeft={inRange ? range.left : -1}
              rangeRight={inRange ? range.right : -1}
              findings={findings.byCircuit.get(circuit.id) ?? emptyRowFindings}
              conflicts={conflicts.get(circuit.id) ?? emptyRowConflicts}
              errors={rowErrors(cellErrors, circuit.id)}
              pending={props.pending.get(circuit.id) ?? ''}
              linkNote={linkNotes.get(circuit.id) ?? ''}
              onResolveConflict={props.onResolveConflict}
              editorRef={props.editorRef}
              onEditorBlur={props.onEditorBlur}
              onCellPointerDown={props.onCellPointerDown}
              onCellDoubleClick={props.onCellDoubleClick}
            />
          );
        })}
      </div>
    </div>
  );
}

/**
 * The rows built ahead of the cursor's next jump (given as "row,row,…", nearest first): they
 * follow the wanted rows a few per frame, each step a background render after a frame, so no
 * keystroke's frame pays for building them.
 */
function useRowsBuiltAhead(wantedKey: string): readonly number[] {
  const [built, setBuilt] = useState<readonly number[]>([]);
  useEffect(() => {
    const wanted = wantedKey === '' ? [] : wantedKey.split(',').map(Number);
    const next = buildStep(built, wanted, rowsAheadPerFrame);
    if (next.length === built.length && next.every((row, i) => row === built[i])) return;
    return afterNextFrame(() => startTransition(() => setBuilt(next)));
  }, [built, wantedKey]);
  return built;
}

interface GridHeaderProps {
  columns: readonly ColumnDef[];
  groups: ReadonlyArray<{ id: string; label: string; first: number; span: number; width: number }>;
  width: number;
  activeCol: number;
}

/** The two sticky header rows: column groups, then columns with their units. */
const GridHeader = memo(function GridHeader({ columns, groups, width, activeCol }: GridHeaderProps) {
  return (
    <div style={{ width }} className="sticky top-0 z-20 bg-surface">
      <div role="row" aria-rowindex={1} className="flex border-b border-line" style={{ height: groupHeaderHeight }}>
        <div
          role="columnheader"
          aria-colindex={1}
          className="sticky left-0 z-10 border-r border-line bg-surface"
          style={{ width: rowHeaderWidth }}
        />
        {groups.map((g) => (
          <div
            key={g.id}
            role="columnheader"
            aria-colindex={g.first + 2}
            aria-colspan={g.span}
            className="truncate border-r border-line-strong px-1.5 text-xs leading-[22px] font-semibold tracking-wide text-muted uppercase"
            style={{ width: g.width }}
          >
            {g.label}
          </div>
        ))}
      </div>
      <div role="row" aria-rowindex={2} className="flex border-b border-line-strong" style={{ height: columnHeaderHeight }}>
        <div
          role="columnheader"
          aria-colindex={1}
          className="sticky left-0 z-10 flex items-end border-r border-line bg-surface px-1.5 pb-1 text-xs font-semibold"
          style={{ width: rowHeaderWidth }}
        >
          Circuit
        </div>
        {columns.map((c, i) => (
          <div
            key={c.key}
            role="columnheader"
            aria-colindex={i + 2}
            aria-label={c.unit ? `${c.label} (${c.unit})` : c.label}
            title={c.meaning}
            className={`flex flex-col justify-end border-r border-line px-1.5 pb-1 leading-tight ${i === activeCol ? 'bg-accent-soft' : ''} ${
              c.key === frozenColumn ? 'z-10 bg-surface' : ''
            } ${summaryOf(c) ? 'italic' : ''}`}
            style={{ width: c.width, ...frozenStyle(c) }}
          >
            <span className="truncate text-xs font-semibold">{c.label}</span>
            <span className="h-3.5 truncate text-[11px] text-muted">{c.unit ?? ''}</span>
          </div>
        ))}
      </div>
    </div>
  );
});

function summaryOf(column: ColumnDef): readonly ColumnDef['key'][] | undefined {
  return (column as GridColumn).summaryOf;
}

/** A folded group's cell: the values of its columns side by side ("60898 B 32 6"). */
function summaryText(circuit: Circuit, keys: readonly ColumnDef['key'][]): string {
  const parts: string[] = [];
  for (const key of keys) {
    const text = cellText(circuit, key);
    if (text !== '') parts.push(text);
  }
  return parts.join(' ');
}

/** The frozen description's left edge: just right of the circuit number. */
const frozenStyle = (column: ColumnDef) => (column.key === frozenColumn ? { position: 'sticky' as const, left: rowHeaderWidth } : undefined);

/** The refused-text messages of one circuit (a shared empty map when none, so rows stay memoised). */
function rowErrors(errors: ReadonlyMap<string, string>, circuitId: number): ReadonlyMap<string, string> {
  if (errors.size === 0) return emptyRowErrors;
  let found: Map<string, string> | null = null;
  const prefix = `${circuitId}:`;
  for (const [key, message] of errors) {
    if (key.startsWith(prefix)) (found ??= new Map()).set(key.slice(prefix.length), message);
  }
  return found ?? emptyRowErrors;
}

/**
 * What a row says of its spur links, beside its description: a spur names its ring and origin
 * (and whether it is fused), a ring lists its spurs.
 */
export function spurLinkNotes(circuits: readonly Circuit[]): Map<number, string> {
  const notes = new Map<number, string>();
  const byId = new Map(circuits.map((c) => [c.id, c]));
  const spursOf = new Map<number, Circuit[]>();
  for (const c of circuits) {
    if (c.spurRingId === null) continue;
    const ring = byId.get(c.spurRingId);
    const protection = c.spurProtection ? `, ${c.spurProtection}` : '';
    notes.set(c.id, ring ? `spur of ${ring.number}${c.spurOriginPoint ? ` from ${c.spurOriginPoint}` : ''}${protection}` : 'spur of a ring not on this board');
    if (ring) {
      let list = spursOf.get(ring.id);
      if (!list) spursOf.set(ring.id, (list = []));
      list.push(c);
    }
  }
  for (const [ringId, spurs] of spursOf) {
    notes.set(ringId, `spurs: ${spurs.map((s) => `${s.number}${s.spurProtection ? ` (${s.spurProtection})` : ''}`).join(', ')}`);
  }
  return notes;
}

interface GridRowProps {
  /** The row's spur link in words ("spur of 3 from socket 4, unfused"; "spurs: 5, 6"), or ''. */
  linkNote: string;
  circuit: Circuit;
  index: number;
  top: number;
  width: number;
  columns: readonly ColumnDef[];
  activeCol: number;
  edit: EditState | null;
  rangeLeft: number;
  rangeRight: number;
  findings: RowFindings;
  conflicts: ReadonlyMap<string, Conflict>;
  errors: ReadonlyMap<string, string>;
  pending: string;
  onResolveConflict: (conflict: Conflict, choice: 'keep-theirs' | 'overwrite') => void;
  editorRef: RefObject<HTMLInputElement | null>;
  onEditorBlur: (event: FocusEvent<HTMLInputElement>) => void;
  onCellPointerDown: (position: GridPosition, extend: boolean) => void;
  onCellDoubleClick: (position: GridPosition) => void;
}

const GridRow = memo(function GridRow(props: GridRowProps) {
  const { circuit, columns, activeCol, edit, rangeLeft, rangeRight, findings, conflicts, errors } = props;
  const circuitFindings = findings.get('');
  const isActiveRow = activeCol >= 0;
  const hasRange = rangeLeft >= 0 && (rangeRight > rangeLeft || !isActiveRow);
  const activeConflict = isActiveRow && !edit ? conflicts.get(columns[activeCol]?.key ?? '') : undefined;

  const { onCellPointerDown } = props;
  const circuitId = circuit.id;
  const pointer = useCallback(
    (event: MouseEvent, column: ColumnDef['key']) => {
      if (event.button !== 0) return;
      event.preventDefault();
      onCellPointerDown({ circuitId, column }, event.shiftKey);
    },
    [onCellPointerDown, circuitId],
  );

  return (
    <div
      role="row"
      aria-rowindex={props.index + 3}
      className={`absolute left-0 flex border-b border-line ${isActiveRow ? 'bg-accent-soft/40' : ''}`}
      style={{ height: rowHeight, width: props.width, transform: `translateY(${props.top}px)`, zIndex: activeConflict ? 5 : undefined }}
    >
      <div
        role="rowheader"
        id={rowHeaderDomId(circuit.id)}
        aria-colindex={1}
        aria-describedby={circuitFindings ? cellFindingDomId(circuit.id, '') : undefined}
        title={circuit.description || undefined}
        onMouseDown={(e) => pointer(e, columns[0]!.key)}
        className={`sticky left-0 z-10 flex items-center justify-between border-r border-line-strong px-1.5 font-mono text-[13px] font-semibold ${
          isActiveRow ? 'bg-accent-soft text-accent' : 'bg-surface'
        }`}
        style={{ width: rowHeaderWidth }}
      >
        <span className="truncate">{circuit.number}</span>
        {circuitFindings && <FindingMark cell={circuitFindings} id={cellFindingDomId(circuit.id, '')} />}
      </div>
      {columns.map((column, col) => {
        const isActive = col === activeCol;
        const reading = column.storage === 'reading' ? circuit.cells[column.key as keyof Circuit['cells']] : undefined;
        return (
          <GridCell
            key={column.key}
            circuitId={circuit.id}
            circuitNumber={circuit.number}
            column={column}
            col={col}
            text={summaryOf(column) ? summaryText(circuit, summaryOf(column)!) : cellText(circuit, column.key)}
            note={column.key === 'description' ? props.linkNote : ''}
            limReason={reading && reading.text.toUpperCase() === 'LIM' ? reading.reason : null}
            isActive={isActive}
            selected={hasRange && col >= rangeLeft && col <= rangeRight}
            edit={isActive ? edit : null}
            findings={findings.get(column.key)}
            conflict={conflicts.get(column.key)}
            conflictChoices={isActive ? activeConflict : undefined}
            error={errors.get(column.key)}
            pending={props.pending !== '' && props.pending.includes(` ${column.key} `)}
            editorRef={props.editorRef}
            onEditorBlur={props.onEditorBlur}
            onPointerDown={pointer}
            onDoubleClick={props.onCellDoubleClick}
            onResolveConflict={props.onResolveConflict}
          />
        );
      })}
    </div>
  );
});

interface GridCellProps {
  /** Words shown after the value, muted (the description's spur link). */
  note: string;
  circuitId: number;
  circuitNumber: string;
  column: ColumnDef;
  col: number;
  text: string;
  /** The reason recorded with a LIM, shown on hover. */
  limReason: string | null | undefined;
  isActive: boolean;
  selected: boolean;
  edit: EditState | null;
  findings: CellFindings | undefined;
  conflict: Conflict | undefined;
  /** The conflict whose choices show under this cell (the active one). */
  conflictChoices: Conflict | undefined;
  error: string | undefined;
  pending: boolean;
  editorRef: RefObject<HTMLInputElement | null>;
  onEditorBlur: (event: FocusEvent<HTMLInputElement>) => void;
  onPointerDown: (event: MouseEvent, column: ColumnDef['key']) => void;
  onDoubleClick: (position: GridPosition) => void;
  onResolveConflict: (conflict: Conflict, choice: 'keep-theirs' | 'overwrite') => void;
}

/** One cell: its value, its worst finding (colour and symbol), conflict and unsaved marks, or the editor. */
const GridCell = memo(function GridCell(props: GridCellProps) {
  const { circuitId, circuitNumber, column, col, text, limReason, isActive, selected, edit, findings, conflict, conflictChoices, error, pending } = props;
  const { editorRef, onEditorBlur, onPointerDown, onDoubleClick, onResolveConflict } = props;
  const severity: Severity | null = error ? 'error' : (findings?.worst.severity ?? null);
  const describedBy =
    [error ? cellErrorDomId(circuitId, column.key) : null, findings ? cellFindingDomId(circuitId, column.key) : null, conflict ? `${cellDomId(circuitId, column.key)}-conflict` : null]
      .filter(Boolean)
      .join(' ') || undefined;
  const marked = pending || conflict !== undefined || error !== undefined || findings !== undefined;
  return (
    <div
      role="gridcell"
      id={cellDomId(circuitId, column.key)}
      aria-colindex={col + 2}
      aria-selected={isActive || selected}
      aria-invalid={severity === 'error' ? true : undefined}
      aria-describedby={describedBy}
      data-cell={cellKey(circuitId, column.key)}
      title={limReason ? `Limitation: ${limReason}` : undefined}
      onMouseDown={(e) => onPointerDown(e, column.key)}
      onDoubleClick={() => onDoubleClick({ circuitId, column: column.key })}
      className={`relative flex items-center border-r border-line ${severity ? severityCellClass[severity] : ''} ${
        selected && !isActive ? 'bg-accent-soft!' : ''
      } ${isActive ? 'z-[1] outline-2 -outline-offset-2 outline-accent' : ''} ${column.key === frozenColumn ? 'z-[2] border-r-line-strong bg-surface' : ''}`}
      style={{ width: column.width, ...frozenStyle(column) }}
    >
      {isActive && edit ? (
        <CellEditor
          edit={edit}
          editorRef={editorRef}
          onBlur={onEditorBlur}
          label={`${column.label} of circuit ${circuitNumber}`}
          errorId={error ? cellErrorDomId(circuitId, column.key) : undefined}
          numeric={column.valueKind === 'reading' || column.valueKind === 'number' || column.valueKind === 'integer'}
        />
      ) : (
        <span
          className={`min-w-0 flex-1 truncate pl-1.5 ${marked ? 'pr-4' : 'pr-1'} ${column.valueKind === 'text' || column.valueKind === 'choice' ? '' : 'font-mono text-[13px]'}`}
        >
          {text}
          {props.note !== '' && <span className="text-xs text-muted"> · {props.note}</span>}
        </span>
      )}
      {conflict && (
        <span id={`${cellDomId(circuitId, column.key)}-conflict`} className="sr-only">
          Conflict: {conflict.theirsBy ?? 'someone'} wrote “{conflict.theirs}”, you wrote “{conflict.mine}”.
        </span>
      )}
      {error && (
        <span id={cellErrorDomId(circuitId, column.key)} className="sr-only">
          Not saved: {error}
        </span>
      )}
      {marked && !(isActive && edit) && (
        <span className="absolute top-1/2 right-0.5 flex -translate-y-1/2 items-center gap-px">
          {pending && (
            <span title="Not yet on the server" className="text-[10px] leading-none text-muted">
              <span aria-hidden="true">•</span>
              <span className="sr-only">not yet saved</span>
            </span>
          )}
          {conflict && (
            <span aria-hidden="true" className="rounded bg-locked px-0.5 text-[10px] leading-none font-bold text-white" title={`Conflict: theirs "${conflict.theirs}", yours "${conflict.mine}"`}>
              ⇄
            </span>
          )}
          {error ? (
            <span aria-hidden="true" className={`inline-flex h-3.5 min-w-3.5 items-center justify-center rounded px-0.5 text-[10px] leading-none font-bold ${severityBadgeClass.error}`}>
              {severitySymbol.error}
            </span>
          ) : (
            findings && <FindingMark cell={findings} id={cellFindingDomId(circuitId, column.key)} />
          )}
        </span>
      )}
      {marked && isActive && edit && findings && !error && <FindingText cell={findings} id={cellFindingDomId(circuitId, column.key)} />}
      {conflictChoices && <ConflictChoices conflict={conflictChoices} onResolve={onResolveConflict} />}
    </div>
  );
});

/**
 * Under the active cell when someone else wrote it first: both values and the two choices. The
 * keys (Alt+Shift+T, Alt+Shift+M) and the palette reach the same choices without the pointer.
 */
function ConflictChoices({ conflict, onResolve }: { conflict: Conflict; onResolve: (conflict: Conflict, choice: 'keep-theirs' | 'overwrite') => void }) {
  return (
    <div
      role="group"
      aria-label="Conflict on this cell"
      onMouseDown={(event) => event.stopPropagation()}
      className="absolute top-full left-0 z-30 mt-px w-72 rounded border border-locked bg-surface p-2 text-sm text-ink shadow-lg"
    >
      <p>
        <span aria-hidden="true" className="font-bold text-locked">⇄ </span>
        {conflict.theirsBy ?? 'Someone'} wrote <span className="font-mono font-semibold">“{conflict.theirs}”</span>; you wrote{' '}
        <span className="font-mono font-semibold">“{conflict.mine}”</span>.
      </p>
      <div className="mt-1 flex gap-1">
        <button type="button" tabIndex={-1} onClick={() => onResolve(conflict, 'keep-theirs')} className="rounded border border-line-strong px-2 py-px hover:bg-accent-soft">
          Keep theirs <kbd className="text-xs text-muted">Alt+Shift+T</kbd>
        </button>
        <button type="button" tabIndex={-1} onClick={() => onResolve(conflict, 'overwrite')} className="rounded border border-line-strong px-2 py-px hover:bg-accent-soft">
          Write mine <kbd className="text-xs text-muted">Alt+Shift+M</kbd>
        </button>
      </div>
    </div>
  );
}

/** The worst finding's symbol (visible) and its text (for `aria-describedby`, read by screen readers). */
function FindingMark({ cell, id }: { cell: CellFindings; id: string }) {
  const { worst } = cell;
  return (
    <>
      <span
        aria-hidden="true"
        title={`${severityWord[worst.severity]}: ${worst.message}`}
        className={`inline-flex h-3.5 min-w-3.5 items-center justify-center rounded px-0.5 text-[10px] leading-none font-bold ${severityBadgeClass[worst.severity]}`}
      >
        {severitySymbol[worst.severity]}
      </span>
      <FindingText cell={cell} id={id} />
    </>
  );
}

/** The text of a cell's worst finding, hidden on screen, for `aria-describedby`. */
function FindingText({ cell, id }: { cell: CellFindings; id: string }) {
  const { worst, all } = cell;
  const more = all.length > 1 ? ` (and ${all.length - 1} more)` : '';
  return (
    <span id={id} className="sr-only">
      {severityWord[worst.severity]}: {worst.message}
      {worst.limit ? ` Limit ${worst.limit}.` : ''}
      {more}
    </span>
  );
}

interface CellEditorProps {
  edit: EditState;
  editorRef: RefObject<HTMLInputElement | null>;
  onBlur: (event: FocusEvent<HTMLInputElement>) => void;
  label: string;
  errorId: string | undefined;
  numeric: boolean;
}

/**
 * The text box of the cell being edited. Uncontrolled: each character typed changes only the
 * browser's text box, not React state, so typing costs no re-render of the grid. The console reads
 * the value when the edit is committed.
 */
function CellEditor({ edit, editorRef, onBlur, label, errorId, numeric }: CellEditorProps) {
  useLayoutEffect(() => {
    const input = editorRef.current;
    if (!input) return;
    input.focus({ preventScroll: true });
    const end = input.value.length;
    input.setSelectionRange(end, end);
  }, [editorRef]);
  return (
    <input
      ref={editorRef}
      defaultValue={edit.draft}
      onBlur={onBlur}
      aria-label={label}
      aria-invalid={errorId ? true : undefined}
      aria-describedby={errorId}
      autoComplete="off"
      spellCheck={false}
      inputMode={numeric ? 'decimal' : undefined}
      data-edit-mode={edit.mode}
      className="h-full w-full min-w-0 bg-surface px-1.5 font-mono text-[13px] text-ink outline-none"
    />
  );
}
