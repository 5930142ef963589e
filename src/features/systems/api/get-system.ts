import { queryOptions, useQuery } from '@tanstack/react-query';
import { SystemDetailResponse } from '../../../shared/api/systems';
import { api } from '../../../lib/api-client';
import { systemKeys } from './keys';
import { systemUrls } from './urls';

/** One system and all its revisions, newest first. */
export function getSystem(projectId: string, systemId: string, signal?: AbortSignal) {
  return api.get(systemUrls.detail(projectId, systemId), SystemDetailResponse, signal);
}

export const systemQueryOptions = (projectId: string, systemId: string) =>
  queryOptions({ queryKey: systemKeys.detail(projectId, systemId), queryFn: ({ signal }) => getSystem(projectId, systemId, signal) });

export function useSystem(projectId: string, systemId: string) {
  return useQuery(systemQueryOptions(projectId, systemId));
}
