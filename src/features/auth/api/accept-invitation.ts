import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { AcceptInvitationBody, MeResponse } from '../../../shared/api/auth';
import { api } from '../../../lib/api-client';
import { onSessionChanged } from './session-change';

/** The API's body plus a second entry of the password, checked here only. */
export const acceptInvitationInputSchema = AcceptInvitationBody.extend({
  confirmPassword: z.string(),
}).refine((value) => value.password === value.confirmPassword, {
  path: ['confirmPassword'],
  message: 'The two passwords are not the same',
});
export type AcceptInvitationInput = z.infer<typeof acceptInvitationInputSchema>;

export async function acceptInvitation({ token, password }: { token: string; password: string }) {
  const body: AcceptInvitationBody = { password };
  const { user } = await api.post(`/api/invitations/${encodeURIComponent(token)}`, body, MeResponse);
  return user;
}

export function useAcceptInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptInvitation,
    onSuccess: (user) => onSessionChanged(queryClient, user),
  });
}
