import { useState } from 'react';
import type { ReactNode } from 'react';
import { QueryClientProvider } from '@tanstack/react-query';
import { authKeys } from '../features/auth/api/keys';
import { createQueryClient } from '../lib/query-client';

export function AppProvider({ children }: { children: ReactNode }) {
  const [queryClient] = useState(() => {
    // A 401 from any query means the session ended: forget the person, and the signed-in
    // layout sends them to sign-in (and back here after).
    const client = createQueryClient(() => client.setQueryData(authKeys.me(), null));
    return client;
  });
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
