import { queryOptions, useQuery } from '@tanstack/react-query';
import { FieldChangeResponse } from '../../../shared/api/fieldChanges';
import { api } from '../../../lib/api-client';
import { fieldChangeKeys } from './keys';
import { fieldChangeUrls } from './urls';
import type { FieldChangeIds } from './urls';

export async function getFieldChange({ projectId, systemId, fieldChangeId }: FieldChangeIds, signal?: AbortSignal) {
  return (await api.get(fieldChangeUrls.one(projectId, systemId, fieldChangeId), FieldChangeResponse, signal)).fieldChange;
}

/**
 * One field change with its document. Like a revision in the walk, the open frame edits a copy of
 * the document, so a background refetch must not replace it under the person editing.
 */
export const fieldChangeQueryOptions = (ids: FieldChangeIds) =>
  queryOptions({
    queryKey: fieldChangeKeys.detail(ids.fieldChangeId),
    queryFn: ({ signal }) => getFieldChange(ids, signal),
    staleTime: Infinity,
    refetchOnWindowFocus: false,
  });

export function useFieldChange(ids: FieldChangeIds) {
  return useQuery(fieldChangeQueryOptions(ids));
}
