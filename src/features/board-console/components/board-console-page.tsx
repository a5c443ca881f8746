import { useQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { useParams } from 'react-router-dom';
import { meResponseSchema, type User } from '../../../../shared/schemas/auth.ts';
import type { BoardDetail, Circuit } from '../../../../shared/schemas/boards.ts';
import { boardToCheckInput, type CheckCircuit } from '../../../../shared/schemas/check.ts';
import type { Finding } from '../../../../shared/schemas/findings.ts';
import { createBoardChecker } from '../../../../shared/checker/index.ts';
import { storedValueFindingCode } from '../../../../shared/schemas/fit-circuit.ts';
import { ApiError, apiGet } from '../../../lib/api-client.ts';
import { useLockReasons } from '../api/board-gate.ts';
import { useBoardSync } from '../sync/use-board-sync.ts';
import { BoardConsole } from './board-console.tsx';

/**
 * The signed-in person (for the role that decides who may lock), under the same cache entry the
 * rest of the app keeps them in: `User`, or null when signed out.
 */
function useSignedInPerson() {
  return useQuery({
    queryKey: ['auth', 'me'] as const,
    queryFn: async ({ signal }): Promise<User | null> => {
      try {
        return (await apiGet('/api/auth/me', meResponseSchema, { signal })).user;
      } catch (error) {
        if (error instanceof ApiError && error.status === 401) return null;
        throw error;
      }
    },
    staleTime: 5 * 60_000,
  });
}

/**
 * The checker run on the client over the board as the typist sees it (pending edits included), so
 * every value is checked as it lands. Circuits that did not change keep their input objects, so the
 * checker's per-circuit cache answers for them.
 */
function useFindings(detail: BoardDetail | undefined): Finding[] {
  const checker = useMemo(() => createBoardChecker(), []);
  // Last time's readings are fixed while the board is open (they belong to an earlier job); the
  // circuits' inputs are built again only if they ever arrive anew.
  const previousReadings = detail?.previousReadings;
  const previousById = useMemo(() => new Map((previousReadings ?? []).map((p) => [p.circuitId, p])), [previousReadings]);
  const inputs = useMemo(() => new WeakMap<Circuit, CheckCircuit>(), [previousById]);
  return useMemo(() => {
    if (!detail) return [];
    const circuits = detail.circuits.map((circuit) => {
      let input = inputs.get(circuit);
      if (!input) {
        const previous = previousById.get(circuit.id);
        input = boardToCheckInput({ board: detail.board, site: detail.site, circuits: [circuit], previousReadings: previous ? [previous] : undefined }).circuits[0]!;
        inputs.set(circuit, input);
      }
      return input;
    });
    const { board, site } = boardToCheckInput({ board: detail.board, site: detail.site, circuits: [] });
    const checked = checker({ board, site, circuits });
    // A stored value the server had to fit to its field is known only to the server: keep its finding.
    const unfit = detail.findings.filter((f) => f.code === storedValueFindingCode);
    return unfit.length > 0 ? [...unfit, ...checked] : checked;
  }, [checker, detail, previousById, inputs]);
}

/** Route `/boards/:boardId`: the board console for one board. */
export function BoardConsolePage() {
  const { boardId: param } = useParams();
  const boardId = Number(param);
  if (!Number.isSafeInteger(boardId) || boardId <= 0) {
    return (
      <div className="flex h-full min-h-0 flex-col items-center justify-center p-6">
        <p role="alert">“{param}” is not a board number.</p>
      </div>
    );
  }
  return <BoardConsoleLoader key={boardId} boardId={boardId} />;
}

function BoardConsoleLoader({ boardId }: { boardId: number }) {
  const sync = useBoardSync(boardId);
  const me = useSignedInPerson();
  const findings = useFindings(sync.detail);
  const lockReasons = useLockReasons(sync.detail, findings);

  if (!sync.detail) {
    return (
      <div className="flex h-full min-h-0 flex-col items-center justify-center gap-2 p-6">
        {sync.error ? (
          <>
            <h1 className="font-semibold">This board cannot be opened</h1>
            <p role="alert" className="text-muted">
              {sync.error.message}
            </p>
          </>
        ) : (
          <p role="status">Opening the board…</p>
        )}
      </div>
    );
  }
  return <BoardConsole sync={sync} detail={sync.detail} findings={findings} role={me.data?.role ?? null} lockReasons={lockReasons} personId={me.data?.id ?? null} />;
}
