/**
 * Query keys of the board console, general → specific: invalidating `boardKeys.all` (or
 * `details()`) refreshes every open board.
 */
export const boardKeys = {
  all: ['boards'] as const,
  details: () => [...boardKeys.all, 'detail'] as const,
  detail: (boardId: number) => [...boardKeys.details(), boardId] as const,
};
