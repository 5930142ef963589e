import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { ProjectCatalogEntryResponse, type CatalogKind, type CreateCatalogEntryBody, type UpdateCatalogEntryBody } from '../../../shared/api/catalog';
import { catalogKeys } from './keys';
import { catalogUrls } from './urls';

export async function addCatalogEntry(projectId: string, body: CreateCatalogEntryBody) {
  return (await api.post(catalogUrls.entries(projectId), body, ProjectCatalogEntryResponse)).entry;
}

export async function updateCatalogEntry(projectId: string, kind: CatalogKind, entryId: string, body: UpdateCatalogEntryBody) {
  return (await api.patch(catalogUrls.entry(projectId, kind, entryId), body, ProjectCatalogEntryResponse)).entry;
}

export async function removeCatalogEntry(projectId: string, kind: CatalogKind, entryId: string) {
  await api.delete(catalogUrls.entry(projectId, kind, entryId));
}

function useInvalidate(projectId: string) {
  const queryClient = useQueryClient();
  return () => queryClient.invalidateQueries({ queryKey: catalogKeys.project(projectId) });
}

export function useAddCatalogEntry(projectId: string) {
  const invalidate = useInvalidate(projectId);
  return useMutation({ mutationFn: (body: CreateCatalogEntryBody) => addCatalogEntry(projectId, body), onSuccess: invalidate });
}

export function useUpdateCatalogEntry(projectId: string) {
  const invalidate = useInvalidate(projectId);
  return useMutation({
    mutationFn: (v: { kind: CatalogKind; entryId: string; body: UpdateCatalogEntryBody }) => updateCatalogEntry(projectId, v.kind, v.entryId, v.body),
    // a 409 means someone else changed it: the list is fetched again either way
    onSettled: invalidate,
  });
}

export function useRemoveCatalogEntry(projectId: string) {
  const invalidate = useInvalidate(projectId);
  return useMutation({ mutationFn: (v: { kind: CatalogKind; entryId: string }) => removeCatalogEntry(projectId, v.kind, v.entryId), onSettled: invalidate });
}
