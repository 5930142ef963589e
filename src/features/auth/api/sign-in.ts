import { useMutation, useQueryClient } from '@tanstack/react-query';
import { MeResponse, SignInBody } from '../../../shared/api/auth';
import { api } from '../../../lib/api-client';
import { onSessionChanged } from './session-change';

/** The sign-in form's schema is the API's own. */
export const signInInputSchema = SignInBody;
export type SignInInput = SignInBody;

export async function signIn(input: SignInInput) {
  const { user } = await api.post('/api/auth/sign-in', input, MeResponse);
  return user;
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (user) => onSessionChanged(queryClient, user),
  });
}
