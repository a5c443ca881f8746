import { writeCellResponseSchema, type WriteCellBody } from '../../../../shared/schemas/boards.ts';
import type { ReadingKey } from '../../../../shared/schemas/columns.ts';
import { apiRequest } from '../../../lib/api-client.ts';

/**
 * Writes one reading. `version` is the version of the cell the typist saw (0 for a cell never
 * written); a stale one is refused with 409 and the cell as it is now. Sending the text the cell
 * already holds answers 200, so a retry after a lost answer is harmless.
 */
export function writeCell(boardId: number, circuitId: number, column: ReadingKey, body: WriteCellBody) {
  return apiRequest('PUT', `/api/boards/${boardId}/circuits/${circuitId}/cells/${column}`, writeCellResponseSchema, body);
}
