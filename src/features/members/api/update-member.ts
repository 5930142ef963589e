import { useMutation, useQueryClient } from '@tanstack/react-query';
import { MemberResponse, UpdateMemberBody } from '../../../shared/api/projects';
import { api } from '../../../lib/api-client';
import { memberKeys } from './keys';
import type { MemberMutationConfig } from './mutation-config';

/** The change-role control's schema is the API's own. */
export const updateMemberInputSchema = UpdateMemberBody;
export type UpdateMemberInput = UpdateMemberBody;

export async function updateMember({ projectId, userId, body }: { projectId: string; userId: string; body: UpdateMemberInput }) {
  const path = `/api/projects/${encodeURIComponent(projectId)}/members/${encodeURIComponent(userId)}`;
  const { member } = await api.patch(path, updateMemberInputSchema.parse(body), MemberResponse);
  return member;
}

export function useUpdateMember(projectId: string, config: MemberMutationConfig = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, body }: { userId: string; body: UpdateMemberInput }) => updateMember({ projectId, userId, body }),
    onSettled: async () => {
      await queryClient.invalidateQueries({ queryKey: memberKeys.list(projectId) });
      await config.onChanged?.();
    },
  });
}
