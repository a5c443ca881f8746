import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { listedUserSchema, type CreateUserBody, type ListedUser } from '../../../../shared/schemas/auth.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { usersKeys } from './users-keys.ts';

const createUserResponseSchema = z.object({ user: listedUserSchema });

export async function createUser(body: CreateUserBody): Promise<ListedUser> {
  return (await apiRequest('POST', '/api/users', createUserResponseSchema, body)).user;
}

/** Creates an account; the new person shows in the list at once, then the list is fetched again. */
export function useCreateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createUser,
    onSuccess: (user) => {
      queryClient.setQueryData(usersKeys.list(), (users: ListedUser[] | undefined) => (users ? [...users, user] : users));
      return queryClient.invalidateQueries({ queryKey: usersKeys.lists() });
    },
  });
}
