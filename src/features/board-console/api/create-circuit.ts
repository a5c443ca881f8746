import type { CreateCircuitBody } from '../../../../shared/schemas/boards.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { circuitWireResponseSchema } from './wire-schemas.ts';

/** Inserts a circuit after `afterCircuitId` (or at the end); answers the new circuit. */
export function createCircuit(boardId: number, body: CreateCircuitBody) {
  return apiRequest('POST', `/api/boards/${boardId}/circuits`, circuitWireResponseSchema, body);
}
