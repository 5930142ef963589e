import { queryOptions, useQuery } from '@tanstack/react-query';
import { CompareResponse } from '../../../shared/api/systems';
import { api } from '../../../lib/api-client';
import { systemKeys } from './keys';
import { systemUrls } from './urls';

/** Two revisions side by side: every checked fixture's margin in A and B, and the segments that changed. */
export function compareRevisions(projectId: string, systemId: string, a: string, b: string, signal?: AbortSignal) {
  return api.get(systemUrls.compare(projectId, systemId, a, b), CompareResponse, signal);
}

export const compareQueryOptions = (projectId: string, systemId: string, a: string, b: string) =>
  queryOptions({ queryKey: systemKeys.compare(projectId, systemId, a, b), queryFn: ({ signal }) => compareRevisions(projectId, systemId, a, b, signal) });

export function useCompareRevisions(projectId: string, systemId: string, a: string, b: string) {
  return useQuery({ ...compareQueryOptions(projectId, systemId, a, b), enabled: a !== '' && b !== '' });
}
