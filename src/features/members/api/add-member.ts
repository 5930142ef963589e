import { useMutation, useQueryClient } from '@tanstack/react-query';
import { AddMemberBody, MemberResponse } from '../../../shared/api/projects';
import { api } from '../../../lib/api-client';
import { memberKeys } from './keys';
import type { MemberMutationConfig } from './mutation-config';

/** The add-member form's schema is the API's own. */
export const addMemberInputSchema = AddMemberBody;
export type AddMemberInput = AddMemberBody;

export async function addMember({ projectId, body }: { projectId: string; body: AddMemberInput }) {
  const { member } = await api.post(`/api/projects/${encodeURIComponent(projectId)}/members`, body, MemberResponse);
  return member;
}

export function useAddMember(projectId: string, config: MemberMutationConfig = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: AddMemberInput) => addMember({ projectId, body }),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: memberKeys.list(projectId) });
      await config.onChanged?.();
    },
  });
}
