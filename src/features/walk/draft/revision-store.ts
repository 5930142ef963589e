import { useMemo } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { revisionQueryOptions } from '../../systems/api/get-revision';
import { useSaveDocument } from '../../systems/api/save-document';
import type { DraftStore } from './use-draft';
import type { WalkIds } from './walk-context';

/** A draft revision as the walk's store: saves go to the revision's document. */
export function useRevisionStore(ids: WalkIds): DraftStore {
  const queryClient = useQueryClient();
  const { mutateAsync: sendSave } = useSaveDocument();
  return useMemo(
    () => ({
      save: async (document, version) => (await sendSave({ ...ids, document, version })).version,
      fetchCurrent: () => queryClient.fetchQuery({ ...revisionQueryOptions(ids.projectId, ids.systemId, ids.revisionId), staleTime: 0 }),
    }),
    [ids, queryClient, sendSave],
  );
}
