import type { QueryClient } from '@tanstack/react-query';
import type { BoardDetail, Cell, Circuit, CircuitFields } from '../../../../shared/schemas/boards.ts';
import type { ReadingKey } from '../../../../shared/schemas/columns.ts';
import type { Finding } from '../../../../shared/schemas/findings.ts';
import { ApiError, NetworkError } from '../../../lib/api-client.ts';
import { lockBoard as postLock, unlockBoard as postUnlock } from '../api/board-lock.ts';
import { boardKeys } from '../api/board-keys.ts';
import { createCircuit } from '../api/create-circuit.ts';
import { deleteCircuit } from '../api/delete-circuit.ts';
import { getBoard } from '../api/get-board.ts';
import { getBoardChanges } from '../api/get-board-changes.ts';
import { updateCircuit } from '../api/update-circuit.ts';
import { cellConflictDetailsSchema, circuitConflictDetailsSchema } from '../api/wire-schemas.ts';
import { writeCell as putCell } from '../api/write-cell.ts';
import { arrangeCircuits, mergeBoard, mergeChanges, mergeCircuit, mergeFetched, replaceCircuitFindings } from './merge.ts';
import { afterNextFrame } from './after-next-frame.ts';
import { browserStorage, OutboxWriter, readOutbox, type OutboxEntry } from './outbox-storage.ts';
import { PendingOverlay } from './overlay.ts';
import { cellTarget, fieldTarget, fieldValueText, targetOf, type EditTarget } from './targets.ts';
import type { Conflict, EntryMethod, PendingEdit, SaveStatus } from './types.ts';

type Person = { id: number; name: string };

/** What the hook reads from the engine; a new object whenever anything in it changes. */
export interface BoardSyncSnapshot {
  /** The outbox in order, including edits held by a conflict. */
  entries: readonly OutboxEntry[];
  conflicts: readonly Conflict[];
  status: SaveStatus;
  present: readonly Person[];
  /** Targets (see targets.ts) with an edit still being sent. */
  pending: ReadonlySet<EditTarget>;
}

export interface BoardSyncTimings {
  /** Pause between two polls of the changes feed. */
  pollMs: number;
  /** Waits before the 1st, 2nd, … retry of an edit the server could not be reached for; the last repeats. */
  retryMs: readonly number[];
}

export const defaultTimings: BoardSyncTimings = { pollMs: 1000, retryMs: [1000, 2000, 4000, 8000, 10_000] };

export interface BoardSyncEngineOptions {
  timings?: BoardSyncTimings;
  /** Where the outbox is kept; localStorage by default, null for memory only. */
  storage?: Storage | null;
  /** The signed-in person whose edits these are: the stored outbox is theirs alone. */
  ownerId?: number | null;
}

/** Statuses that mean "no answer worth acting on yet": keep the edit and try again later. */
function isRetryable(error: unknown): boolean {
  if (error instanceof NetworkError) return true;
  if (!(error instanceof ApiError)) return true; // an answer we could not read: the edit may have landed; resending is safe
  // 401: the session ended; the edit goes once the typist signs in again. 408/429: asked to wait.
  return error.status >= 500 || error.status === 401 || error.status === 408 || error.status === 429;
}

function isUnreachable(error: unknown): boolean {
  return error instanceof NetworkError || (error instanceof ApiError && error.status >= 502 && error.status <= 504);
}

function newEditId(): string {
  const bytes = new Uint8Array(16);
  crypto.getRandomValues(bytes);
  return Array.from(bytes, (b) => b.toString(16).padStart(2, '0')).join('');
}

function samePeople(a: readonly Person[], b: readonly Person[]): boolean {
  return a.length === b.length && a.every((p, i) => p.id === b[i]?.id && p.name === b[i]?.name);
}

/**
 * The console's sync engine for one board: an outbox of edits sent one at a time in the order they
 * were typed, and a poll of the board's changes feed. It owns no React state; `useBoardSync` reads
 * it through `subscribe`/`getSnapshot` and reads the board itself from the TanStack Query cache,
 * which the engine updates in place with `setQueryData`.
 *
 * Versions: every edit carries the version the typist saw (`baseVersion`). When an edit lands, the
 * edits queued after it for the same cell or detail were typed over it, so they are rebased onto
 * the version the server answered; they never conflict with the typist's own earlier edit.
 */
export class BoardSyncEngine {
  readonly boardId: number;
  private readonly queryClient: QueryClient;
  private readonly timings: BoardSyncTimings;
  private readonly outbox: OutboxWriter;
  private readonly overlay = new PendingOverlay();
  private readonly listeners = new Set<() => void>();

  private entries: OutboxEntry[];
  /** Ids of every edit this page has held: what it may remove from storage. */
  private readonly ownIds = new Set<string>();
  private present: readonly Person[] = [];
  private lastError: string | null = null;
  /** The last write could not reach the server. Cleared by the next write that lands. */
  private writesUnreachable = false;
  /** The last poll could not reach the server. Cleared by the next poll answered. */
  private pollUnreachable = false;
  private snapshot: BoardSyncSnapshot;

  private running = false;
  /** Set by `release`: stop once nothing sendable is left. */
  private stopWhenSent = false;
  private onStopped: (() => void) | null = null;
  /** Bumped by every start and stop, so answers to requests of an earlier run are ignored. */
  private run = 0;
  private sending = false;
  /** Cancels the send waiting for the next frame (see `sendAfterFrame`), if one is. */
  private cancelSend: (() => void) | null = null;
  private retryAttempt = 0;
  private retryTimer: ReturnType<typeof setTimeout> | null = null;
  private pollTimer: ReturnType<typeof setTimeout> | null = null;
  private polling = false;
  private reloading = false;
  /** Cursor of this page's latest insert or removal: an older order from the feed is not applied. */
  private structureCursor = 0;

  constructor(queryClient: QueryClient, boardId: number, options: BoardSyncEngineOptions = {}) {
    this.queryClient = queryClient;
    this.boardId = boardId;
    this.timings = options.timings ?? defaultTimings;
    const storage = options.storage === undefined ? browserStorage() : options.storage;
    const ownerId = options.ownerId ?? null;
    this.outbox = new OutboxWriter(storage, boardId, ownerId);
    this.entries = readOutbox(storage, boardId, ownerId);
    for (const entry of this.entries) this.ownIds.add(entry.edit.id);
    this.snapshot = this.makeSnapshot();
  }

  // ---- reading ------------------------------------------------------------------------------

  subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  getSnapshot = (): BoardSyncSnapshot => this.snapshot;

  /** The cached board with the outbox applied on top (see PendingOverlay). */
  view(detail: BoardDetail | undefined, entries: readonly OutboxEntry[] = this.snapshot.entries): BoardDetail | undefined {
    return this.overlay.apply(detail, entries);
  }

  private get key() {
    return boardKeys.detail(this.boardId);
  }

  private cached(): BoardDetail | undefined {
    return this.queryClient.getQueryData<BoardDetail>(this.key);
  }

  private setCached(update: (detail: BoardDetail) => BoardDetail): void {
    this.queryClient.setQueryData<BoardDetail>(this.key, (old) => (old ? update(old) : old));
  }

  private pendingTargets(entries: readonly OutboxEntry[] = this.entries): Set<EditTarget> {
    const targets = new Set<EditTarget>();
    for (const entry of entries) if (!entry.conflict) targets.add(targetOf(entry.edit));
    return targets;
  }

  private status(): SaveStatus {
    const waiting = this.entries.filter((e) => !e.conflict).length;
    if (this.writesUnreachable || this.pollUnreachable) return { state: 'offline', waiting };
    if (this.lastError !== null) return { state: 'error', message: this.lastError };
    if (waiting > 0) return { state: 'saving', waiting };
    return { state: 'saved' };
  }

  private makeSnapshot(): BoardSyncSnapshot {
    const previous = this.snapshot as BoardSyncSnapshot | undefined;
    const status = this.status();
    const entries = previous && previous.entries.length === this.entries.length && previous.entries.every((e, i) => e === this.entries[i])
      ? previous.entries
      : [...this.entries];
    const sameStatus = previous && JSON.stringify(previous.status) === JSON.stringify(status);
    const found = entries === previous?.entries ? previous.conflicts : entries.flatMap((e) => (e.conflict ? [e.conflict] : []));
    const conflicts = previous && found.length === previous.conflicts.length && found.every((c, i) => c === previous.conflicts[i]) ? previous.conflicts : found;
    return {
      entries,
      conflicts,
      status: sameStatus ? previous.status : status,
      present: this.present,
      pending: entries === previous?.entries ? previous.pending : this.pendingTargets(entries),
    };
  }

  private emit(): void {
    const next = this.makeSnapshot();
    const previous = this.snapshot;
    if (next.entries === previous.entries && next.status === previous.status && next.present === previous.present) return;
    this.snapshot = next;
    for (const listener of this.listeners) listener();
  }

  /** Stores the outbox and tells the readers. Call after every change of `entries`. */
  private commit(): void {
    this.outbox.write(this.entries, this.ownIds);
    this.emit();
  }

  // ---- life -------------------------------------------------------------------------------

  /** Starts sending the outbox (including edits kept from an earlier visit) and polling the feed. */
  start(): void {
    this.stopWhenSent = false;
    this.onStopped = null;
    if (this.running) {
      this.schedulePoll(0);
      return;
    }
    this.running = true;
    this.run += 1;
    this.sending = false;
    this.polling = false;
    if (typeof window !== 'undefined') window.addEventListener('online', this.onOnline);
    if (typeof document !== 'undefined') document.addEventListener('visibilitychange', this.onVisibilityChange);
    this.schedulePoll(0);
    this.pump();
  }

  /**
   * Nobody shows the board any more: stop polling, but keep sending until the outbox holds nothing
   * sendable, so leaving the console does not leave readings waiting for the board's next visit.
   * `onStopped` is called once the engine has stopped.
   */
  release(onStopped: () => void): void {
    this.onStopped = onStopped;
    if (!this.running || !this.entries.some((e) => !e.conflict)) {
      this.stop();
      return;
    }
    this.stopWhenSent = true;
    if (this.pollTimer) clearTimeout(this.pollTimer);
    this.pollTimer = null;
  }

  /** Stops all timers and listeners; answers still on their way are ignored. The outbox stays stored. */
  stop(): void {
    const onStopped = this.onStopped;
    this.onStopped = null;
    this.stopWhenSent = false;
    onStopped?.();
    if (!this.running) return;
    this.running = false;
    this.run += 1;
    if (typeof window !== 'undefined') window.removeEventListener('online', this.onOnline);
    if (typeof document !== 'undefined') document.removeEventListener('visibilitychange', this.onVisibilityChange);
    if (this.retryTimer) clearTimeout(this.retryTimer);
    if (this.pollTimer) clearTimeout(this.pollTimer);
    this.cancelSend?.();
    this.retryTimer = null;
    this.pollTimer = null;
    this.cancelSend = null;
  }

  private onOnline = (): void => {
    this.retryNow();
    this.schedulePoll(0);
  };

  private onVisibilityChange = (): void => {
    if (document.visibilityState === 'visible') this.schedulePoll(0);
  };

  /** Skips the wait of a pending retry. */
  private retryNow(): void {
    if (!this.retryTimer) return;
    clearTimeout(this.retryTimer);
    this.retryTimer = null;
    this.pump();
  }

  // ---- writing ----------------------------------------------------------------------------

  writeCell(circuitId: number, column: ReadingKey, rawText: string, options: { reason?: string | null; how?: EntryMethod } = {}): void {
    // The server keeps readings trimmed and an empty reason as none; comparing like with like.
    const text = rawText.trim();
    const reason = options.reason?.trim() ? options.reason.trim() : null;
    const target = cellTarget(circuitId, column);
    const server = this.cached()?.circuits.find((c) => c.id === circuitId)?.cells[column];
    const settled = this.settleConflict(target);
    const queued = this.lastQueued(target);
    const shown = queued?.kind === 'cell' ? queued : server;
    if ((shown?.text ?? '') === text && (shown?.reason ?? null) === reason) {
      if (settled) this.commit();
      return;
    }
    this.enqueue({
      kind: 'cell',
      id: newEditId(),
      boardId: this.boardId,
      circuitId,
      column,
      text,
      reason,
      baseVersion: queued?.baseVersion ?? server?.version ?? 0,
      how: options.how ?? 'typed',
      at: new Date().toISOString(),
    });
  }

  writeField<K extends keyof CircuitFields>(circuitId: number, field: K, value: CircuitFields[K], options: { how?: EntryMethod } = {}): void {
    const target = fieldTarget(circuitId, field);
    const circuit = this.cached()?.circuits.find((c) => c.id === circuitId);
    const settled = this.settleConflict(target);
    const queued = this.lastQueued(target);
    const shown = queued?.kind === 'field' ? queued.value : circuit?.[field];
    if (shown !== undefined && Object.is(shown, value)) {
      if (settled) this.commit();
      return;
    }
    this.enqueue({
      kind: 'field',
      id: newEditId(),
      boardId: this.boardId,
      circuitId,
      field,
      value,
      baseVersion: queued?.baseVersion ?? circuit?.version ?? 0,
      how: options.how ?? 'typed',
      at: new Date().toISOString(),
    });
  }

  /**
   * Typing into a cell whose conflict is still open is the typist's answer to it: they saw the
   * other person's value and wrote over it knowingly. Returns whether a conflict was dropped.
   */
  private settleConflict(target: EditTarget): boolean {
    const before = this.entries.length;
    this.entries = this.entries.filter((e) => !(e.conflict && targetOf(e.edit) === target));
    return this.entries.length !== before;
  }

  private lastQueued(target: EditTarget): PendingEdit | undefined {
    for (let i = this.entries.length - 1; i >= 0; i -= 1) {
      const entry = this.entries[i]!;
      if (!entry.conflict && targetOf(entry.edit) === target) return entry.edit;
    }
    return undefined;
  }

  private enqueue(edit: PendingEdit): void {
    this.ownIds.add(edit.id);
    this.entries = [...this.entries, { edit }];
    // Stored before the key's handler returns: from here on a crash or a reload cannot lose it.
    this.commit();
    this.sendAfterFrame();
  }

  /**
   * Sends what waits once the typed value is on screen. Starting a request costs the main thread
   * about a millisecond and a half, and the edit is already stored and shown, so the keystroke's
   * frame does not wait for it.
   */
  private sendAfterFrame(): void {
    if (this.cancelSend) return;
    this.cancelSend = afterNextFrame(() => {
      this.cancelSend = null;
      this.pump();
    });
  }

  resolveConflict(editId: string, choice: 'keep-theirs' | 'overwrite'): void {
    const entry = this.entries.find((e) => e.conflict?.editId === editId);
    if (!entry) return;
    const rest = this.entries.filter((e) => e !== entry);
    if (choice === 'keep-theirs') {
      this.entries = rest;
      this.commit();
      return;
    }
    // Written again over the server's value as it is now (the cache follows the server for a
    // conflicted cell, since nothing of ours is pending on it).
    const circuit = this.cached()?.circuits.find((c) => c.id === entry.edit.circuitId);
    const current = entry.edit.kind === 'cell' ? circuit?.cells[entry.edit.column]?.version ?? 0 : circuit?.version ?? entry.edit.baseVersion;
    this.entries = [...rest, { edit: { ...entry.edit, baseVersion: current } }];
    this.commit();
    this.pump();
  }

  /** Sends the first edit that is not held, then the next, one at a time. */
  private pump(): void {
    if (!this.running || this.sending || this.retryTimer) return;
    const entry = this.entries.find((e) => !e.conflict);
    if (!entry) {
      this.emit();
      if (this.stopWhenSent) this.stop();
      return;
    }
    this.sending = true;
    const run = this.run;
    const edit = entry.edit;
    const request =
      edit.kind === 'cell'
        ? putCell(this.boardId, edit.circuitId, edit.column, { text: edit.text, version: edit.baseVersion, reason: edit.reason, how: edit.how }).then((answer) => {
            if (run === this.run) this.onCellSaved(edit, answer.cell, answer.findings);
          })
        : updateCircuit(this.boardId, edit.circuitId, { version: edit.baseVersion, changes: { [edit.field]: edit.value }, how: edit.how }).then((answer) => {
            if (run === this.run) this.onFieldSaved(edit, answer.circuit, answer.findings);
          });
    void request
      .catch((error: unknown) => {
        if (run === this.run) this.onSendFailed(edit, error);
      })
      .finally(() => {
        if (run !== this.run) return;
        this.sending = false;
        this.pump();
      });
    this.emit();
  }

  private landed(): void {
    this.lastError = null;
    this.writesUnreachable = false;
    this.retryAttempt = 0;
  }

  /** Removes a landed edit and rebases the later edits of the same target onto `version`. */
  private removeLanded(edit: PendingEdit, version: number): void {
    const target = targetOf(edit);
    this.entries = this.entries
      .filter((e) => e.edit.id !== edit.id)
      .map((e) => (!e.conflict && targetOf(e.edit) === target && e.edit.baseVersion !== version ? { edit: { ...e.edit, baseVersion: version } } : e));
  }

  private onCellSaved(edit: PendingEdit & { kind: 'cell' }, cell: Cell, findings: Finding[]): void {
    if (!this.running) return;
    this.landed();
    this.removeLanded(edit, cell.version);
    this.setCached((detail) => ({
      ...detail,
      circuits: detail.circuits.map((c) => {
        if (c.id !== edit.circuitId) return c;
        const existing = c.cells[edit.column];
        if (existing && existing.version > cell.version) return c;
        return { ...c, cells: { ...c.cells, [edit.column]: cell } };
      }),
      findings: replaceCircuitFindings(detail.findings, edit.circuitId, findings),
    }));
    this.commit();
  }

  private onFieldSaved(edit: PendingEdit & { kind: 'field' }, circuit: Circuit, findings: Finding[]): void {
    if (!this.running) return;
    this.landed();
    this.removeLanded(edit, circuit.version);
    const pending = this.pendingTargets();
    this.setCached((detail) => ({
      ...detail,
      circuits: detail.circuits.map((c) => (c.id === circuit.id ? mergeCircuit(c, circuit, pending) : c)),
      findings: replaceCircuitFindings(detail.findings, edit.circuitId, findings),
    }));
    this.commit();
  }

  private onSendFailed(edit: PendingEdit, error: unknown): void {
    if (!this.running || !this.entries.some((e) => e.edit.id === edit.id)) return;
    if (isRetryable(error)) {
      if (isUnreachable(error)) this.writesUnreachable = true;
      else this.lastError = error instanceof Error ? error.message : 'The server could not take the edit; trying again.';
      const waits = this.timings.retryMs;
      const wait = waits[Math.min(this.retryAttempt, waits.length - 1)] ?? 1000;
      this.retryAttempt += 1;
      this.retryTimer = setTimeout(() => {
        this.retryTimer = null;
        this.pump();
      }, wait);
      this.emit();
      return;
    }
    this.writesUnreachable = false;
    this.retryAttempt = 0;
    if (error instanceof ApiError && error.status === 409) {
      this.holdConflict(edit, error);
      return;
    }
    // Refused for good (locked board, a value the server will not take, a circuit gone): the
    // edit goes, the reason stays on the status line until the next save, and the board is read
    // again so the grid shows what the server holds.
    this.lastError = error instanceof Error ? error.message : 'The server refused the edit.';
    this.entries = this.entries.filter((e) => e.edit.id !== edit.id);
    this.commit();
    void this.reload();
  }

  /**
   * Holds an edit the server refused because someone else changed the same cell or detail first.
   * Edits of the same target queued behind it were typed over the refused one, so they are folded
   * into it: the conflict offers the typist's latest value.
   */
  private holdConflict(edit: PendingEdit, error: ApiError): void {
    const target = targetOf(edit);
    const later = this.entries.filter((e) => !e.conflict && e.edit.id !== edit.id && targetOf(e.edit) === target);
    const latest = later.at(-1)?.edit ?? edit;
    const held: PendingEdit = edit.kind === 'cell' && latest.kind === 'cell' ? { ...edit, text: latest.text, reason: latest.reason } : edit.kind === 'field' && latest.kind === 'field' ? { ...edit, value: latest.value } : edit;
    const laterIds = new Set(later.map((e) => e.edit.id));

    let conflict: Conflict;
    if (held.kind === 'cell') {
      const parsed = cellConflictDetailsSchema.safeParse(error.details);
      const current = parsed.success ? parsed.data.current : null;
      conflict = { editId: held.id, circuitId: held.circuitId, column: held.column, mine: held.text, theirs: current?.text ?? '', theirsBy: current?.updatedBy?.name ?? null };
      this.entries = this.entries.filter((e) => !laterIds.has(e.edit.id)).map((e) => (e.edit.id === held.id ? { edit: held, conflict } : e));
      if (current) {
        this.setCached((detail) => ({
          ...detail,
          circuits: detail.circuits.map((c) => {
            if (c.id !== held.circuitId) return c;
            const existing = c.cells[held.column];
            return existing && existing.version >= current.version ? c : { ...c, cells: { ...c.cells, [held.column]: current } };
          }),
        }));
      } else {
        void this.reload();
      }
    } else {
      const parsed = circuitConflictDetailsSchema.safeParse(error.details);
      const current = parsed.success ? parsed.data.current : null;
      conflict = {
        editId: held.id,
        circuitId: held.circuitId,
        column: held.field,
        mine: fieldValueText(held.value),
        theirs: current ? fieldValueText(current[held.field]) : '',
        // The circuit does not say who changed a detail; the server's message does not name them.
        theirsBy: null,
      };
      this.entries = this.entries.filter((e) => !laterIds.has(e.edit.id)).map((e) => (e.edit.id === held.id ? { edit: held, conflict } : e));
      if (current) {
        const pending = this.pendingTargets();
        this.setCached((detail) => ({ ...detail, circuits: detail.circuits.map((c) => (c.id === current.id ? mergeCircuit(c, current, pending) : c)) }));
      } else {
        void this.reload();
      }
    }
    this.commit();
  }

  // ---- reading the server -------------------------------------------------------------------

  /** Reads the whole board again and merges it in (pending edits and newer versions kept). */
  private async reload(): Promise<void> {
    if (this.reloading) return;
    this.reloading = true;
    const run = this.run;
    try {
      const fresh = await getBoard(this.boardId);
      if (run !== this.run) return;
      const pending = this.pendingTargets();
      this.queryClient.setQueryData<BoardDetail>(this.key, (old) => mergeFetched(old, fresh, pending));
    } catch {
      // The next poll or save tries again; the feed keeps the cache moving meanwhile.
    } finally {
      this.reloading = false;
    }
  }

  private schedulePoll(wait: number): void {
    if (!this.running || this.polling || this.stopWhenSent) return;
    if (this.pollTimer) clearTimeout(this.pollTimer);
    this.pollTimer = setTimeout(() => {
      this.pollTimer = null;
      void this.poll();
    }, wait);
  }

  private async poll(): Promise<void> {
    if (!this.running || this.polling) return;
    // A hidden tab stops asking; the visibilitychange listener starts it again.
    if (typeof document !== 'undefined' && document.visibilityState === 'hidden') return;
    const cached = this.cached();
    if (!cached) {
      // A board that failed to load (no network when the page opened) is asked for again, so
      // the console comes back by itself with the server.
      const query = this.queryClient.getQueryState(this.key);
      if (query?.status === 'error' && query.fetchStatus === 'idle') void this.queryClient.refetchQueries({ queryKey: this.key, type: 'active' });
      this.schedulePoll(this.timings.pollMs);
      return;
    }
    this.polling = true;
    const run = this.run;
    const after = cached.cursor;
    try {
      const changes = await getBoardChanges(this.boardId, after);
      if (run !== this.run) return;
      let missing = false;
      this.setCached((detail) => {
        const merged = mergeChanges(detail, changes, { after, pending: this.pendingTargets(), applyOrder: changes.cursor >= this.structureCursor });
        missing = merged.missing;
        return merged.detail;
      });
      if (missing) void this.reload();
      if (!samePeople(this.present, changes.present)) this.present = changes.present;
      if (this.pollUnreachable) {
        // The server answers again: send what waits now rather than at the end of the backoff.
        this.pollUnreachable = false;
        this.retryNow();
      }
      this.emit();
    } catch (error) {
      if (run !== this.run) return;
      if (isUnreachable(error)) {
        this.pollUnreachable = true;
        // Who else is on the board is not known while the server cannot be asked.
        if (this.present.length > 0) this.present = [];
        this.emit();
      }
    } finally {
      if (run === this.run) {
        this.polling = false;
        this.schedulePoll(this.timings.pollMs);
      }
    }
  }

  // ---- structure and lock (online only) ----------------------------------------------------

  async insertCircuit(afterCircuitId: number | null, fields: Partial<CircuitFields> = {}): Promise<Circuit> {
    const answer = await createCircuit(this.boardId, { ...fields, afterCircuitId });
    this.structureCursor = Math.max(this.structureCursor, answer.cursor);
    const circuit = answer.circuit;
    this.setCached((detail) => {
      const order = detail.circuits.map((c) => c.id).filter((id) => id !== circuit.id);
      const after = afterCircuitId === null ? -1 : order.indexOf(afterCircuitId);
      order.splice(after === -1 ? order.length : after + 1, 0, circuit.id);
      const byId = new Map(detail.circuits.map((c) => [c.id, c]));
      byId.set(circuit.id, circuit);
      return {
        ...detail,
        circuits: arrangeCircuits(detail.circuits, order, byId) ?? detail.circuits,
        findings: replaceCircuitFindings(detail.findings, circuit.id, answer.findings),
      };
    });
    return circuit;
  }

  async removeCircuit(circuitId: number): Promise<void> {
    const answer = await deleteCircuit(this.boardId, circuitId);
    this.structureCursor = Math.max(this.structureCursor, answer.cursor);
    let missing = false;
    this.setCached((detail) => {
      const byId = new Map(detail.circuits.map((c) => [c.id, c]));
      const arranged = arrangeCircuits(detail.circuits, answer.order, byId);
      missing = arranged === null;
      return {
        ...detail,
        circuits: arranged ?? detail.circuits.filter((c) => c.id !== circuitId),
        findings: detail.findings.filter((f) => f.circuitId !== circuitId),
      };
    });
    // Readings still waiting for a circuit this typist removed would only be refused.
    const before = this.entries.length;
    this.entries = this.entries.filter((e) => e.edit.circuitId !== circuitId);
    if (this.entries.length !== before) this.commit();
    // Someone else inserted a circuit this page has not seen yet.
    if (missing) void this.reload();
  }

  async lockBoard(): Promise<void> {
    const { board } = await postLock(this.boardId);
    this.setCached((detail) => ({ ...detail, board: mergeBoard(detail.board, board) }));
  }

  async unlockBoard(reason: string): Promise<void> {
    const { board } = await postUnlock(this.boardId, reason);
    this.setCached((detail) => ({ ...detail, board: mergeBoard(detail.board, board) }));
  }
}
