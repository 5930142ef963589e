import { queryOptions, useQuery } from '@tanstack/react-query';
import { SystemListResponse } from '../../../shared/api/systems';
import { api } from '../../../lib/api-client';
import { systemKeys } from './keys';
import { systemUrls } from './urls';

/** The systems of a project, each with its latest revision's verdict. */
export async function getSystems(projectId: string, signal?: AbortSignal) {
  const { systems } = await api.get(systemUrls.list(projectId), SystemListResponse, signal);
  return systems;
}

export const systemsQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: systemKeys.list(projectId), queryFn: ({ signal }) => getSystems(projectId, signal) });

export function useSystems(projectId: string) {
  return useQuery(systemsQueryOptions(projectId));
}
