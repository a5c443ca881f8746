/**
 * Query keys of the admin feature's people list, general → specific. The API lists everyone at
 * once (a company's testers fit on one page), so `list()` takes no filters.
 */
export const usersKeys = {
  all: ['users'] as const,
  lists: () => [...usersKeys.all, 'list'] as const,
  list: () => [...usersKeys.lists(), 'everyone'] as const,
};
