import type { UpdateCircuitBody } from '../../../../shared/schemas/boards.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { circuitWireResponseSchema } from './wire-schemas.ts';

/**
 * Changes details of a circuit. `version` is the circuit version the typist saw; the server
 * refuses (409) only when one of the same fields changed after it.
 */
export function updateCircuit(boardId: number, circuitId: number, body: UpdateCircuitBody) {
  return apiRequest('PATCH', `/api/boards/${boardId}/circuits/${circuitId}`, circuitWireResponseSchema, body);
}
