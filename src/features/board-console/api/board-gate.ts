import { queryOptions, useQuery } from '@tanstack/react-query';
import { boardLockReasons } from '../../../../shared/review/gate.ts';
import type { BoardDetail } from '../../../../shared/schemas/boards.ts';
import type { Finding } from '../../../../shared/schemas/findings.ts';
import { boardGateResponseSchema } from '../../../../shared/schemas/review.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { boardKeys } from './board-keys.ts';

/** The board's gate as the server last answered it, and the findings a reviewer accepted on it. */
export const boardGateQueryOptions = (boardId: number) =>
  queryOptions({
    queryKey: [...boardKeys.all, 'gate', boardId] as const,
    queryFn: ({ signal }) => apiGet(`/api/boards/${boardId}/gate`, boardGateResponseSchema, { signal }),
  });

/**
 * Why the board cannot be locked yet, from the findings as the typist sees them now and the
 * reviewer's acceptances: the same function the server runs at locking (shared/review/gate.ts),
 * so the console shows the list before anyone tries. Null while the acceptances are not known.
 */
export function useLockReasons(detail: BoardDetail | undefined, findings: readonly Finding[]): readonly string[] | null {
  const boardId = detail?.board.id ?? 0;
  const gate = useQuery({ ...boardGateQueryOptions(boardId), enabled: boardId > 0 });
  if (!detail || !gate.data) return null;
  const acceptedKeys = new Set(gate.data.acceptances.map((a) => a.findingKey));
  return boardLockReasons({ board: detail.board, circuits: detail.circuits, findings, acceptedKeys });
}
