import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ColdSupplyView } from '../../../engine';
import { ApiError } from '../../../lib/api-client';
import { getRevision } from './get-revision';
import { getSystem } from './get-system';
import { systemKeys } from './keys';

/**
 * What a hot system fed from a cold one reads of the cold system: its name and service and its
 * current revision's analysis (the draft, else the current issued revision), as the server reads it
 * (server/services/hotWaterSupply.ts). null when the cold system is not in the project.
 */
export async function getColdSupply(projectId: string, systemId: string, signal?: AbortSignal): Promise<ColdSupplyView | null> {
  let detail;
  try {
    detail = await getSystem(projectId, systemId, signal);
  } catch (e) {
    if (e instanceof ApiError && e.status === 404) return null;
    throw e;
  }
  const current = detail.revisions.find((r) => r.status === 'draft') ?? detail.revisions.find((r) => r.status === 'issued');
  const base = { systemId: detail.system.id, name: detail.system.name, service: detail.system.service };
  if (!current) return { ...base, revision: null };
  const revision = await getRevision(projectId, systemId, current.id, signal);
  return {
    ...base,
    revision: {
      number: revision.number,
      status: revision.status === 'draft' ? 'draft' : 'issued',
      analysis: revision.analysis as NonNullable<ColdSupplyView['revision']>['analysis'],
      document: revision.document,
    },
  };
}

/** Always read afresh when a walk opens or regains focus: the cold system may have changed meanwhile. */
export const coldSupplyQueryOptions = (projectId: string, systemId: string) =>
  queryOptions({
    queryKey: systemKeys.coldSupply(projectId, systemId),
    queryFn: ({ signal }) => getColdSupply(projectId, systemId, signal),
    staleTime: 0,
    refetchOnWindowFocus: true,
  });

export function useColdSupply(projectId: string, systemId: string | undefined) {
  return useQuery({ ...coldSupplyQueryOptions(projectId, systemId ?? ''), enabled: systemId !== undefined && systemId !== '' });
}
