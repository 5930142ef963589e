import { queryOptions, useQuery } from '@tanstack/react-query';
import { MemberListResponse } from '../../../shared/api/projects';
import { api } from '../../../lib/api-client';
import { memberKeys } from './keys';

export async function getMembers(projectId: string, signal?: AbortSignal) {
  const { members } = await api.get(`/api/projects/${encodeURIComponent(projectId)}/members`, MemberListResponse, signal);
  return members;
}

export const membersQueryOptions = (projectId: string) =>
  queryOptions({
    queryKey: memberKeys.list(projectId),
    queryFn: ({ signal }) => getMembers(projectId, signal),
  });

export function useMembers(projectId: string) {
  return useQuery(membersQueryOptions(projectId));
}
