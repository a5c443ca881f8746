import { QueryCache, QueryClient } from '@tanstack/react-query';
import { ApiError, NetworkError } from '../lib/api-client.ts';
import { authKeys } from '../features/auth/api/auth-keys.ts';

/**
 * The app's QueryClient.
 *
 * - A 401 on any query means the session ended (expired, or signed out in another tab): `me`
 *   becomes null and the route guard sends the person to sign-in, then back to the same page.
 * - An answer from the server (4xx, 5xx) is not retried: asking again gives the same answer.
 *   Only "could not reach the server" is retried, twice.
 */
export function createAppQueryClient(): QueryClient {
  const queryClient: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      onError: (error, query) => {
        if (error instanceof ApiError && error.status === 401 && query.queryKey[0] !== authKeys.all[0]) {
          queryClient.setQueryData(authKeys.me(), null);
        }
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        retry: (failureCount, error) => error instanceof NetworkError && failureCount < 2,
      },
    },
  });
  return queryClient;
}
