import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { listedUserSchema, type ListedUser } from '../../../../shared/schemas/auth.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { usersKeys } from './users-keys.ts';

/** `GET /api/users` (admins only): everyone with an account. */
export const userListResponseSchema = z.object({ users: z.array(listedUserSchema) });

export async function getUsers(signal?: AbortSignal): Promise<ListedUser[]> {
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
