import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FieldChangeResponse, UpdateFieldChangeBody } from '../../../shared/api/fieldChanges';
import { api } from '../../../lib/api-client';
import { fieldChangeKeys } from './keys';
import { fieldChangeUrls } from './urls';
import type { FieldChangeIds } from './urls';

export { UpdateFieldChangeBody };

/** Saves the title, the description or the document (each write names the version it was made on). */
export async function updateFieldChange({ ids, body }: { ids: FieldChangeIds; body: UpdateFieldChangeBody }) {
  return (await api.patch(fieldChangeUrls.one(ids.projectId, ids.systemId, ids.fieldChangeId), body, FieldChangeResponse)).fieldChange;
}

export function useUpdateFieldChange() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateFieldChange,
    onSuccess: (fieldChange) => {
      queryClient.setQueryData(fieldChangeKeys.detail(fieldChange.id), fieldChange);
      void queryClient.invalidateQueries({ queryKey: fieldChangeKeys.comparison(fieldChange.id) });
      void queryClient.invalidateQueries({ queryKey: fieldChangeKeys.lists() });
    },
  });
}
