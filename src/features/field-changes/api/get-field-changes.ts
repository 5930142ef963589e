import { queryOptions, useQuery } from '@tanstack/react-query';
import { FieldChangeListResponse } from '../../../shared/api/fieldChanges';
import type { FieldChangeStatus } from '../../../shared/api/fieldChanges';
import { api } from '../../../lib/api-client';
import { fieldChangeKeys } from './keys';
import { fieldChangeUrls } from './urls';

export async function getSystemFieldChanges(projectId: string, systemId: string, signal?: AbortSignal) {
  return (await api.get(fieldChangeUrls.forSystem(projectId, systemId), FieldChangeListResponse, signal)).fieldChanges;
}

export async function getProjectFieldChanges(projectId: string, status?: FieldChangeStatus, signal?: AbortSignal) {
  return (await api.get(fieldChangeUrls.forProject(projectId, status), FieldChangeListResponse, signal)).fieldChanges;
}

export const systemFieldChangesQueryOptions = (projectId: string, systemId: string) =>
  queryOptions({ queryKey: fieldChangeKeys.forSystem(projectId, systemId), queryFn: ({ signal }) => getSystemFieldChanges(projectId, systemId, signal) });

export const projectFieldChangesQueryOptions = (projectId: string, status?: FieldChangeStatus) =>
  queryOptions({ queryKey: fieldChangeKeys.forProject(projectId, status), queryFn: ({ signal }) => getProjectFieldChanges(projectId, status, signal) });

export function useSystemFieldChanges(projectId: string, systemId: string) {
  return useQuery(systemFieldChangesQueryOptions(projectId, systemId));
}

export function useProjectFieldChanges(projectId: string, status?: FieldChangeStatus) {
  return useQuery(projectFieldChangesQueryOptions(projectId, status));
}
