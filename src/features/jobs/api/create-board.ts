import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import type { CreateBoardBody } from '../../../../shared/schemas/sites.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { jobsKeys } from './jobs-keys.ts';

// Only the new board's id is needed here: the console loads the rest.
const createBoardResponseSchema = z.object({ board: z.object({ id: z.number().int(), reference: z.string() }) });

/** `POST /api/jobs/:jobId/boards`: an empty board of N ways, or a copy of another board's circuit details. */
export async function createBoard({ jobId, body }: { jobId: number; body: CreateBoardBody }): Promise<{ id: number; reference: string }> {
  return (await apiRequest('POST', `/api/jobs/${jobId}/boards`, createBoardResponseSchema, body)).board;
}

export function useCreateBoard() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createBoard,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: jobsKeys.all }),
  });
}
