import { boardResponseSchema, type UpdateBoardBody } from '../../../../shared/schemas/boards.ts';
import { apiRequest } from '../../../lib/api-client.ts';

/**
 * Changes the board's own details (Zdb, Ipf, location, supplied from, instruments, confirmations).
 * Sent with the board's version: a 409 means someone changed them meanwhile (its details carry the
 * board as it is now).
 */
export function updateBoard(boardId: number, body: UpdateBoardBody) {
  return apiRequest('PATCH', `/api/boards/${boardId}`, boardResponseSchema, body);
}
