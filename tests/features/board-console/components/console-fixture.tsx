import { act, render } from '@testing-library/react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import userEvent from '@testing-library/user-event';
import { useMemo, useState } from 'react';
import type { BoardDetail, Circuit, CircuitFields } from '../../../../shared/schemas/boards.ts';
import type { Role } from '../../../../shared/schemas/common.ts';
import type { ReadingKey } from '../../../../shared/schemas/columns.ts';
import type { Finding } from '../../../../shared/schemas/findings.ts';
import { BoardConsole } from '../../../../src/features/board-console/components/board-console.tsx';
import type { BoardSync, Conflict } from '../../../../src/features/board-console/sync/types.ts';

/** Every write the console asked the (fake) sync engine for, in order. */
export type SyncCall =
  | { kind: 'cell'; circuitId: number; column: ReadingKey; text: string; reason: string | null | undefined; how: string | undefined }
  | { kind: 'field'; circuitId: number; field: keyof CircuitFields; value: unknown; how: string | undefined };

const blankFields: Omit<CircuitFields, 'number'> = {
  phase: null,
  description: '',
  kind: 'radial',
  wiringType: 'A',
  referenceMethod: 'C',
  points: 1,
  liveCsaMm2: 2.5,
  cpcCsaMm2: 1.5,
  maxDisconnectionS: 0.4,
  deviceStandard: '60898',
  deviceType: 'B',
  ratingA: 16,
  breakingKa: 6,
  rcdType: null,
  rcdRatedResidualMa: null,
  afdd: null,
  remarks: '',
  spurRingId: null,
  spurOriginPoint: null,
  spurLengthM: null,
  maxZsByHandOhm: null,
};

/** A circuit with the given number and readings (text per reading key). */
export function circuit(id: number, number: string, readings: Partial<Record<ReadingKey, string>> = {}, fields: Partial<CircuitFields> = {}): Circuit {
  const cells: Circuit['cells'] = {};
  for (const [key, text] of Object.entries(readings) as [ReadingKey, string][]) {
    cells[key] = { text, reason: null, version: 1, updatedBy: null, updatedAt: null };
  }
  return { ...blankFields, number, ...fields, id, boardId: 1, position: id, version: 1, cells };
}

export function boardDetail(circuits: Circuit[], board: Partial<BoardDetail['board']> = {}): BoardDetail {
  return {
    board: {
      id: 1,
      jobId: 1,
      reference: 'DB-T',
      location: 'Hall',
      suppliedFrom: 'Origin',
      phases: 1,
      zdbOhm: 0.2,
      ipfKa: 1.5,
      polarityConfirmed: true,
      phaseSequenceConfirmed: false,
      instruments: 'MFT 1',
      state: 'open',
      lockedBy: null,
      lockedAt: null,
      version: 1,
      ...board,
    },
    site: { id: 1, client: 'Client', address: '1 Road', description: '', contactName: '', contactEmail: '', earthing: 'TN-C-S', nominalVoltageV: 230, zeOhm: 0.2, pfcKa: 1.5, version: 1 },
    job: { id: 1, siteId: 1, kind: 'EIC', reference: 'J-1', visitDate: '2026-12-01', visitEndDate: null, limitations: '', state: 'entering', startedFromJobId: null, createdAt: '2026-11-01T09:00:00.000Z', version: 1 },
    circuits,
    findings: [],
    cursor: 0,
  };
}

export interface ConsoleHarnessOptions {
  findings?: Finding[];
  conflicts?: Conflict[];
  role?: Role | null;
  /** The completeness gate's reasons the console shows before locking. */
  lockReasons?: readonly string[] | null;
  /** The signed-in person (their console layout is remembered under it). */
  personId?: number | null;
}

/**
 * Renders the console over an in-memory fake of the sync engine: writes change the board at once
 * (as the real engine's optimistic view does) and are recorded in `calls`.
 */
export function renderConsole(initial: BoardDetail, options: ConsoleHarnessOptions = {}) {
  const calls: SyncCall[] = [];
  const resolved: Array<{ editId: string; choice: string }> = [];
  /** Circuits the console asked to insert: after which circuit, with which fields. */
  const inserted: Array<{ afterId: number | null; fields: Partial<CircuitFields> }> = [];
  const remote: { update: (change: (detail: BoardDetail) => BoardDetail) => void } = { update: () => {} };

  function Harness() {
    const [detail, setDetail] = useState(initial);
    remote.update = (change) => setDetail(change);
    const updateCircuit = (circuitId: number, change: (c: Circuit) => Circuit) =>
      setDetail((d) => ({ ...d, circuits: d.circuits.map((c) => (c.id === circuitId ? change(c) : c)) }));
    const sync: BoardSync = useMemo(
      () => ({
        detail,
        isLoading: false,
        error: null,
        status: { state: 'saved' },
        present: [],
        conflicts: options.conflicts ?? [],
        writeCell(circuitId, column, text, opts) {
          calls.push({ kind: 'cell', circuitId, column, text, reason: opts?.reason, how: opts?.how });
          updateCircuit(circuitId, (c) => ({
            ...c,
            cells: { ...c.cells, [column]: { text, reason: opts?.reason ?? null, version: (c.cells[column]?.version ?? 0) + 1, updatedBy: null, updatedAt: null } },
          }));
        },
        writeField(circuitId, field, value, opts) {
          calls.push({ kind: 'field', circuitId, field, value, how: opts?.how });
          updateCircuit(circuitId, (c) => ({ ...c, [field]: value }));
        },
        resolveConflict(editId, choice) {
          resolved.push({ editId, choice });
        },
        insertCircuit: async (afterId, fields = {}) => {
          const made = circuit(900 + inserted.length, fields.number ?? '?', {}, fields);
          inserted.push({ afterId, fields });
          setDetail((d) => {
            const at = afterId === null ? 0 : d.circuits.findIndex((c) => c.id === afterId) + 1;
            return { ...d, circuits: [...d.circuits.slice(0, at), made, ...d.circuits.slice(at)] };
          });
          return made;
        },
        removeCircuit: async () => {},
        lockBoard: async () => {},
        unlockBoard: async () => {},
      }),
      [detail],
    );
    return <BoardConsole sync={sync} detail={detail} findings={options.findings ?? []} role={options.role ?? 'tester'} lockReasons={options.lockReasons ?? null} personId={options.personId ?? null} />;
  }

  const user = userEvent.setup();
  // A fresh query client per test, retries off (panels beside the grid read the API).
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const result = render(
    <QueryClientProvider client={queryClient}>
      <Harness />
    </QueryClientProvider>,
  );
  const grid = result.getByRole('grid');
  /** Applies a change as if it came from another typist through the changes feed. */
  const remoteUpdate = (change: (detail: BoardDetail) => BoardDetail) => act(() => remote.update(change));
  return { ...result, user, calls, resolved, inserted, grid, remoteUpdate };
}

/** The gridcell of a circuit (by its number) and column (by its header label). */
export function cellOf(grid: HTMLElement, circuitNumber: string, columnLabel: string): HTMLElement {
  const headers = Array.from(grid.querySelectorAll('[role="row"][aria-rowindex="2"] [role="columnheader"]'));
  const header = headers.find((h) => h.querySelector('span')?.textContent === columnLabel);
  if (!header) throw new Error(`No column ${columnLabel}`);
  const colIndex = header.getAttribute('aria-colindex');
  const rows = Array.from(grid.querySelectorAll('[role="row"]'));
  const row = rows.find((r) => r.querySelector('[role="rowheader"]')?.textContent?.startsWith(circuitNumber) && r.querySelector('[role="rowheader"] span')?.textContent === circuitNumber);
  if (!row) throw new Error(`No circuit ${circuitNumber}`);
  const cell = row.querySelector<HTMLElement>(`[role="gridcell"][aria-colindex="${colIndex}"]`);
  if (!cell) throw new Error(`No cell ${circuitNumber} ${columnLabel}`);
  return cell;
}

/** The active cell, as the grid names it with aria-activedescendant. */
export function activeCell(grid: HTMLElement): HTMLElement | null {
  const id = grid.getAttribute('aria-activedescendant');
  return id ? document.getElementById(id) : (grid.querySelector<HTMLElement>('input')?.closest('[role="gridcell"]') ?? null);
}
