import { useMutation } from '@tanstack/react-query';
import { PasswordResetRequestBody, PasswordResetRequestedResponse } from '../../../shared/api/auth';
import { api } from '../../../lib/api-client';

/** The form's schema is the API's own. */
export const requestPasswordResetInputSchema = PasswordResetRequestBody;
export type RequestPasswordResetInput = PasswordResetRequestBody;

/** Always answers the same message, whether or not the address has an account. */
export async function requestPasswordReset(input: RequestPasswordResetInput) {
  const { message } = await api.post('/api/auth/password-reset', input, PasswordResetRequestedResponse);
  return message;
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
