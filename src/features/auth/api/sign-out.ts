import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { onSessionChanged } from './session-change';

export async function signOut(): Promise<void> {
  await api.post('/api/auth/sign-out');
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    // Signed out on this side too even when the server had already ended the session.
    onSettled: () => onSessionChanged(queryClient, null),
  });
}
