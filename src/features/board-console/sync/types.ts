import type { BoardDetail, Cell, Circuit, CircuitFields } from '../../../../shared/schemas/boards.ts';
import type { DetailKey, ReadingKey } from '../../../../shared/schemas/columns.ts';
import type { entryMethods } from '../../../../shared/schemas/boards.ts';

/**
 * Contract between the console's grid and its sync engine (`useBoardSync`). The grid never calls
 * the API itself: it asks the engine to write, and reads the board from the engine.
 */

export type EntryMethod = (typeof entryMethods)[number];

/** One edit waiting to reach the server, kept in the browser (survives a reload) until it lands. */
export type PendingEdit =
  | {
      kind: 'cell';
      /** Unique id of this edit (for de-duplication and undo). */
      id: string;
      boardId: number;
      circuitId: number;
      column: ReadingKey;
      text: string;
      reason: string | null;
      /** Version of the cell the typist saw when typing. */
      baseVersion: number;
      how: EntryMethod;
      at: string;
    }
  | {
      kind: 'field';
      id: string;
      boardId: number;
      circuitId: number;
      field: keyof CircuitFields;
      value: CircuitFields[keyof CircuitFields];
      baseVersion: number;
      how: EntryMethod;
      at: string;
    };

/** A write the server refused because someone else changed the same cell or field first. */
export interface Conflict {
  editId: string;
  circuitId: number;
  column: ReadingKey | DetailKey | keyof CircuitFields;
  /** What this typist wrote. */
  mine: string;
  /** What the server holds now, and who wrote it. */
  theirs: string;
  theirsBy: string | null;
}

export type SaveStatus =
  | { state: 'saved' }
  | { state: 'saving'; waiting: number }
  | { state: 'offline'; waiting: number }
  | { state: 'error'; message: string };

export interface BoardSync {
  /** The board as the typist should see it: server data with pending edits applied on top. */
  detail: BoardDetail | undefined;
  isLoading: boolean;
  error: Error | null;
  status: SaveStatus;
  /** Other people with the board open. */
  present: ReadonlyArray<{ id: number; name: string }>;
  conflicts: readonly Conflict[];
  /**
   * Whether this typist has an edit of the cell or circuit detail still waiting to reach the
   * server (for an "unsaved" mark). Optional: added by the sync engine, which always provides it.
   */
  isPending?(circuitId: number, column: ReadingKey | keyof CircuitFields): boolean;
  /**
   * The same for the grid, per circuit: the keys of its columns with an edit still waiting, as
   * " key key " (absent when none). Optional, like `isPending`.
   */
  pendingMarks?: ReadonlyMap<number, string>;
  /** Writes a reading (optimistic; queued; sent in order). */
  writeCell(circuitId: number, column: ReadingKey, text: string, options?: { reason?: string | null; how?: EntryMethod }): void;
  /** Writes a circuit detail (optimistic; queued; sent in order). */
  writeField<K extends keyof CircuitFields>(circuitId: number, field: K, value: CircuitFields[K], options?: { how?: EntryMethod }): void;
  /** Resolves a conflict: keep the other person's value, or write mine over it. */
  resolveConflict(editId: string, choice: 'keep-theirs' | 'overwrite'): void;
  /** Structural changes (online only; they answer with an error message when refused). */
  insertCircuit(afterCircuitId: number | null, fields?: Partial<CircuitFields>): Promise<Circuit>;
  removeCircuit(circuitId: number): Promise<void>;
  lockBoard(): Promise<void>;
  unlockBoard(reason: string): Promise<void>;
}

export type { Cell };
