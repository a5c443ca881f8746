import { useMutation, useQueryClient } from '@tanstack/react-query';
import { meResponseSchema, type SignInBody, type User } from '../../../../shared/schemas/auth.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { authKeys } from './auth-keys.ts';

export async function signIn(body: SignInBody): Promise<User> {
  return (await apiRequest('POST', '/api/auth/sign-in', meResponseSchema, body)).user;
}

/**
 * Signs in and records the person as `me`. Whatever was cached for someone signed in earlier on
 * this browser is dropped first, so nobody sees another person's lists even for a moment.
 */
export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (user) => {
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== authKeys.all[0] });
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}
