import { useMutation, useQueryClient } from '@tanstack/react-query';
import { NewDraftBody, RevisionResponse } from '../../../shared/api/systems';
import { api } from '../../../lib/api-client';
import { systemKeys } from './keys';
import { systemUrls } from './urls';

export { NewDraftBody };

export type NewDraftVariables = { projectId: string; systemId: string; fromRevisionId: string };

/** A new draft copied from any revision (a system has at most one draft). */
export async function newDraft({ projectId, systemId, fromRevisionId }: NewDraftVariables) {
  const { revision } = await api.post(systemUrls.revisions(projectId, systemId), { fromRevisionId }, RevisionResponse);
  return revision;
}

export function useNewDraft() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: newDraft,
    onSuccess: (revision, { projectId, systemId }) => {
      queryClient.setQueryData(systemKeys.revision(projectId, systemId, revision.id), revision);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: systemKeys.detail(projectId, systemId) }),
        queryClient.invalidateQueries({ queryKey: systemKeys.list(projectId) }),
      ]);
    },
  });
}
