import { queryOptions, useQuery } from '@tanstack/react-query';
import { ProjectDetailResponse } from '../../../shared/api/projects';
import { api } from '../../../lib/api-client';
import { projectKeys } from './keys';

/** One project and its members; 404 when it does not exist or the person is not a member. */
export function getProject(projectId: string, signal?: AbortSignal) {
  return api.get(`/api/projects/${encodeURIComponent(projectId)}`, ProjectDetailResponse, signal);
}

export const projectQueryOptions = (projectId: string) =>
  queryOptions({
    queryKey: projectKeys.detail(projectId),
    queryFn: ({ signal }) => getProject(projectId, signal),
  });

export function useProject(projectId: string) {
  return useQuery(projectQueryOptions(projectId));
}
