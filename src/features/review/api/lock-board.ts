import { useMutation, useQueryClient } from '@tanstack/react-query';
import { boardResponseSchema } from '../../../../shared/schemas/boards.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { reviewKeys } from './review-keys.ts';

/**
 * Locks a board from the review screen (reviewers and admins). A refused lock answers 409 with
 * the gate's reasons in `details.reasons`. Open consoles of the board (`['boards']`) are fetched
 * again as well as everything about jobs.
 */
export function useLockBoard() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (boardId: number) => (await apiRequest('POST', `/api/boards/${boardId}/lock`, boardResponseSchema)).board,
    onSettled: () => Promise.all([queryClient.invalidateQueries({ queryKey: reviewKeys.all }), queryClient.invalidateQueries({ queryKey: ['boards'] })]),
  });
}

/** The reasons a refusal carried (the gate's list), or the error's own message. */
export function reasonsOf(error: unknown): string[] {
  const details = (error as { details?: { reasons?: unknown } } | null)?.details;
  if (details && Array.isArray(details.reasons)) return details.reasons.filter((r): r is string => typeof r === 'string');
  return [];
}

/** Sends a locked board back to the testers: unlocks it with a reason kept in its history. */
export function useUnlockBoard() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async ({ boardId, reason }: { boardId: number; reason: string }) =>
      (await apiRequest('POST', `/api/boards/${boardId}/unlock`, boardResponseSchema, { reason })).board,
    onSettled: () => Promise.all([queryClient.invalidateQueries({ queryKey: reviewKeys.all }), queryClient.invalidateQueries({ queryKey: ['boards'] })]),
  });
}
