import { useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect, useMemo, useSyncExternalStore } from 'react';
import type { CircuitFields } from '../../../../shared/schemas/boards.ts';
import type { ReadingKey } from '../../../../shared/schemas/columns.ts';
import { onSignOut } from '../../../lib/session-end.ts';
import { boardDetailQueryOptions } from '../api/get-board.ts';
import { BoardSyncEngine } from './board-sync-engine.ts';
import { cellTarget, fieldTarget, pendingMarks } from './targets.ts';
import type { BoardSync } from './types.ts';

/**
 * One engine per board and QueryClient, however many components ask for it: two engines would
 * send the same stored outbox twice. Components hold it while mounted; when the last one lets go
 * (after the current task, so a StrictMode remount keeps the same engine), the engine stops
 * polling, sends what is still waiting, and then leaves the registry.
 */
const registry = new WeakMap<QueryClient, Map<number, { engine: BoardSyncEngine; holders: number }>>();

function slotsOf(queryClient: QueryClient) {
  let boards = registry.get(queryClient);
  if (!boards) registry.set(queryClient, (boards = new Map()));
  return boards;
}

/**
 * The signed-in person, read from the cache the app's route guard fills before any page shows
 * (key `['auth', 'me']`, holding the user or null).
 */
function signedInUserId(queryClient: QueryClient): number | null {
  const me = queryClient.getQueryData<{ id: number } | null>(['auth', 'me']);
  return me?.id ?? null;
}

function engineFor(queryClient: QueryClient, boardId: number): BoardSyncEngine {
  const boards = slotsOf(queryClient);
  let slot = boards.get(boardId);
  if (!slot) {
    const engine = new BoardSyncEngine(queryClient, boardId, { ownerId: signedInUserId(queryClient) });
    boards.set(boardId, (slot = { engine, holders: 0 }));
  }
  return slot.engine;
}

function hold(queryClient: QueryClient, engine: BoardSyncEngine): () => void {
  const boards = slotsOf(queryClient);
  let slot = boards.get(engine.boardId);
  if (!slot || slot.engine !== engine) boards.set(engine.boardId, (slot = { engine, holders: 0 }));
  const held = slot;
  held.holders += 1;
  engine.start();
  return () => {
    held.holders -= 1;
    setTimeout(() => {
      if (held.holders > 0) return;
      engine.release(() => {
        if (held.holders === 0 && boards.get(engine.boardId) === held) boards.delete(engine.boardId);
      });
    }, 0);
  };
}

/**
 * Stops every board engine of a QueryClient at once, sending nothing more: what waits stays stored
 * for the board's next visit. For sign-out (nothing more goes out under the ending session, even
 * an outbox still draining after the console was left); call it once the console has unmounted.
 */
export function stopBoardSync(queryClient: QueryClient): void {
  const boards = registry.get(queryClient);
  if (!boards) return;
  registry.delete(queryClient);
  for (const { engine } of boards.values()) engine.stop();
}

// Registered when the console's code loads: sign-out (in the app layout) stops every engine.
onSignOut(stopBoardSync);

/**
 * The board console's connection to the server for one board (see `BoardSync` in types.ts).
 *
 * - `detail` is the board from the TanStack Query cache with this typist's unsent edits on top.
 * - Writes go to an outbox kept in localStorage and are sent one at a time, in order; a reload of
 *   the page sends what was left.
 * - The board's changes feed is polled every second while the tab is visible and merged into the
 *   cache; `present` lists who else has the board open.
 */
export function useBoardSync(boardId: number): BoardSync {
  const queryClient = useQueryClient();
  const engine = engineFor(queryClient, boardId);
  useEffect(() => hold(queryClient, engine), [queryClient, engine]);

  const query = useQuery(boardDetailQueryOptions(boardId));
  const snapshot = useSyncExternalStore(engine.subscribe, engine.getSnapshot, engine.getSnapshot);
  const detail = useMemo(() => engine.view(query.data, snapshot.entries), [engine, query.data, snapshot.entries]);

  const actions = useMemo(
    () => ({
      writeCell: engine.writeCell.bind(engine),
      writeField: engine.writeField.bind(engine) as BoardSync['writeField'],
      resolveConflict: engine.resolveConflict.bind(engine),
      insertCircuit: engine.insertCircuit.bind(engine),
      removeCircuit: engine.removeCircuit.bind(engine),
      lockBoard: engine.lockBoard.bind(engine),
      unlockBoard: engine.unlockBoard.bind(engine),
    }),
    [engine],
  );

  const marks = useMemo(() => pendingMarks(snapshot.entries), [snapshot.entries]);
  const { pending } = snapshot;
  const isPending = useMemo(
    () => (circuitId: number, key: ReadingKey | keyof CircuitFields) => pending.has(cellTarget(circuitId, key as ReadingKey)) || pending.has(fieldTarget(circuitId, key as keyof CircuitFields)),
    [pending],
  );

  return useMemo(
    () => ({
      detail,
      isLoading: query.isPending,
      error: query.error,
      status: snapshot.status,
      present: snapshot.present,
      conflicts: snapshot.conflicts,
      isPending,
      pendingMarks: marks,
      ...actions,
    }),
    [detail, query.isPending, query.error, snapshot.status, snapshot.present, snapshot.conflicts, isPending, marks, actions],
  );
}
