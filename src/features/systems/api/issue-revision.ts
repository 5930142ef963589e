import { useMutation, useQueryClient } from '@tanstack/react-query';
import { IssueBody, RevisionResponse } from '../../../shared/api/systems';
import { api } from '../../../lib/api-client';
import { systemKeys } from './keys';
import { systemUrls } from './urls';

/** The issue form: an optional note (the version comes from the open draft, not from the form). */
export const issueRevisionInputSchema = IssueBody.pick({ note: true });

export type IssueRevisionVariables = { projectId: string; systemId: string; revisionId: string; version: number; note?: string };

export async function issueRevision({ projectId, systemId, revisionId, version, note }: IssueRevisionVariables) {
  const body = note && note.trim() !== '' ? { version, note: note.trim() } : { version };
  const { revision } = await api.post(systemUrls.issue(projectId, systemId, revisionId), body, RevisionResponse);
  return revision;
}

export function useIssueRevision() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: issueRevision,
    onSuccess: (revision, { projectId, systemId, revisionId }) => {
      queryClient.setQueryData(systemKeys.revision(projectId, systemId, revisionId), revision);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: systemKeys.detail(projectId, systemId) }),
        queryClient.invalidateQueries({ queryKey: systemKeys.list(projectId) }),
        // an issued revision supersedes the one issued before it
        queryClient.invalidateQueries({ queryKey: systemKeys.revisions(), refetchType: 'none' }),
      ]);
    },
  });
}
