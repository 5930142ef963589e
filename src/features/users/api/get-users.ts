import { queryOptions, useQuery } from '@tanstack/react-query';
import { UserListResponse } from '../../../shared/api/users';
import { api } from '../../../lib/api-client';
import { userKeys } from './keys';

export async function getUsers(signal?: AbortSignal) {
  const { users } = await api.get('/api/users', UserListResponse, signal);
  return users;
}

export const usersQueryOptions = () =>
  queryOptions({
    queryKey: userKeys.lists(),
    queryFn: ({ signal }) => getUsers(signal),
  });

export function useUsers() {
  return useQuery(usersQueryOptions());
}
