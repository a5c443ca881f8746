import { apiRequest } from '../../../lib/api-client.ts';
import { circuitOrderResponseSchema } from './wire-schemas.ts';

/** Removes a circuit with its readings; answers the board's circuit ids in their new order. */
export function deleteCircuit(boardId: number, circuitId: number) {
  return apiRequest('DELETE', `/api/boards/${boardId}/circuits/${circuitId}`, circuitOrderResponseSchema);
}
