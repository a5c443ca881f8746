import { queryOptions, useQuery } from '@tanstack/react-query';
import { meResponseSchema, type User } from '../../../../shared/schemas/auth.ts';
import { ApiError, apiGet } from '../../../lib/api-client.ts';
import { authKeys } from './auth-keys.ts';

/** The signed-in person, or null when nobody is signed in (the server answered 401). */
export async function getMe(signal?: AbortSignal): Promise<User | null> {
  try {
    return (await apiGet('/api/auth/me', meResponseSchema, { signal })).user;
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export const meQueryOptions = () =>
  queryOptions({
    queryKey: authKeys.me(),
    queryFn: ({ signal }) => getMe(signal),
    // The session only changes by signing in or out here (both write this entry) or by expiring,
    // which any 401 reports (see the query cache in app/providers.tsx).
    staleTime: 5 * 60_000,
  });

/** The signed-in person: `data` is the user, null when signed out, undefined while loading. */
export function useMe() {
  return useQuery(meQueryOptions());
}
