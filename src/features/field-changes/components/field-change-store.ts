import { useMemo } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { DraftStore } from '../../walk/draft/use-draft';
import { fieldChangeQueryOptions } from '../api/get-field-change';
import { useUpdateFieldChange } from '../api/update-field-change';
import type { FieldChangeIds } from '../api/urls';

/** A field change as the walk's draft store: the document is saved into the field change (PATCH). */
export function useFieldChangeStore(ids: FieldChangeIds): DraftStore {
  const queryClient = useQueryClient();
  const { mutateAsync: update } = useUpdateFieldChange();
  return useMemo(
    () => ({
      save: async (document, version) => (await update({ ids, body: { document, version } })).version,
      fetchCurrent: () => queryClient.fetchQuery({ ...fieldChangeQueryOptions(ids), staleTime: 0 }),
    }),
    [ids, queryClient, update],
  );
}
