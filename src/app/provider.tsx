import type { ReactNode } from 'react';
import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { authKeys } from '../features/auth/api/keys';
import { createQueryClient } from '../lib/query-client';

/** The app's one query client. A 401 from any query means the session ended: forget the person, and the signed-in layout sends them to sign-in (and back here after). */
export function createAppQueryClient() {
  const client = createQueryClient(() => client.setQueryData(authKeys.me(), null));
  return client;
}

export function AppProvider({ queryClient, children }: { queryClient: QueryClient; children: ReactNode }) {
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
