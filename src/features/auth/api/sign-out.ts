import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { useNavigate } from 'react-router-dom';
import { apiRequest } from '../../../lib/api-client.ts';
import { authKeys } from './auth-keys.ts';

export async function signOut(): Promise<void> {
  await apiRequest('POST', '/api/auth/sign-out', z.undefined());
}

/**
 * Signs out, shows the sign-in page and forgets everything cached for the person.
 *
 * The page changes first, synchronously (`flushSync`), and the cache second: were `me` cleared
 * while a protected page is still on screen, the route guard would send the person to sign-in
 * with a "come back here" note, and whoever signs in next would land on the previous person's page.
 */
export function useSignOut() {
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  return useMutation({
    mutationFn: signOut,
    onSuccess: async () => {
      await navigate('/sign-in', { replace: true, flushSync: true });
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== authKeys.all[0] });
      queryClient.setQueryData(authKeys.me(), null);
    },
  });
}
