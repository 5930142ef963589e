import { queryOptions, useQuery } from '@tanstack/react-query';
import { MeResponse } from '../../../shared/api/auth';
import type { User } from '../../../shared/api/auth';
import { api, isApiError } from '../../../lib/api-client';
import { authKeys } from './keys';

/** The signed-in person, or null when nobody is signed in (401 is an answer here, not a failure). */
export async function getMe(signal?: AbortSignal): Promise<User | null> {
  try {
    const { user } = await api.get('/api/auth/me', MeResponse, signal);
    return user;
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}

export const meQueryOptions = () =>
  queryOptions({
    queryKey: authKeys.me(),
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 5 * 60_000,
  });

export function useMe() {
  return useQuery(meQueryOptions());
}
