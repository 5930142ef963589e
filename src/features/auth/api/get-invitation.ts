import { queryOptions, useQuery } from '@tanstack/react-query';
import { InvitationInfo } from '../../../shared/api/auth';
import { api } from '../../../lib/api-client';
import { authKeys } from './keys';

export function getInvitation(token: string, signal?: AbortSignal) {
  return api.get(`/api/invitations/${encodeURIComponent(token)}`, InvitationInfo, signal);
}

export const invitationQueryOptions = (token: string) =>
  queryOptions({
    queryKey: authKeys.invitation(token),
    queryFn: ({ signal }) => getInvitation(token, signal),
    staleTime: Infinity,
  });

export function useInvitation(token: string) {
  return useQuery(invitationQueryOptions(token));
}
