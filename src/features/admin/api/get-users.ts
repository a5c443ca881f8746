import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { userSchema, type User } from '../../../../shared/schemas/auth.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { usersKeys } from './users-keys.ts';

/** `GET /api/users` (admins only): everyone with an account. */
export const userListResponseSchema = z.object({ users: z.array(userSchema) });

export async function getUsers(signal?: AbortSignal): Promise<User[]> {
  return (await apiGet('/api/users', userListResponseSchema, { signal })).users;
}

export const userListQueryOptions = () =>
  queryOptions({
    queryKey: usersKeys.list(),
    queryFn: ({ signal }) => getUsers(signal),
  });

export function useUsers() {
  return useQuery(userListQueryOptions());
}
