import { useMutation, useQueryClient } from '@tanstack/react-query';
import { InvitationResponse } from '../../../shared/api/users';
import { api } from '../../../lib/api-client';
import { userKeys } from './keys';

/** A fresh one-time link; the person's earlier links stop working. */
export async function reissueInvitation(userId: string) {
  const { invitation } = await api.post(`/api/users/${encodeURIComponent(userId)}/invitations`, {}, InvitationResponse);
  return invitation;
}

export function useReissueInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: reissueInvitation,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.lists() }),
  });
}
