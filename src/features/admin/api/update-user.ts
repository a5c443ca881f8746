import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { listedUserSchema, type UpdateUserBody, type ListedUser } from '../../../../shared/schemas/auth.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { usersKeys } from './users-keys.ts';

const updateUserResponseSchema = z.object({ user: listedUserSchema });

export async function updateUser({ id, changes }: { id: number; changes: UpdateUserBody }): Promise<ListedUser> {
  return (await apiRequest('PATCH', `/api/users/${id}`, updateUserResponseSchema, changes)).user;
}

/** Changes a person's name, role or password; the list shows the server's answer. */
export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: (user) => {
      queryClient.setQueryData(usersKeys.list(), (users: ListedUser[] | undefined) => users?.map((u) => (u.id === user.id ? user : u)));
      return queryClient.invalidateQueries({ queryKey: usersKeys.lists() });
    },
  });
}
