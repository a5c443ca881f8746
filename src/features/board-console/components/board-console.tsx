import { lazy, Suspense, useCallback, useContext, useDeferredValue, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import { QueryClientContext } from '@tanstack/react-query';
import type { BoardDetail } from '../../../../shared/schemas/boards.ts';
import type { Role } from '../../../../shared/schemas/common.ts';
import { columnByKey, columnGroups, isReadingKey, type ColumnKey } from '../../../../shared/schemas/columns.ts';
import { layoutColumns, loadLayout, saveLayout, type ConsoleLayout } from '../layout/console-layout.ts';
import type { Finding } from '../../../../shared/schemas/findings.ts';
import { CommandPalette } from '../../../components/command-palette.tsx';
import { KeysOverlay, type KeysSection } from '../../../components/keys-overlay.tsx';
import { createRegistry } from '../../../lib/commands/registry.ts';
import { parseShortcut } from '../../../lib/commands/shortcut.ts';
import type { Command } from '../../../lib/commands/types.ts';
import { useCommandKeys } from '../../../lib/commands/use-command-keys.ts';
import { createConsoleCommands, gridKeyRows, gridReservedKeys, type ConsoleContext } from '../commands.ts';
import { indexFindings, signatureOf, type FindingsIndex } from '../grid/findings-index.ts';
import type { GridPosition } from '../grid/grid-state.ts';
import type { CellChange } from '../grid/undo-stack.ts';
import { QuickEntryLine } from '../quick-entry/quick-entry-line.tsx';
import { quickEntryWordsSection, type QuickEntry, type QuickEntryCircuit } from '../quick-entry/parse-quick-entry.ts';
import type { BoardSync, Conflict } from '../sync/types.ts';
import { BoardDetailsForm } from './board-details-form.tsx';
import { CalculatorsPanel } from './calculators-panel.tsx';
import { HistoryPanel, type HistoryTarget } from './history-panel.tsx';
import { RingSocketsPanel } from './ring-sockets-panel.tsx';
import { BoardGrid } from './board-grid.tsx';
import { ConflictList } from './conflict-list.tsx';
import { ConsoleHeader } from './console-header.tsx';
import { cellKey } from './dom-ids.ts';
import { FindingsPanel } from './findings-panel.tsx';
import { StatusLine } from './status-line.tsx';
import { useGridController } from './use-grid-controller.ts';
import type { ImportDone } from '../import/components/import-dialog.tsx';
import { sendImportBatch } from '../import/api/import-api.ts';

// Loaded when first opened: neither is on the typing path.
const ImportDialog = lazy(() => import('../import/components/import-dialog.tsx').then((m) => ({ default: m.ImportDialog })));
const PhotoPanel = lazy(() => import('../photos/photo-panel.tsx').then((m) => ({ default: m.PhotoPanel })));

export interface BoardConsoleProps {
  sync: BoardSync;
  detail: BoardDetail;
  /** The checker's findings on `detail` as shown (see BoardConsolePage). */
  findings: readonly Finding[];
  role: Role | null;
  /** Why the board cannot be locked yet (the completeness gate); null while not known. */
  lockReasons?: readonly string[] | null;
  /** The signed-in person's id: their folded groups and findings panel are remembered under it. */
  personId?: number | null;
}

function downloadText(fileName: string, mimeType: string, text: string): void {
  const url = URL.createObjectURL(new Blob([text], { type: mimeType }));
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.click();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

function messageOf(error: unknown): string {
  return error instanceof Error ? error.message : 'That did not work.';
}

const noPendingMarks: ReadonlyMap<number, string> = new Map();

/** Text-editing keys that belong to a focused text field, never to the console's commands. */
function keepTextEditingKeys(event: KeyboardEvent) {
  if ((event.ctrlKey || event.metaKey) && !event.altKey && ['z', 'y', 'a', 'c', 'v', 'x'].includes(event.key.toLowerCase())) {
    event.stopPropagation();
  }
}

/**
 * The board console: header, quick-entry line, the grid with the findings beside it, conflicts,
 * and the status line; the palette and the keys overlay on top. One command registry feeds the
 * palette, the key bindings and the overlay.
 */
export function BoardConsole({ sync, detail, findings, role, lockReasons = null, personId = null }: BoardConsoleProps) {
  const board = detail.board;
  const lockedReason =
    board.state === 'locked' ? `Board ${board.reference} is locked${board.lockedBy ? ` by ${board.lockedBy.name}` : ''}: a reviewer must unlock it before anything changes.` : null;

  const ctxRef = useRef<ConsoleContext | null>(null);
  const registry = useMemo(
    () => createRegistry(createConsoleCommands(() => ctxRef.current), { reserved: gridReservedKeys }),
    [],
  );
  // Characters that run a command on their own (e.g. "?"): typing them on a cell runs the command.
  const commandCharacters = useMemo(() => {
    const set = new Set<string>();
    for (const binding of registry.bindings) {
      const presses = parseShortcut(binding.keys);
      const press = presses[0];
      if (presses.length === 1 && press && !binding.firesInTextFields && press.key.length === 1) set.add(press.key);
    }
    return set;
  }, [registry]);

  const [layout, setLayoutState] = useState<ConsoleLayout>(() => loadLayout(personId));
  const setLayout = useCallback(
    (change: (current: ConsoleLayout) => ConsoleLayout) =>
      setLayoutState((current) => {
        const next = change(current);
        saveLayout(personId, next);
        return next;
      }),
    [personId],
  );
  const gridColumns = useMemo(() => layoutColumns(layout.folded, undefined, layout.detailsFolded), [layout.folded, layout.detailsFolded]);

  const grid = useGridController({ sync, detail, lockedReason, commandCharacters, columns: gridColumns });

  const [paletteOpen, setPaletteOpen] = useState(false);
  const [paletteCommand, setPaletteCommand] = useState<string | undefined>(undefined);
  const [keysOpen, setKeysOpen] = useState(false);
  const [editingBoard, setEditingBoard] = useState(false);
  const [calculatorsOpen, setCalculatorsOpen] = useState(false);
  const [history, setHistory] = useState<HistoryTarget | null>(null);
  const [ringSocketsOf, setRingSocketsOf] = useState<number | null>(null);
  const [quickEntryNote, setQuickEntryNote] = useState<string | undefined>(undefined);
  const quickEntryRef = useRef<HTMLInputElement | null>(null);
  const findingsRef = useRef<HTMLUListElement | null>(null);
  const [importOpen, setImportOpen] = useState(false);
  const [photosShown, setPhotosShown] = useState(false);
  const photoPanelRef = useRef<HTMLDivElement | null>(null);
  // Read without requiring a provider: the console's own tests render it bare; the app always has one.
  const queryClient = useContext(QueryClientContext);

  // Findings arranged per cell; unchanged circuits keep their objects so their rows do not re-render.
  const findingsIndexRef = useRef<FindingsIndex | undefined>(undefined);
  const findingsIndex = useMemo(() => {
    const next = indexFindings(findings, findingsIndexRef.current);
    findingsIndexRef.current = next;
    return next;
  }, [findings]);

  // Last time's readings by circuit (boards started from an earlier job), for the status line.
  const previousByCircuit = useMemo(() => new Map((detail.previousReadings ?? []).map((p) => [p.circuitId, p])), [detail.previousReadings]);

  const conflictsByCell = useMemo(() => {
    const map = new Map<number, Map<string, Conflict>>();
    for (const conflict of sync.conflicts) {
      let row = map.get(conflict.circuitId);
      if (!row) map.set(conflict.circuitId, (row = new Map()));
      row.set(conflict.column, conflict);
    }
    return map;
  }, [sync.conflicts]);

  // Rebuilt only when circuits are added, removed, reordered or renumbered, not on each value typed.
  const numbersKey = detail.circuits.map((c) => `${c.id}\t${c.number}\t${c.kind}`).join('\n');
  const quickEntryCircuits: QuickEntryCircuit[] = useMemo(
    () =>
      numbersKey === ''
        ? []
        : numbersKey.split('\n').map((line) => {
            const [id, number = '', kind] = line.split('\t');
            return { id: Number(id), number, kind: kind as QuickEntryCircuit['kind'] };
          }),
    [numbersKey],
  );
  const circuitNumbers = useMemo(() => new Map(quickEntryCircuits.map((c) => [c.id, c.number])), [quickEntryCircuits]);

  // The list beside the grid keeps its array while the findings say the same, so it does not re-render.
  const stableFindings = useRef<{ signature: string; findings: readonly Finding[] }>({ signature: '', findings: [] });
  const findingsSignature = signatureOf(findings);
  if (findingsSignature !== stableFindings.current.signature) stableFindings.current = { signature: findingsSignature, findings };
  // The list is long and not where the typist looks while typing: it follows a moment later, after
  // the keystroke's own frame (React renders the deferred value when the urgent work is done).
  const panelFindings = useDeferredValue(stableFindings.current.findings);

  // Which cells still wait for the server: made from the outbox by the sync engine's hook, so a
  // keystroke does not ask about every cell of the board.
  const pending = sync.pendingMarks ?? noPendingMarks;

  // Stable across renders (it reads the sync engine from the context ref), so the grid's memoised
  // rows and cells do not re-render because of it.
  const resolveConflict = useCallback((conflict: Conflict, choice: 'keep-theirs' | 'overwrite') => {
    ctxRef.current?.sync.resolveConflict(conflict.editId, choice);
    ctxRef.current?.grid.focusGrid();
  }, []);

  const active = grid.active;
  const activeConflict = active ? (conflictsByCell.get(active.circuitId)?.get(active.column) ?? null) : null;

  // A dialog gives the focus back to where it was; when that was a cell editor now gone (its text
  // was saved as the focus left it), the grid takes the focus instead of the page body.
  const refocusAfterDialog = useCallback(() => {
    setTimeout(() => {
      const focused = document.activeElement;
      if (!focused || focused === document.body) ctxRef.current?.grid.focusGrid();
    }, 0);
  }, []);
  const onPaletteOpenChange = useCallback(
    (open: boolean) => {
      setPaletteOpen(open);
      if (!open) refocusAfterDialog();
    },
    [refocusAfterDialog],
  );
  const onKeysOpenChange = useCallback(
    (open: boolean) => {
      setKeysOpen(open);
      if (!open) refocusAfterDialog();
    },
    [refocusAfterDialog],
  );

  const openPalette = useCallback((commandId?: string) => {
    setPaletteCommand(commandId);
    setPaletteOpen(true);
  }, []);

  const ctx: ConsoleContext = {
    detail,
    sync,
    role,
    lockReasons,
    grid,
    activeConflict,
    ui: {
      openPalette: () => openPalette(),
      openKeys: () => setKeysOpen(true),
      openQuickEntry: () => quickEntryRef.current?.focus(),
      focusFindings: () => {
        if (layout.findings === 'hidden') {
          // Going to the findings shows the panel again (narrow or wide as it was before hiding: wide).
          setLayout((current) => ({ ...current, findings: 'wide' }));
          setTimeout(() => findingsRef.current?.querySelector<HTMLButtonElement>('button[data-finding]:not(:disabled)')?.focus(), 0);
          return;
        }
        const first = findingsRef.current?.querySelector<HTMLButtonElement>('button[data-finding]:not(:disabled)');
        if (first) first.focus();
        else grid.say('There is no finding to go to.');
      },
      download: downloadText,
      layout,
      toggleGroup: (group) => {
        const folding = !layout.folded.includes(group);
        setLayout((current) => ({ ...current, folded: folding ? [...current.folded, group] : current.folded.filter((g) => g !== group) }));
        const label = columnGroups.find((g) => g.id === group)?.label ?? group;
        grid.say(`${label} ${folding ? 'folded to one column' : 'unfolded'}.`);
      },
      editBoard: () => setEditingBoard(true),
      openCalculators: () => setCalculatorsOpen(true),
      openHistory: (target) => setHistory(target),
      openRingSockets: (circuitId) => setRingSocketsOf(circuitId),
      toggleDetails: () => {
        const folding = !layout.detailsFolded;
        // Folding the details is the laptop layout: a wide findings panel goes narrow with it, so
        // every reading column fits beside it at 1366 px.
        const narrowed = folding && layout.findings === 'wide';
        setLayout((current) => ({ ...current, detailsFolded: folding, findings: narrowed ? 'narrow' : current.findings }));
        grid.say(
          folding
            ? `Circuit details folded into one column beside the description; readings drawn narrow${narrowed ? '; findings panel narrow' : ''}.`
            : 'Circuit details unfolded.',
        );
      },
      setFindingsPanel: (size) => {
        setLayout((current) => ({ ...current, findings: size }));
        grid.say(size === 'hidden' ? 'Findings panel hidden.' : `Findings panel ${size}.`);
      },
      openImport: () => setImportOpen(true),
      showPhotos: () => {
        setPhotosShown(true);
        // The panel may be loading: focus it once it is there.
        const focus = (tries: number) => {
          if (photoPanelRef.current) photoPanelRef.current.focus();
          else if (tries > 0) setTimeout(() => focus(tries - 1), 50);
        };
        setTimeout(() => focus(40), 0);
      },
      hidePhotos: () => {
        setPhotosShown(false);
        grid.focusGrid();
      },
      photosShown,
    },
  };
  ctxRef.current = ctx;

  /** An import landed: one step of the undo, undone (and redone) as one batch on the server. */
  const onImported = useCallback(
    (done: ImportDone) => {
      setImportOpen(false);
      const boardId = detail.board.id;
      const batch = async (direction: 'undo' | 'redo') => {
        const current = ctxRef.current?.detail;
        const byId = new Map((current?.circuits ?? []).map((c) => [c.id, c]));
        const writes = done.changes.map((c) => ({
          circuitId: c.circuitId,
          column: c.column,
          text: direction === 'undo' ? c.before : c.after,
          reason: null,
          version: byId.get(c.circuitId)?.cells[c.column]?.version ?? 0,
        }));
        if (!queryClient) throw new Error('The app is not connected to its data.');
        const result = await sendImportBatch(queryClient, boardId, { fileName: done.fileName, action: direction === 'undo' ? 'undo' : 'import', writes });
        return direction === 'undo'
          ? `Undone: the import of ${done.fileName} (${result.written} readings put back).`
          : `Redone: the import of ${done.fileName} (${result.written} readings).`;
      };
      ctxRef.current?.grid.recordUndo({
        label: `the import of ${done.fileName}`,
        changes: done.changes.map((c) => ({ circuitId: c.circuitId, column: c.column, before: c.before, after: c.after })),
        apply: batch,
      });
      ctxRef.current?.grid.say(`Imported ${done.written} readings from ${done.fileName}. Undo (Ctrl+Z) takes the whole import back as one step.`);
      ctxRef.current?.grid.focusGrid();
    },
    [detail.board.id, queryClient],
  );

  const onCommandError = useCallback((error: unknown, command: Command<ConsoleContext>) => {
    ctxRef.current?.grid.say(`${command.label}: ${messageOf(error)}`, 'error');
  }, []);

  useCommandKeys(registry, ctx, {
    enabled: !paletteOpen && !keysOpen && !importOpen && !editingBoard && !calculatorsOpen && !history && ringSocketsOf === null,
    onNeedsArgs: (command) => openPalette(command.id),
    onUnavailable: (command, reason) => ctxRef.current?.grid.say(`${command.label}: ${reason}.`, 'error'),
    onError: onCommandError,
  });

  const jumpTo = useCallback(
    (position: GridPosition) => {
      grid.moveTo(position);
      grid.focusGrid();
    },
    [grid.moveTo, grid.focusGrid],
  );

  const onJumpToFinding = useCallback(
    (finding: Finding) => {
      if (finding.circuitId === null) return;
      const column = (finding.columns.find((c) => c in columnByKey) ?? ctxRef.current?.grid.active?.column ?? 'description') as ColumnKey;
      jumpTo({ circuitId: finding.circuitId, column });
    },
    [jumpTo],
  );

  const applyQuickEntry = useCallback(
    (entries: QuickEntry[]) => {
      const g = ctxRef.current?.grid;
      if (!g) return;
      const changes: CellChange[] = entries.map((e) => {
        const position = { circuitId: e.circuitId, column: e.column };
        return { ...position, before: g.read(position), after: e.text };
      });
      const result = g.applyChanges(changes, 'dictated', 'dictated entry');
      // The cursor goes to the last cell written, and the grid scrolls to show it: the typist sees
      // where the values landed (and a bare value on the next line goes to that column).
      const last = entries[entries.length - 1];
      if (last) g.moveTo({ circuitId: last.circuitId, column: last.column });
      const first = result.refused[0];
      const stripped = result.stripped[0];
      setQuickEntryNote(first ? `Not saved — ${first.message}` : stripped ? `Saved — ${stripped.message}.` : undefined);
      if (first) g.say(`Not saved — ${first.message}`, 'error');
      else if (stripped) g.say(`Saved — ${stripped.message}.`);
    },
    [],
  );

  const undoQuickEntry = useCallback(() => {
    const g = ctxRef.current?.grid;
    if (!g) return;
    if (!g.canUndo) {
      setQuickEntryNote('Nothing to undo.');
      return;
    }
    g.undo();
    setQuickEntryNote('Undid the last entry.');
    quickEntryRef.current?.focus();
  }, []);

  const followPreview = useCallback((circuit: QuickEntryCircuit | undefined) => {
    const g = ctxRef.current?.grid;
    if (!circuit || !g) return;
    const column = g.active?.column;
    if (column) g.dispatch({ type: 'focus', position: { circuitId: circuit.id, column } });
  }, []);

  const keySections: KeysSection[] = useMemo(
    () => [
      {
        title: 'Grid',
        note: 'Entry goes down the column: type a value, Enter, the next circuit’s value, Enter… Enter passes the empty cells a circuit does not need.',
        rows: gridKeyRows.map((row) => ({ label: row.label, keys: row.keys, words: row.words })),
      },
      quickEntryWordsSection(),
    ],
    [],
  );

  const activeCircuit = grid.activeCircuit;
  const activeColumn = active ? columnByKey[active.column] : null;
  const activeFindings = active ? findingsIndex.byCircuit.get(active.circuitId)?.get(active.column) : undefined;
  const activeValue = active ? grid.read(active) : '';
  const activeReason = active && activeCircuit && isReadingKey(active.column) ? (activeCircuit.cells[active.column]?.reason ?? null) : null;
  const activePrevious = active && isReadingKey(active.column) ? previousByCircuit.get(active.circuitId) : undefined;
  const activePreviousCell = activePrevious && active && isReadingKey(active.column) ? activePrevious.cells[active.column] : undefined;
  const range = grid.range;

  return (
    <div className="flex h-full min-h-0 flex-col">
      <ConsoleHeader board={board} site={detail.site} job={detail.job} present={sync.present} status={sync.status} />
      {ringSocketsOf !== null && detail.circuits.find((c) => c.id === ringSocketsOf) && (
        <RingSocketsPanel
          key={ringSocketsOf}
          boardId={board.id}
          circuit={detail.circuits.find((c) => c.id === ringSocketsOf)!}
          locked={board.state === 'locked'}
          onRecord={(text) => {
            const g = ctxRef.current?.grid;
            if (!g) return;
            const position = { circuitId: ringSocketsOf, column: 'r1PlusR2' as const };
            const result = g.applyChanges([{ ...position, before: g.read(position), after: text }], 'typed', 'recorded R1+R2 from the socket readings');
            setRingSocketsOf(null);
            g.moveTo(position);
            g.say(result.refused[0] ? `Not saved — ${result.refused[0].message}` : `R1+R2 of circuit ${detail.circuits.find((c) => c.id === ringSocketsOf)?.number ?? ''} recorded as ${text} (the highest L-cpc reading).`, result.refused[0] ? 'error' : 'info');
            g.focusGrid();
          }}
          onClose={(message) => {
            setRingSocketsOf(null);
            if (message) ctxRef.current?.grid.say(message);
            ctxRef.current?.grid.focusGrid();
          }}
        />
      )}
      {history && (
        <HistoryPanel
          key={history.kind === 'cell' ? `${history.circuitId}:${history.column}` : 'board'}
          boardId={board.id}
          target={history}
          onClose={() => {
            setHistory(null);
            ctxRef.current?.grid.focusGrid();
          }}
        />
      )}
      {calculatorsOpen && (
        <CalculatorsPanel
          detail={detail}
          circuit={grid.activeCircuit}
          activeLabel={active ? `${columnByKey[active.column].label} of circuit ${grid.activeCircuit?.number ?? ''}` : null}
          onPut={(text) => {
            const g = ctxRef.current?.grid;
            const position = g?.active;
            if (!g || !position) return;
            const result = g.applyChanges([{ ...position, before: g.read(position), after: text }], 'typed', 'put a calculated value');
            g.say(result.refused[0] ? `Not saved — ${result.refused[0].message}` : `Put ${text} into ${columnByKey[position.column].label} of circuit ${g.activeCircuit?.number ?? ''} (calculated).`, result.refused[0] ? 'error' : 'info');
            setCalculatorsOpen(false);
            g.focusGrid();
          }}
          onClose={() => {
            setCalculatorsOpen(false);
            ctxRef.current?.grid.focusGrid();
          }}
        />
      )}
      {editingBoard && (
        <BoardDetailsForm
          board={board}
          onClose={(message) => {
            setEditingBoard(false);
            if (message) ctxRef.current?.grid.say(message);
            ctxRef.current?.grid.focusGrid();
          }}
        />
      )}
      {lockedReason && (
        <p role="note" className="shrink-0 border-b border-line bg-locked-soft px-3 py-1 text-sm text-locked">
          <span aria-hidden="true">▣ </span>
          {lockedReason}
        </p>
      )}
      <div className="shrink-0 border-b border-line bg-paper px-3 pt-1" onKeyDown={keepTextEditingKeys}>
        <QuickEntryLine
          ref={quickEntryRef}
          circuits={quickEntryCircuits}
          activeColumn={active?.column ?? 'zs'}
          onApply={applyQuickEntry}
          onUndoLast={undoQuickEntry}
          onLeave={grid.focusGrid}
          onPreview={followPreview}
          lastApplied={quickEntryNote}
        />
      </div>
      <div className="flex min-h-0 flex-1">
        <BoardGrid
          label={`Schedule of test results, board ${board.reference}`}
          circuits={detail.circuits}
          columns={grid.columns}
          activeIndex={grid.activeIndex}
          range={range}
          edit={grid.state.edit}
          findings={findingsIndex}
          conflicts={conflictsByCell}
          cellErrors={grid.cellErrors}
          pending={pending}
          onResolveConflict={resolveConflict}
          gridRef={grid.gridRef}
          editorRef={grid.editorRef}
          onKeyDown={grid.onKeyDown}
          onEditorBlur={grid.onEditorBlur}
          onCellPointerDown={grid.onCellPointerDown}
          onCellDoubleClick={grid.onCellDoubleClick}
        />
        {photosShown && (
          <Suspense fallback={<aside aria-label="Photos of the notes" className="w-[420px] shrink-0 border-l border-line p-2 text-sm text-muted">Loading the photos…</aside>}>
            <PhotoPanel boardId={board.id} lockedReason={lockedReason} panelRef={photoPanelRef} onLeave={grid.focusGrid} />
          </Suspense>
        )}
        {layout.findings !== 'hidden' && (
          <FindingsPanel
            findings={panelFindings}
            circuitOrder={grid.shape.rows}
            circuitNumbers={circuitNumbers}
            onJump={onJumpToFinding}
            listRef={findingsRef}
            narrow={layout.findings === 'narrow'}
          />
        )}
      </div>
      <ConflictList
        conflicts={sync.conflicts}
        circuitNumbers={circuitNumbers}
        onShow={(conflict) => jumpTo({ circuitId: conflict.circuitId, column: conflict.column as ColumnKey })}
        onResolve={resolveConflict}
      />
      <StatusLine
        circuit={activeCircuit}
        column={activeColumn}
        value={activeValue}
        reason={activeReason}
        findings={activeFindings}
        previous={activePrevious ? { text: activePreviousCell?.text ?? '', reason: activePreviousCell?.reason ?? null, job: activePrevious.job } : null}
        refused={active ? grid.cellErrors.get(cellKey(active.circuitId, active.column)) : undefined}
        edit={grid.state.edit}
        selectionSize={range ? { rows: range.bottom - range.top + 1, cols: range.right - range.left + 1 } : null}
        notice={grid.notice}
        status={sync.status}
      />
      <CommandPalette
        open={paletteOpen}
        onOpenChange={onPaletteOpenChange}
        registry={registry}
        ctx={ctx}
        commandId={paletteCommand}
        onError={onCommandError}
      />
      {importOpen && (
        <Suspense fallback={null}>
          <ImportDialog
            detail={detail}
            onClose={() => {
              setImportOpen(false);
              refocusAfterDialog();
            }}
            onImported={onImported}
          />
        </Suspense>
      )}
      <KeysOverlay open={keysOpen} onOpenChange={onKeysOpenChange} registry={registry} ctx={ctx} sections={keySections} />
    </div>
  );
}
