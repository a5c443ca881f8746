/**
 * The board console's commands: one list that the palette, the key bindings and the keys overlay
 * are all built from (see src/lib/commands). Each command owns its label, its key (if any), when it
 * can run (and, when not, why in words) and what it does. Every edit goes through the grid's
 * controller, so it is saved by the sync engine and can be undone like a typed one.
 */
import type { BoardDetail, Circuit, CircuitFields } from '../../../shared/schemas/boards.ts';
import { columnByKey, columnGroups, columns, isReadingKey, type ColumnGroupId, type ColumnKey } from '../../../shared/schemas/columns.ts';
import { foldShortcut, type ConsoleLayout, type FindingsPanelSize } from './layout/console-layout.ts';
import type { HistoryTarget } from './components/history-panel.tsx';
import type { Role } from '../../../shared/schemas/common.ts';
import type { Command } from '../../lib/commands/types.ts';
import { fieldText } from './grid/cell-value.ts';
import { jumpColumn } from './grid/enter-stops.ts';
import { positionAt, type GridPosition } from './grid/grid-state.ts';
import type { CellChange } from './grid/undo-stack.ts';
import type { GridController } from './components/use-grid-controller.ts';
import type { BoardSync, Conflict } from './sync/types.ts';

/** What a console command sees when it checks whether it can run, and when it runs. */
export interface ConsoleContext {
  detail: BoardDetail;
  sync: BoardSync;
  /** The signed-in person's role; null while it is not known. */
  role: Role | null;
  /** Why the board cannot be locked yet (shared/review/gate.ts); null or absent while not known. */
  lockReasons?: readonly string[] | null;
  grid: GridController;
  /** The conflict on the active cell, if any. */
  activeConflict: Conflict | null;
  ui: {
    openPalette(): void;
    openKeys(): void;
    openQuickEntry(): void;
    focusFindings(): void;
    /** Starts a download of a text file. */
    download(fileName: string, mimeType: string, text: string): void;
    /** The person's layout: folded groups and the findings panel's size. */
    layout: ConsoleLayout;
    toggleGroup(group: ColumnGroupId): void;
    toggleDetails(): void;
    /** Opens the board's own details for editing in the header. */
    editBoard(): void;
    /** Opens the calculators, filled from the active circuit. */
    openCalculators(): void;
    /** Shows the active cell's history, or the board's. */
    openHistory(target: HistoryTarget): void;
    /** Opens a ring's socket-by-socket readings. */
    openRingSockets(circuitId: number): void;
    setFindingsPanel(size: FindingsPanelSize): void;
    /** Opens the import of an instrument's readings file. */
    openImport(): void;
    /** Shows the photos of the paper notes beside the grid and gives them the focus. */
    showPhotos(): void;
    hidePhotos(): void;
    /** Whether the photos are shown. */
    photosShown: boolean;
  };
}

type ConsoleCommand = Command<ConsoleContext>;

const groups = {
  cells: 'Cells',
  circuits: 'Circuits',
  goTo: 'Go to',
  layout: 'Layout',
  board: 'Board',
  help: 'Help',
} as const;

// ---- availability ------------------------------------------------------------------------

function lockedReason(ctx: ConsoleContext): string | null {
  const board = ctx.detail.board;
  if (board.state !== 'locked') return null;
  return `Board ${board.reference} is locked${board.lockedBy ? ` by ${board.lockedBy.name}` : ''}: a reviewer must unlock it first`;
}

/** The board is open and a cell is active. */
function canEdit(ctx: ConsoleContext): true | string {
  return lockedReason(ctx) ?? (ctx.grid.active ? true : 'There is no circuit on this board yet');
}

function activeCircuit(ctx: ConsoleContext): Circuit | null {
  return ctx.grid.activeCircuit;
}

function selectedCircuits(ctx: ConsoleContext): Circuit[] {
  const range = ctx.grid.range;
  if (!range) return [];
  return ctx.detail.circuits.slice(range.top, range.bottom + 1);
}

function selectionWords(circuits: readonly Circuit[]): string {
  if (circuits.length === 1) return `circuit ${circuits[0]!.number}`;
  return `${circuits.length} circuits (${circuits[0]!.number}–${circuits[circuits.length - 1]!.number})`;
}

// ---- helpers -----------------------------------------------------------------------------

/**
 * What is still open on a board about to be locked, in words: the findings that stand (warnings and
 * notes pass the gate; errors must be resolved or accepted first) and edits not yet saved.
 */
export function openSummary(ctx: Pick<ConsoleContext, 'detail' | 'sync'>): string {
  const counts = { error: 0, warning: 0, note: 0, todo: 0 };
  for (const f of ctx.detail.findings) counts[f.severity] += 1;
  const parts: string[] = [];
  const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;
  if (counts.error > 0) parts.push(`${plural(counts.error, 'error')} (accepted with a reason)`);
  if (counts.warning > 0) parts.push(plural(counts.warning, 'warning'));
  if (counts.note > 0) parts.push(plural(counts.note, 'note'));
  if (counts.todo > 0) parts.push(`${plural(counts.todo, 'reading')} to do`);
  const waiting = ctx.sync.status.state === 'saving' || ctx.sync.status.state === 'offline' ? ' · edits still being saved' : '';
  return parts.length === 0 ? `nothing still open${waiting}` : `still standing: ${parts.join(', ')}${waiting}`;
}

function fieldChanges(circuits: readonly Circuit[], fields: Partial<Record<ColumnKey, string>>, read: (p: GridPosition) => string): CellChange[] {
  const changes: CellChange[] = [];
  for (const circuit of circuits) {
    for (const [column, after] of Object.entries(fields) as [ColumnKey, string][]) {
      const position = { circuitId: circuit.id, column };
      changes.push({ ...position, before: read(position), after });
    }
  }
  return changes;
}

function reportApply(ctx: ConsoleContext, result: ReturnType<GridController['applyChanges']>, done: string): void {
  const first = result.refused[0];
  if (first) ctx.grid.say(`Not saved — ${first.message}`, 'error');
  else ctx.grid.say(done);
}

function findCircuit(detail: BoardDetail, number: string): Circuit | undefined {
  const wanted = number.trim().toLowerCase();
  return detail.circuits.find((c) => c.number.toLowerCase() === wanted);
}

function numberFree(detail: BoardDetail, number: string): true | string {
  return findCircuit(detail, number) ? `There is already a circuit ${number.trim()} on this board.` : true;
}

function parseCsaPair(text: string): { live: number; cpc: number } | null {
  const match = /^\s*(\d+(?:\.\d+)?)\s*(?:\/|\s)\s*(\d+(?:\.\d+)?)\s*(?:mm²?)?\s*$/i.exec(text);
  return match ? { live: Number(match[1]), cpc: Number(match[2]) } : null;
}

/** The circuit's details worth copying into a duplicate (not its readings, number or spur link). */
function detailsOf(circuit: Circuit): Partial<CircuitFields> {
  return {
    phase: circuit.phase,
    description: circuit.description,
    kind: circuit.kind,
    wiringType: circuit.wiringType,
    referenceMethod: circuit.referenceMethod,
    points: circuit.points,
    liveCsaMm2: circuit.liveCsaMm2,
    cpcCsaMm2: circuit.cpcCsaMm2,
    maxDisconnectionS: circuit.maxDisconnectionS,
    deviceStandard: circuit.deviceStandard,
    deviceType: circuit.deviceType,
    ratingA: circuit.ratingA,
    breakingKa: circuit.breakingKa,
    rcdType: circuit.rcdType,
    rcdRatedResidualMa: circuit.rcdRatedResidualMa,
    afdd: circuit.afdd,
    remarks: circuit.remarks,
  };
}

/**
 * Starts a download of a file the server makes (it answers with `Content-Disposition: attachment`,
 * so the page stays where it is).
 */
function downloadFromServer(url: string): void {
  const link = document.createElement('a');
  link.href = url;
  link.download = '';
  link.click();
}

// ---- the commands ------------------------------------------------------------------------

/**
 * The console's commands. `current` gives the context at the moment a param's options are asked
 * for (the rings of the board as it is now), since options are computed without a context.
 */
export function createConsoleCommands(current: () => ConsoleContext | null): ConsoleCommand[] {
  const ringOptions = () => {
    const ctx = current();
    if (!ctx) return [];
    const here = activeCircuit(ctx);
    return ctx.detail.circuits
      .filter((c) => c.kind === 'ring' && c.id !== here?.id)
      .map((r) => ({ value: String(r.id), label: `${r.number} — ${r.description || 'ring final'}` }));
  };
  return [
    // Cells
    {
      id: 'console.fill-from-above',
      changesData: true,
      label: 'Same as above, then down',
      group: groups.cells,
      keywords: ['ditto', 'copy from above', 'repeat'],
      shortcut: "$mod+'",
      when: canEdit,
      run: (ctx) => ctx.grid.fillFromAbove(),
    },
    {
      id: 'console.fill-down',
      changesData: true,
      label: 'Fill the selection down',
      group: groups.cells,
      keywords: ['fill', 'copy down', 'repeat'],
      shortcut: '$mod+d',
      when: canEdit,
      run: (ctx) => ctx.grid.fillDown(),
    },
    {
      id: 'console.undo',
      changesData: true,
      label: 'Undo the last edit',
      group: groups.cells,
      keywords: ['back', 'revert'],
      shortcut: '$mod+z',
      when: (ctx) => lockedReason(ctx) ?? (ctx.grid.canUndo ? true : 'Nothing to undo yet'),
      run: (ctx) => ctx.grid.undo(),
    },
    {
      id: 'console.redo',
      changesData: true,
      label: 'Redo the edit undone',
      group: groups.cells,
      keywords: ['again'],
      shortcut: '$mod+Shift+z',
      when: (ctx) => lockedReason(ctx) ?? (ctx.grid.canRedo ? true : 'Nothing to redo'),
      run: (ctx) => ctx.grid.redo(),
    },
    {
      id: 'console.copy',
      label: 'Copy the selected cells (tab-separated)',
      group: groups.cells,
      keywords: ['clipboard', 'spreadsheet', 'tsv'],
      when: (ctx) => (ctx.grid.active ? true : 'There is no circuit on this board yet'),
      run: async (ctx) => {
        const text = ctx.grid.copyText();
        if (text === null) return;
        if (!navigator.clipboard) throw new Error('This browser gives no clipboard to the page: use Ctrl+C on the grid.');
        await navigator.clipboard.writeText(text);
        ctx.grid.say('Copied the selected cells.');
      },
    },
    {
      id: 'console.paste',
      changesData: true,
      label: 'Paste cells from the clipboard',
      group: groups.cells,
      keywords: ['clipboard', 'spreadsheet', 'tsv'],
      when: canEdit,
      run: async (ctx) => {
        if (!navigator.clipboard) throw new Error('This browser gives no clipboard to the page: use Ctrl+V on the grid.');
        ctx.grid.pasteText(await navigator.clipboard.readText());
      },
    },
    {
      id: 'console.clear',
      changesData: true,
      label: 'Clear the selected cells',
      group: groups.cells,
      keywords: ['delete', 'empty', 'erase'],
      when: canEdit,
      run: (ctx) => ctx.grid.clearSelection(),
    },
    {
      id: 'console.mark-limitation',
      changesData: true,
      label: 'Mark a limitation (LIM) with its reason',
      group: groups.cells,
      keywords: ['lim', 'limitation', 'not tested', 'reason'],
      params: [{ name: 'reason', label: 'Why the test could not be done', kind: 'text', required: true, placeholder: 'e.g. socket behind fixed cabinet' }],
      when: (ctx) => {
        const can = canEdit(ctx);
        if (can !== true) return can;
        return ctx.grid.active && isReadingKey(ctx.grid.active.column) ? true : 'A limitation is recorded on a reading: move to a reading column';
      },
      run: (ctx, args) => {
        const active = ctx.grid.active;
        const reason = args.reason?.trim() ?? '';
        if (!active || reason === '') return;
        const result = ctx.grid.applyChanges([{ ...active, before: ctx.grid.read(active), after: 'LIM', afterReason: reason }], 'typed', 'marked a limitation');
        reportApply(ctx, result, `Limitation recorded: ${reason}`);
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.clear-limitation',
      changesData: true,
      label: 'Clear the limitation',
      group: groups.cells,
      keywords: ['lim', 'limitation', 'remove'],
      when: (ctx) => {
        const can = canEdit(ctx);
        if (can !== true) return can;
        const active = ctx.grid.active;
        return active && isReadingKey(active.column) && ctx.grid.read(active).toUpperCase() === 'LIM' ? true : 'The active cell holds no limitation';
      },
      run: (ctx) => {
        const active = ctx.grid.active;
        if (!active) return;
        const result = ctx.grid.applyChanges([{ ...active, before: ctx.grid.read(active), after: '', afterReason: null }], 'typed', 'cleared a limitation');
        reportApply(ctx, result, 'Limitation cleared.');
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.tick-polarity',
      changesData: true,
      label: 'Tick polarity on the selected circuits',
      group: groups.cells,
      keywords: ['polarity', 'tick', '✓', 'confirmed'],
      when: canEdit,
      run: (ctx) => {
        const circuits = selectedCircuits(ctx);
        const result = ctx.grid.applyChanges(fieldChanges(circuits, { polarity: '✓' }, ctx.grid.read), 'filled', 'ticked polarity');
        reportApply(ctx, result, `Polarity ticked on ${selectionWords(circuits)}.`);
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.keep-theirs',
      changesData: true,
      label: 'Conflict: keep their value',
      group: groups.cells,
      keywords: ['conflict', 'theirs', 'discard mine'],
      shortcut: 'Alt+Shift+KeyT',
      when: (ctx) => (ctx.activeConflict ? true : 'The active cell has no conflict'),
      run: (ctx) => {
        if (ctx.activeConflict) ctx.sync.resolveConflict(ctx.activeConflict.editId, 'keep-theirs');
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.write-mine',
      changesData: true,
      label: 'Conflict: write my value over theirs',
      group: groups.cells,
      keywords: ['conflict', 'mine', 'overwrite'],
      shortcut: 'Alt+Shift+KeyM',
      when: (ctx) => lockedReason(ctx) ?? (ctx.activeConflict ? true : 'The active cell has no conflict'),
      run: (ctx) => {
        if (ctx.activeConflict) ctx.sync.resolveConflict(ctx.activeConflict.editId, 'overwrite');
        ctx.grid.focusGrid();
      },
    },

    // Circuits
    {
      id: 'console.set-device',
      changesData: true,
      label: 'Set the protective device of the selected circuits',
      group: groups.circuits,
      keywords: ['device', 'breaker', 'mcb', 'rcbo', 'fuse', 'rating', 'ka', 'standard'],
      params: [
        { name: 'standard', label: 'Standard (BS EN)', kind: 'text', required: true, placeholder: '60898, 61009, 88-2, 3036, 1362' },
        { name: 'type', label: 'Type', kind: 'text', required: true, placeholder: 'B, C, D or gG' },
        { name: 'rating', label: 'Rating In (A)', kind: 'number', required: true, placeholder: '32' },
        { name: 'breaking', label: 'Breaking capacity (kA)', kind: 'number', placeholder: '6' },
      ],
      when: canEdit,
      run: (ctx, args) => {
        const circuits = selectedCircuits(ctx);
        const fields: Partial<Record<ColumnKey, string>> = { deviceStandard: args.standard ?? '', deviceType: args.type ?? '', ratingA: args.rating ?? '' };
        if (args.breaking !== undefined) fields.breakingKa = args.breaking;
        const result = ctx.grid.applyChanges(fieldChanges(circuits, fields, ctx.grid.read), 'typed', 'set the device');
        reportApply(ctx, result, `Device ${args.standard ?? ''} ${args.type ?? ''}${args.rating ?? ''} set on ${selectionWords(circuits)}.`);
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.set-cable',
      changesData: true,
      label: 'Set the cable of the selected circuits',
      group: groups.circuits,
      keywords: ['cable', 'csa', 'conductor', 'live', 'cpc', 'mm²'],
      params: [
        { name: 'live', label: 'Live conductor csa (mm²)', kind: 'number', required: true, placeholder: '2.5' },
        { name: 'cpc', label: 'cpc csa (mm²)', kind: 'number', required: true, placeholder: '1.5' },
      ],
      when: canEdit,
      run: (ctx, args) => {
        const circuits = selectedCircuits(ctx);
        const result = ctx.grid.applyChanges(fieldChanges(circuits, { liveCsaMm2: args.live ?? '', cpcCsaMm2: args.cpc ?? '' }, ctx.grid.read), 'typed', 'set the cable');
        reportApply(ctx, result, `Cable ${args.live ?? ''}/${args.cpc ?? ''} mm² set on ${selectionWords(circuits)}.`);
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.link-spur',
      changesData: true,
      label: 'Link a spur to its ring and origin point',
      group: groups.circuits,
      keywords: ['spur', 'ring', 'origin', 'socket', 'branch'],
      params: [
        {
          name: 'ring',
          label: 'Ring final circuit it hangs from',
          kind: 'choice',
          required: true,
          options: ringOptions,
        },
        { name: 'origin', label: 'Origin point on the ring', kind: 'text', required: true, placeholder: 'e.g. socket 4, kitchen' },
        { name: 'length', label: 'Spur cable length (m)', kind: 'number', placeholder: 'e.g. 7' },
        { name: 'csa', label: 'Spur cable csa, live/cpc (mm²)', kind: 'text', placeholder: 'e.g. 2.5/1.5' },
        {
          name: 'protection',
          label: 'Fused (through a fused connection unit) or unfused',
          kind: 'choice',
          options: () => [
            { value: 'unfused', label: 'Unfused — one single or twin socket, or one fixed appliance' },
            { value: 'fused', label: 'Fused — through a fused connection unit' },
          ],
        },
      ],
      when: (ctx) => {
        const can = canEdit(ctx);
        if (can !== true) return can;
        const circuit = activeCircuit(ctx);
        const rings = ctx.detail.circuits.filter((c) => c.kind === 'ring' && c.id !== circuit?.id);
        if (rings.length === 0) return 'This board has no ring final circuit for a spur to hang from';
        if (circuit?.kind === 'ring') return `Circuit ${circuit.number} is a ring itself: move to the spur's row first`;
        return true;
      },
      run: (ctx, args) => {
        const circuit = activeCircuit(ctx);
        const ringId = Number(args.ring);
        const ring = ctx.detail.circuits.find((c) => c.id === ringId);
        if (!circuit || !ring) throw new Error('Choose a ring final circuit of this board.');
        const origin = (args.origin ?? '').trim();
        const fields: Partial<Record<ColumnKey, string>> = { kind: 'spur' };
        let csa: { live: number; cpc: number } | null = null;
        if (args.csa !== undefined) {
          csa = parseCsaPair(args.csa);
          if (!csa) throw new Error(`Write the spur's csa as live/cpc, e.g. 2.5/1.5 — not "${args.csa}".`);
          fields.liveCsaMm2 = String(csa.live);
          fields.cpcCsaMm2 = String(csa.cpc);
        }
        let length: number | null = null;
        if (args.length !== undefined) {
          length = Number(args.length);
          if (!Number.isFinite(length) || length <= 0 || length > 1000) throw new Error('The spur length is in metres, more than 0 and at most 1000.');
        }
        const result = ctx.grid.applyChanges(fieldChanges([circuit], fields, ctx.grid.read), 'typed', 'linked a spur');
        if (result.refused.length > 0) {
          reportApply(ctx, result, '');
          return;
        }
        // The link itself is not a grid column: written straight through the sync engine.
        ctx.sync.writeField(circuit.id, 'spurRingId', ring.id);
        ctx.sync.writeField(circuit.id, 'spurOriginPoint', origin);
        ctx.sync.writeField(circuit.id, 'spurLengthM', length);
        const protection = args.protection === 'fused' || args.protection === 'unfused' ? args.protection : null;
        ctx.sync.writeField(circuit.id, 'spurProtection', protection);
        ctx.grid.say(
          `Circuit ${circuit.number} is ${protection === 'unfused' ? 'an unfused ' : protection === 'fused' ? 'a fused ' : 'a '}spur of ring ${ring.number} from ${origin}${length !== null ? `, ${fieldText(length)} m` : ''}${csa ? `, ${csa.live}/${csa.cpc} mm²` : ''}.`,
        );
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.insert-circuit',
      changesData: true,
      label: 'Insert a circuit below',
      group: groups.circuits,
      keywords: ['add', 'new circuit', 'row'],
      params: [{ name: 'number', label: 'Number of the new circuit', kind: 'text', required: true, placeholder: 'e.g. 14 or 5L1' }],
      when: (ctx) => lockedReason(ctx) ?? true,
      run: async (ctx, args) => {
        const number = (args.number ?? '').trim();
        const free = numberFree(ctx.detail, number);
        if (free !== true) throw new Error(free);
        // A new way in a board is most often protected like its neighbour: it starts with the device
        // (and RCD) of the circuit above, which the typist changes if it differs.
        const above = activeCircuit(ctx);
        const device: Partial<CircuitFields> = above
          ? {
              deviceStandard: above.deviceStandard,
              deviceType: above.deviceType,
              ratingA: above.ratingA,
              breakingKa: above.breakingKa,
              rcdType: above.rcdType,
              rcdRatedResidualMa: above.rcdRatedResidualMa,
            }
          : {};
        const circuit = await ctx.sync.insertCircuit(above?.id ?? null, { ...device, number });
        ctx.grid.moveTo({ circuitId: circuit.id, column: 'description' });
        ctx.grid.say(
          `Circuit ${circuit.number} inserted${above && above.deviceStandard ? ` with the device of circuit ${above.number} (${[above.deviceStandard, above.deviceType, above.ratingA === null ? '' : `${above.ratingA} A`].filter(Boolean).join(' ')})` : ''}.`,
        );
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.duplicate-circuit',
      changesData: true,
      label: 'Duplicate the circuit (details, not readings)',
      group: groups.circuits,
      keywords: ['copy', 'clone', 'same as'],
      params: [{ name: 'number', label: 'Number of the copy', kind: 'text', required: true, placeholder: 'e.g. 14' }],
      when: (ctx) => lockedReason(ctx) ?? (activeCircuit(ctx) ? true : 'There is no circuit to duplicate'),
      run: async (ctx, args) => {
        const source = activeCircuit(ctx);
        if (!source) return;
        const number = (args.number ?? '').trim();
        const free = numberFree(ctx.detail, number);
        if (free !== true) throw new Error(free);
        const circuit = await ctx.sync.insertCircuit(source.id, { ...detailsOf(source), number });
        ctx.grid.moveTo({ circuitId: circuit.id, column: ctx.grid.active?.column ?? 'description' });
        ctx.grid.say(`Circuit ${source.number} duplicated as ${circuit.number}.`);
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.remove-circuit',
      changesData: true,
      label: 'Remove the circuit',
      group: groups.circuits,
      keywords: ['delete', 'remove', 'row'],
      params: [{ name: 'confirm', label: 'Type the circuit number (or yes) to remove it and its readings', kind: 'text', required: true }],
      when: (ctx) => lockedReason(ctx) ?? (activeCircuit(ctx) ? true : 'There is no circuit to remove'),
      run: async (ctx, args) => {
        const circuit = activeCircuit(ctx);
        if (!circuit) return;
        const answer = (args.confirm ?? '').trim().toLowerCase();
        if (answer !== 'yes' && answer !== circuit.number.toLowerCase()) {
          ctx.grid.say(`Circuit ${circuit.number} kept: the confirmation did not match.`, 'error');
          return;
        }
        await ctx.sync.removeCircuit(circuit.id);
        ctx.grid.say(`Circuit ${circuit.number} removed.`);
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.renumber-circuit',
      changesData: true,
      label: 'Renumber the circuit',
      group: groups.circuits,
      keywords: ['number', 'rename'],
      params: [{ name: 'number', label: 'New number', kind: 'text', required: true }],
      when: (ctx) => lockedReason(ctx) ?? (activeCircuit(ctx) ? true : 'There is no circuit to renumber'),
      run: (ctx, args) => {
        const circuit = activeCircuit(ctx);
        const number = (args.number ?? '').trim();
        if (!circuit || number === '') return;
        if (number.toLowerCase() !== circuit.number.toLowerCase()) {
          const free = numberFree(ctx.detail, number);
          if (free !== true) throw new Error(free);
        }
        ctx.sync.writeField(circuit.id, 'number', number);
        ctx.grid.say(`Circuit ${circuit.number} is now ${number}.`);
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.add-three-phase-group',
      changesData: true,
      label: 'Add a three-phase group (nL1, nL2, nL3)',
      group: groups.circuits,
      keywords: ['three phase', 'l1 l2 l3', 'way', 'tp'],
      params: [{ name: 'way', label: 'Way number n (adds nL1, nL2, nL3)', kind: 'text', required: true, placeholder: 'e.g. 25' }],
      when: (ctx) => lockedReason(ctx) ?? (ctx.detail.board.phases === 3 ? true : 'Only a three-phase board has L1, L2 and L3 groups'),
      run: async (ctx, args) => {
        const way = (args.way ?? '').trim();
        if (!/^[0-9A-Za-z]{1,8}$/.test(way)) throw new Error(`A way number is a few letters or digits, e.g. 25 — not "${way}".`);
        const numbers = (['L1', 'L2', 'L3'] as const).map((phase) => ({ phase, number: `${way}${phase}` }));
        for (const { number } of numbers) {
          const free = numberFree(ctx.detail, number);
          if (free !== true) throw new Error(free);
        }
        let after = activeCircuit(ctx)?.id ?? null;
        let first: Circuit | null = null;
        for (const { phase, number } of numbers) {
          const circuit = await ctx.sync.insertCircuit(after, { number, phase });
          first ??= circuit;
          after = circuit.id;
        }
        if (first) ctx.grid.moveTo({ circuitId: first.id, column: 'description' });
        ctx.grid.say(`Circuits ${numbers.map((n) => n.number).join(', ')} added.`);
        ctx.grid.focusGrid();
      },
    },

    // Go to
    {
      id: 'console.jump-circuit',
      label: 'Jump to a circuit',
      group: groups.goTo,
      keywords: ['go', 'find', 'circuit', 'row'],
      shortcut: '$mod+g',
      params: [{ name: 'circuit', label: 'Circuit number', kind: 'text', required: true, placeholder: 'e.g. 7 or 3L2' }],
      when: (ctx) => (ctx.detail.circuits.length > 0 ? true : 'There is no circuit on this board yet'),
      run: (ctx, args) => {
        const circuit = findCircuit(ctx.detail, args.circuit ?? '');
        if (!circuit) {
          ctx.grid.say(`There is no circuit ${(args.circuit ?? '').trim()} on this board.`, 'error');
          ctx.grid.focusGrid();
          return;
        }
        const from = ctx.grid.active?.column;
        const landing = jumpColumn(circuit, from, ctx.grid.shape.columns);
        ctx.grid.moveTo({ circuitId: circuit.id, column: landing.column });
        if (!landing.kept && from) {
          ctx.grid.say(`Circuit ${circuit.number}: ${columnByKey[from].label} is not a reading it needs, so the cursor is on ${columnByKey[landing.column].label}.`);
        }
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.jump-column',
      label: 'Jump to a column',
      group: groups.goTo,
      keywords: ['go', 'column', 'reading'],
      shortcut: '$mod+Shift+g',
      params: [
        {
          name: 'column',
          label: 'Column',
          kind: 'choice',
          required: true,
          options: () =>
            columns.map((c) => ({
              value: c.key,
              label: `${c.label}${c.unit ? ` (${c.unit})` : ''} — ${columnGroups.find((g) => g.id === c.group)?.label ?? ''}: ${c.meaning}`,
            })),
        },
      ],
      when: (ctx) => (ctx.detail.circuits.length > 0 ? true : 'There is no circuit on this board yet'),
      run: (ctx, args) => {
        const column = columns.find((c) => c.key === args.column);
        if (!column) return;
        const circuitId = ctx.grid.active?.circuitId ?? positionAt(ctx.grid.shape, { row: 0, col: 0 }).circuitId;
        ctx.grid.moveTo({ circuitId, column: column.key });
        ctx.grid.focusGrid();
      },
    },
    // Layout (remembered per person)
    ...columnGroups.map(
      (group): ConsoleCommand => ({
        id: `console.fold-${group.id}`,
        label: `Fold or unfold ${group.label.toLowerCase()}`,
        group: groups.layout,
        keywords: ['fold', 'unfold', 'collapse', 'expand', 'hide columns', 'laptop', group.label.toLowerCase()],
        shortcut: foldShortcut(group.id),
        run: (ctx) => {
          ctx.ui.toggleGroup(group.id);
          ctx.grid.focusGrid();
        },
      }),
    ),
    {
      id: 'console.edit-board',
      label: 'Edit the board’s details (Zdb, Ipf, location, instruments…)',
      group: groups.board,
      keywords: ['board', 'zdb', 'ipf', 'instruments', 'location', 'supplied from', 'polarity confirmed', 'header'],
      shortcut: 'Alt+Shift+KeyB',
      when: (ctx) => lockedReason(ctx) ?? true,
      run: (ctx) => ctx.ui.editBoard(),
    },
    {
      id: 'console.ring-sockets',
      label: 'Socket-by-socket readings of the ring (plot and diagnosis)',
      group: groups.circuits,
      keywords: ['ring', 'socket', 'cross-connected', 'profile', 'step 3', 'figure of eight', 'l-cpc', 'l-n'],
      shortcut: 'Alt+Shift+KeyR',
      when: (ctx) => {
        const circuit = activeCircuit(ctx);
        if (!circuit) return 'There is no circuit on this board yet';
        return circuit.kind === 'ring' ? true : `Circuit ${circuit.number} is not a ring final circuit`;
      },
      run: (ctx) => {
        const circuit = activeCircuit(ctx);
        if (circuit) ctx.ui.openRingSockets(circuit.id);
      },
    },
    {
      id: 'console.cell-history',
      label: 'History of the active cell (who, when, how)',
      group: groups.board,
      keywords: ['history', 'who', 'changed', 'audit', 'cell'],
      shortcut: 'Alt+Shift+KeyH',
      when: (ctx) => (ctx.grid.active ? true : 'There is no cell to show'),
      run: (ctx) => {
        const active = ctx.grid.active;
        const circuit = activeCircuit(ctx);
        if (!active || !circuit) return;
        ctx.ui.openHistory({ kind: 'cell', circuitId: circuit.id, circuitNumber: circuit.number, column: active.column });
      },
    },
    {
      id: 'console.board-history',
      label: 'Board history, by person and column',
      group: groups.board,
      keywords: ['history', 'who', 'changed', 'audit', 'board', 'unlock reasons'],
      shortcut: 'Alt+Shift+KeyY',
      run: (ctx) => ctx.ui.openHistory({ kind: 'board' }),
    },
    {
      id: 'console.calculators',
      label: 'Calculators: expected R1+R2, longest run, maximum Zs, Zs when hot',
      group: groups.board,
      keywords: ['calculate', 'calculator', 'expected', 'max zs', 'length', 'temperature', 'r1+r2'],
      shortcut: 'Alt+Shift+KeyC',
      run: (ctx) => ctx.ui.openCalculators(),
    },
    {
      id: 'console.fold-details',
      label: 'Fold or unfold every circuit detail (readings only, for a laptop screen)',
      group: groups.layout,
      keywords: ['fold', 'details', 'laptop', 'narrow', 'readings only', 'collapse'],
      shortcut: 'Alt+Shift+Digit0',
      run: (ctx) => {
        ctx.ui.toggleDetails();
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.findings-panel',
      label: 'Findings panel: wide, narrow or hidden',
      group: groups.layout,
      keywords: ['findings', 'panel', 'hide', 'narrow', 'width', 'laptop'],
      shortcut: 'Alt+Shift+KeyF',
      run: (ctx) => {
        const order: FindingsPanelSize[] = ['wide', 'narrow', 'hidden'];
        const next = order[(order.indexOf(ctx.ui.layout.findings) + 1) % order.length]!;
        ctx.ui.setFindingsPanel(next);
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.focus-findings',
      label: 'Go to the findings list',
      group: groups.goTo,
      keywords: ['findings', 'errors', 'warnings', 'list'],
      shortcut: '$mod+Shift+f',
      run: (ctx) => ctx.ui.focusFindings(),
    },
    {
      id: 'console.quick-entry',
      label: 'Open the quick-entry line (dictation)',
      group: groups.goTo,
      keywords: ['dictate', 'quick', 'type line', 'call out'],
      shortcut: '$mod+j',
      when: (ctx) => lockedReason(ctx) ?? true,
      run: (ctx) => ctx.ui.openQuickEntry(),
    },

    // Board
    {
      id: 'console.lock',
      changesData: true,
      label: 'Lock the board',
      group: groups.board,
      keywords: ['lock', 'review', 'finish', 'freeze'],
      params: [
        {
          name: 'confirm',
          label: 'Lock the board? What still stands is listed; nothing on the board changes until a reviewer unlocks it',
          kind: 'choice',
          required: true,
          options: () => {
            const ctx = current();
            return [{ value: 'yes', label: `Yes, lock it — ${ctx ? openSummary(ctx) : 'nothing recorded still open'}` }, { value: 'no', label: 'No, keep it open' }];
          },
        },
      ],
      when: (ctx) => {
        if (ctx.role !== 'reviewer' && ctx.role !== 'admin') return 'Only a reviewer or an admin can lock a board';
        if (ctx.detail.board.state === 'locked') return 'The board is already locked';
        // The completeness gate, shown before anyone tries; the server checks it again at locking.
        const reasons = ctx.lockReasons ?? [];
        return reasons.length === 0 ? true : `Not yet — ${reasons.length} ${reasons.length === 1 ? 'reason' : 'reasons'}: ${reasons.join(' · ')}`;
      },
      run: async (ctx, args) => {
        if (args.confirm !== 'yes') {
          ctx.grid.say(`Board ${ctx.detail.board.reference} left open.`);
          ctx.grid.focusGrid();
          return;
        }
        if (ctx.grid.stateRef.current.edit) ctx.grid.commitEdit(null);
        await ctx.sync.lockBoard();
        ctx.grid.say(`Board ${ctx.detail.board.reference} locked.`);
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.unlock',
      changesData: true,
      label: 'Unlock the board',
      group: groups.board,
      keywords: ['unlock', 'reopen', 'edit again'],
      params: [{ name: 'reason', label: 'Why the board is being unlocked', kind: 'text', required: true, placeholder: 'at least 5 characters' }],
      when: (ctx) => {
        if (ctx.role !== 'reviewer' && ctx.role !== 'admin') return 'Only a reviewer or an admin can unlock a board';
        return ctx.detail.board.state === 'locked' ? true : 'The board is not locked';
      },
      run: async (ctx, args) => {
        const reason = (args.reason ?? '').trim();
        if (reason.length < 5) throw new Error('Say why the board is being unlocked (at least 5 characters).');
        await ctx.sync.unlockBoard(reason);
        ctx.grid.say(`Board ${ctx.detail.board.reference} unlocked.`);
        ctx.grid.focusGrid();
      },
    },
    {
      id: 'console.export-csv',
      label: 'Export CSV: the board’s schedule for a spreadsheet',
      group: groups.board,
      keywords: ['download', 'spreadsheet', 'csv', 'export', 'excel'],
      run: (ctx) => {
        downloadFromServer(`/api/boards/${ctx.detail.board.id}/export.csv`);
        ctx.grid.say(`Exporting board ${ctx.detail.board.reference} as CSV: the readings saved on the server, with the board’s details above them.`);
      },
    },
    {
      id: 'console.download-job-json',
      label: 'Download JSON: the whole job for your own records',
      group: groups.board,
      keywords: ['download', 'json', 'export', 'backup', 'job', 'record'],
      run: (ctx) => {
        downloadFromServer(`/api/jobs/${ctx.detail.job.id}/export.json`);
        ctx.grid.say(`Downloading job ${ctx.detail.job.reference} as JSON: its record and every board as saved on the server.`);
      },
    },

    // Help
    {
      id: 'console.import-file',
      label: 'Import readings from a file',
      group: groups.board,
      keywords: ['instrument', 'csv', 'download', 'tester file', 'mapping'],
      shortcut: 'Alt+Shift+KeyI',
      when: (ctx) => lockedReason(ctx) ?? true,
      run: (ctx) => ctx.ui.openImport(),
    },
    {
      id: 'console.show-photos',
      label: 'Show photos of the notes',
      group: groups.board,
      keywords: ['paper', 'picture', 'image', 'sheet', 'attach photo'],
      shortcut: 'Alt+Shift+KeyP',
      when: () => true,
      run: (ctx) => ctx.ui.showPhotos(),
    },
    {
      id: 'console.hide-photos',
      label: 'Hide the photos of the notes',
      group: groups.board,
      keywords: ['close photo', 'paper'],
      when: (ctx) => (ctx.ui.photosShown ? true : 'The photos are not shown'),
      run: (ctx) => ctx.ui.hidePhotos(),
    },
    {
      id: 'console.palette',
      label: 'Open the command palette',
      group: groups.help,
      keywords: ['commands', 'menu'],
      shortcut: '$mod+k',
      run: (ctx) => ctx.ui.openPalette(),
    },
    {
      id: 'console.show-keys',
      label: 'Show the keys',
      group: groups.help,
      keywords: ['help', 'shortcuts', 'keyboard', '?'],
      shortcut: 'Shift+?',
      run: (ctx) => ctx.ui.openKeys(),
    },
  ];
}

/**
 * Keys the grid handles itself. The registry refuses a command bound to one of them, and the keys
 * overlay lists them.
 */
export const gridKeyRows: ReadonlyArray<{ label: string; keys: readonly string[]; words?: readonly string[] }> = [
  { label: 'Type over the cell (short forms are written out: .44 → 0.44, v → ✓, x → ✗, na → N/A)', keys: [], words: ['any character'] },
  { label: 'In a ✓/✗ column: tick or cross, saved at once, and on down the column as Enter goes', keys: [], words: ['v', 'x'] },
  {
    label:
      'Save and go down the column to the next circuit the reading applies to: empty cells of a reading the circuit does not need (r1, rn, r2 on a radial, RCD time and button without an RCD, AFDD button without an AFDD, R2 by long lead) are passed; a cell holding a value never is. After the last, on to the next column that applies',
    keys: ['Enter'],
  },
  { label: 'Save and go up the column, passing the same cells', keys: ['Shift+Enter'] },
  { label: 'Save and go right / left (wraps to the next / previous circuit)', keys: ['Tab', 'Shift+Tab'] },
  { label: 'Move (while typing over a cell: save and move); arrows, Tab and clicks reach every cell, so N/A can be typed anywhere', keys: ['ArrowUp', 'ArrowDown', 'ArrowLeft', 'ArrowRight'] },
  { label: 'Edit the text in place (← → then move the caret)', keys: ['F2'] },
  { label: 'Cancel the edit (or drop the selection)', keys: ['Escape'] },
  { label: 'Clear the selected cells', keys: ['Delete', 'Backspace'] },
  { label: 'Select a range', keys: ['Shift+ArrowUp', 'Shift+ArrowDown', 'Shift+ArrowLeft', 'Shift+ArrowRight'] },
  { label: 'First / last circuit of the column', keys: ['$mod+ArrowUp', '$mod+ArrowDown'] },
  { label: 'First / last column of the circuit', keys: ['Home', 'End'] },
  { label: 'First / last cell of the board', keys: ['$mod+Home', '$mod+End'] },
  { label: 'Twenty circuits up / down', keys: ['PageUp', 'PageDown'] },
  { label: 'Copy / paste ranges as tab-separated text (spreadsheets)', keys: ['$mod+c', '$mod+v'] },
];

/** Every key of `gridKeyRows`, with the Shift and $mod variants the grid also takes, for the registry. */
export const gridReservedKeys: ReadonlyArray<{ shortcut: string; owner: string }> = [
  ...gridKeyRows.flatMap((row) => row.keys.map((shortcut) => ({ shortcut, owner: `the grid (${row.label.toLowerCase()})` }))),
  ...['$mod+Shift+ArrowUp', '$mod+Shift+ArrowDown', '$mod+Shift+ArrowLeft', '$mod+Shift+ArrowRight', 'Shift+Home', 'Shift+End', '$mod+ArrowLeft', '$mod+ArrowRight'].map(
    (shortcut) => ({ shortcut, owner: 'the grid (extend the selection / move far)' }),
  ),
];
