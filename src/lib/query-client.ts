import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from './api-client';

/**
 * Retries only what may succeed on a second try: network failures and 5xx answers, twice.
 * A 4xx answer (not signed in, forbidden, not found, stale) will not change by asking again.
 */
export function shouldRetry(failureCount: number, error: unknown): boolean {
  if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
  return failureCount < 2;
}

/** A 401 from any query or mutation means the session ended (expired, or signed out elsewhere). */
export function createQueryClient(onSignedOut: () => void): QueryClient {
  const onError = (error: unknown) => {
    if (isApiError(error) && error.code === 'NOT_SIGNED_IN') onSignedOut();
  };
  return new QueryClient({
    queryCache: new QueryCache({ onError }),
    mutationCache: new MutationCache({ onError }),
    defaultOptions: {
      queries: { retry: shouldRetry, staleTime: 30_000, refetchOnWindowFocus: true },
      mutations: { retry: false },
    },
  });
}
