import { queryOptions, useQuery } from '@tanstack/react-query';
import { ProjectListResponse } from '../../../shared/api/projects';
import { api } from '../../../lib/api-client';
import { projectKeys } from './keys';

export async function getProjects(signal?: AbortSignal) {
  const { projects } = await api.get('/api/projects', ProjectListResponse, signal);
  return projects;
}

export const projectsQueryOptions = () =>
  queryOptions({
    queryKey: projectKeys.lists(),
    queryFn: ({ signal }) => getProjects(signal),
  });

export function useProjects() {
  return useQuery(projectsQueryOptions());
}
