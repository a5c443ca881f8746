import { queryOptions } from '@tanstack/react-query';
import type { BoardDetail } from '../../../../shared/schemas/boards.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { boardKeys } from './board-keys.ts';
import { boardDetailWireSchema } from './wire-schemas.ts';

/** One board with its site, job, circuits (in order, with their cells), findings and cursor. */
export function getBoard(boardId: number, signal?: AbortSignal): Promise<BoardDetail> {
  return apiGet(`/api/boards/${boardId}`, boardDetailWireSchema, { signal });
}

/**
 * The board as the server holds it. It never goes stale by time: the console keeps it current
 * through the changes feed and its own writes (`setQueryData`), so refetching on focus would only
 * repeat what the feed already brought. A board that failed to load is still fetched again when
 * the browser comes back online.
 */
export const boardDetailQueryOptions = (boardId: number) =>
  queryOptions({
    queryKey: boardKeys.detail(boardId),
    queryFn: ({ signal }) => getBoard(boardId, signal),
    staleTime: Number.POSITIVE_INFINITY,
  });
