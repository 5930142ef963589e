import { queryOptions, useQuery } from '@tanstack/react-query';
import { RevisionResponse } from '../../../shared/api/systems';
import { api } from '../../../lib/api-client';
import { systemKeys } from './keys';
import { systemUrls } from './urls';

export async function getRevision(projectId: string, systemId: string, revisionId: string, signal?: AbortSignal) {
  const { revision } = await api.get(systemUrls.revision(projectId, systemId, revisionId), RevisionResponse, signal);
  return revision;
}

/**
 * A revision with its document. The walk edits a copy of the document taken when it opened, so
 * a background refetch must not replace it: this query is never refetched by itself.
 */
export const revisionQueryOptions = (projectId: string, systemId: string, revisionId: string) =>
  queryOptions({
    queryKey: systemKeys.revision(projectId, systemId, revisionId),
    queryFn: ({ signal }) => getRevision(projectId, systemId, revisionId, signal),
    staleTime: Infinity,
    refetchOnWindowFocus: false,
  });

export function useRevision(projectId: string, systemId: string, revisionId: string) {
  // an id not known yet (it comes from another query) waits instead of asking for nothing
  return useQuery({ ...revisionQueryOptions(projectId, systemId, revisionId), enabled: revisionId !== '' });
}
