import { useMutation, useQueryClient } from '@tanstack/react-query';
import { AttachmentResponse, DEFAULT_UPLOAD_MAX_BYTES, UPLOAD_FIELD } from '../../../shared/api/fieldChanges';
import { api } from '../../../lib/api-client';
import { fieldChangeKeys } from './keys';
import { fieldChangeUrls } from './urls';
import type { FieldChangeIds } from './urls';

/** What the file picker offers; the server decides by the file's content, not by this list. */
export const ATTACHMENT_ACCEPT = 'application/pdf,image/jpeg,image/png,.pdf,.jpg,.jpeg,.png';
export { DEFAULT_UPLOAD_MAX_BYTES };

export async function uploadAttachment({ ids, file }: { ids: FieldChangeIds; file: File }) {
  const form = new FormData();
  form.append(UPLOAD_FIELD, file, file.name);
  return (
    await api.request(fieldChangeUrls.attachments(ids.projectId, ids.systemId, ids.fieldChangeId), { method: 'POST', body: form, schema: AttachmentResponse })
  ).attachment;
}

export async function deleteAttachment({ ids, attachmentId }: { ids: FieldChangeIds; attachmentId: string }) {
  await api.delete(fieldChangeUrls.attachment(ids.projectId, ids.systemId, ids.fieldChangeId, attachmentId));
}

function useRefresh() {
  const queryClient = useQueryClient();
  return (fieldChangeId: string) => {
    // Attachments do not change the field change's version, so the open document stays valid.
    void queryClient.invalidateQueries({ queryKey: fieldChangeKeys.detail(fieldChangeId) });
    void queryClient.invalidateQueries({ queryKey: fieldChangeKeys.lists() });
  };
}

export function useUploadAttachment() {
  const refresh = useRefresh();
  return useMutation({ mutationFn: uploadAttachment, onSuccess: (_a, { ids }) => refresh(ids.fieldChangeId) });
}

export function useDeleteAttachment() {
  const refresh = useRefresh();
  return useMutation({ mutationFn: deleteAttachment, onSuccess: (_r, { ids }) => refresh(ids.fieldChangeId) });
}
