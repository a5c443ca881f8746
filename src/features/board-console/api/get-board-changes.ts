import type { BoardChanges } from '../../../../shared/schemas/boards.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { boardChangesWireSchema } from './wire-schemas.ts';

/**
 * What changed on a board after `after` (a cursor from an earlier answer): the circuits changed,
 * whole; every circuit id in order; the board; findings (empty when nothing changed); and who
 * else has the board open. Asking also marks the caller present for a few seconds.
 */
export function getBoardChanges(boardId: number, after: number, signal?: AbortSignal): Promise<BoardChanges> {
  return apiGet(`/api/boards/${boardId}/changes?after=${encodeURIComponent(after)}`, boardChangesWireSchema, { signal });
}
