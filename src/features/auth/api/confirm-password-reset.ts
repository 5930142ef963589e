import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { PasswordResetConfirmBody, PasswordResetDoneResponse } from '../../../shared/api/auth';
import { api } from '../../../lib/api-client';
import { authKeys } from './keys';

/** The API's password rule plus a second entry of it, checked here only (the token comes from the link). */
export const confirmPasswordResetInputSchema = PasswordResetConfirmBody.pick({ password: true })
  .extend({ confirmPassword: z.string() })
  .refine((value) => value.password === value.confirmPassword, {
    path: ['confirmPassword'],
    message: 'The two passwords are not the same',
  });
export type ConfirmPasswordResetInput = z.infer<typeof confirmPasswordResetInputSchema>;

export async function confirmPasswordReset({ token, password }: { token: string; password: string }) {
  const body: PasswordResetConfirmBody = { token, password };
  const { message } = await api.post('/api/auth/password-reset/confirm', body, PasswordResetDoneResponse);
  return message;
}

export function useConfirmPasswordReset() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: confirmPasswordReset,
    // the server ended every session of the account: if this browser had one, it is gone with its CSRF token
    onSuccess: () => {
      api.resetCsrfToken();
      return queryClient.invalidateQueries({ queryKey: authKeys.me() });
    },
  });
}
