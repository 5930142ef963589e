import type { QueryClient } from '@tanstack/react-query';
import type { User } from '../../../shared/api/auth';
import { api } from '../../../lib/api-client';
import { authKeys } from './keys';

/**
 * After sign-in, sign-out or accepting an invitation the session is new: its CSRF token and
 * everything cached for the previous person are dropped, so one person never sees another's data.
 */
export function onSessionChanged(queryClient: QueryClient, user: User | null): void {
  api.resetCsrfToken();
  queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== authKeys.all[0] });
  queryClient.setQueryData(authKeys.me(), user);
}
