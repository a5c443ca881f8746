import { boardResponseSchema } from '../../../../shared/schemas/boards.ts';
import { apiRequest } from '../../../lib/api-client.ts';

/** Locks a board (reviewers and admins): nothing on it changes until it is unlocked. */
export function lockBoard(boardId: number) {
  return apiRequest('POST', `/api/boards/${boardId}/lock`, boardResponseSchema);
}

/** Unlocks a locked board (reviewers and admins); the reason is kept in the board's history. */
export function unlockBoard(boardId: number, reason: string) {
  return apiRequest('POST', `/api/boards/${boardId}/unlock`, boardResponseSchema, { reason });
}
