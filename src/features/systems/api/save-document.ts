import { useMutation, useQueryClient } from '@tanstack/react-query';
import { RevisionResponse, SaveDocumentBody } from '../../../shared/api/systems';
import type { SystemDocument } from '../../../engine';
import { api } from '../../../lib/api-client';
import { systemKeys } from './keys';
import { systemUrls } from './urls';

export { SaveDocumentBody };

export type SaveDocumentVariables = {
  projectId: string;
  systemId: string;
  revisionId: string;
  document: SystemDocument;
  /** the version the draft was opened (or last saved) at: a save over someone else's answers 409 */
  version: number;
};

export async function saveDocument({ projectId, systemId, revisionId, document, version }: SaveDocumentVariables) {
  const { revision } = await api.request(systemUrls.document(projectId, systemId, revisionId), {
    method: 'PUT',
    body: { document, version },
    schema: RevisionResponse,
  });
  return revision;
}

export function useSaveDocument() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveDocument,
    onSuccess: (revision, { projectId, systemId, revisionId }) => {
      queryClient.setQueryData(systemKeys.revision(projectId, systemId, revisionId), revision);
      void queryClient.invalidateQueries({ queryKey: systemKeys.detail(projectId, systemId) });
      void queryClient.invalidateQueries({ queryKey: systemKeys.list(projectId) });
    },
  });
}
