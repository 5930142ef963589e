import { useMutation, useQueryClient } from '@tanstack/react-query';
import { CreateFieldChangeBody, FieldChangeResponse } from '../../../shared/api/fieldChanges';
import { api } from '../../../lib/api-client';
import { fieldChangeKeys } from './keys';
import { fieldChangeUrls } from './urls';

export { CreateFieldChangeBody };

export type CreateFieldChangeVariables = { projectId: string; systemId: string; body: CreateFieldChangeBody };

export async function createFieldChange({ projectId, systemId, body }: CreateFieldChangeVariables) {
  return (await api.post(fieldChangeUrls.forSystem(projectId, systemId), body, FieldChangeResponse)).fieldChange;
}

export function useCreateFieldChange() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createFieldChange,
    onSuccess: (fieldChange) => {
      queryClient.setQueryData(fieldChangeKeys.detail(fieldChange.id), fieldChange);
      void queryClient.invalidateQueries({ queryKey: fieldChangeKeys.lists() });
    },
  });
}
