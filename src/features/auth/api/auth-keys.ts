/**
 * Query keys of the auth feature, general → specific. Everything cached for the signed-in person
 * lives outside `authKeys.all`, so sign-in and sign-out can drop it without touching these.
 */
export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
};
