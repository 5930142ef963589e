import { useMutation, useQueryClient } from '@tanstack/react-query';
import { SaveDocumentBody, SaveDocumentResponse, type Revision } from '../../../shared/api/systems';
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

/** Saves a draft's document; answers the revision's summary (its new version and verdict), not its analysis. */
export async function saveDocument({ projectId, systemId, revisionId, document, version }: SaveDocumentVariables) {
  const { revision } = await api.request(systemUrls.document(projectId, systemId, revisionId), {
    method: 'PUT',
    body: { document, version },
    schema: SaveDocumentResponse,
  });
  return revision;
}

export function useSaveDocument() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveDocument,
    onSuccess: (summary, { projectId, systemId, revisionId, document }) => {
      const key = systemKeys.revision(projectId, systemId, revisionId);
      // the cached revision takes the saved document, the new version and verdict at once, as the
      // whole answer did before; its `analysis` stays the one read with it: no screen reads a
      // draft's stored analysis (the walk analyses the document itself), and a fresh GET has it
      queryClient.setQueryData<Revision>(key, (cached) => (cached ? { ...cached, ...summary, document } : cached));
      void queryClient.invalidateQueries({ queryKey: systemKeys.detail(projectId, systemId) });
      void queryClient.invalidateQueries({ queryKey: systemKeys.list(projectId) });
    },
  });
}
