import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { memberKeys } from './keys';
import type { MemberMutationConfig } from './mutation-config';

export function removeMember({ projectId, userId }: { projectId: string; userId: string }) {
  return api.delete(`/api/projects/${encodeURIComponent(projectId)}/members/${encodeURIComponent(userId)}`);
}

export function useRemoveMember(projectId: string, config: MemberMutationConfig = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: string) => removeMember({ projectId, userId }),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: memberKeys.list(projectId) });
      await config.onChanged?.();
    },
  });
}
