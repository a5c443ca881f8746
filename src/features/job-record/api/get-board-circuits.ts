import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiGet } from '../../../lib/api-client.ts';
import { jobRecordKeys } from './job-record-keys.ts';

// Only what the observation form offers: each circuit's id, number and description.
const boardCircuitsSchema = z.object({
  circuits: z.array(z.object({ id: z.number().int(), number: z.string(), description: z.string() })),
});
export type BoardCircuitChoice = z.infer<typeof boardCircuitsSchema>['circuits'][number];

export const boardCircuitsQueryOptions = (boardId: number) =>
  queryOptions({
    queryKey: jobRecordKeys.boardCircuits(boardId),
    queryFn: async ({ signal }) => (await apiGet(`/api/boards/${boardId}`, boardCircuitsSchema, { signal })).circuits,
  });

/** The circuits of a board (GET /api/boards/:id), for tying an observation to one; nothing while no board is chosen. */
export function useBoardCircuits(boardId: number | null) {
  return useQuery({ ...boardCircuitsQueryOptions(boardId ?? 0), enabled: boardId !== null });
}
