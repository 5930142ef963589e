import { queryOptions, useQuery } from '@tanstack/react-query';
import { ComparisonResponse } from '../../../shared/api/fieldChanges';
import { api } from '../../../lib/api-client';
import { fieldChangeKeys } from './keys';
import { fieldChangeUrls } from './urls';
import type { FieldChangeIds } from './urls';

/** The side by side as the server computes it: two independent engine runs, issued and proposed. */
export async function getComparison({ projectId, systemId, fieldChangeId }: FieldChangeIds, signal?: AbortSignal) {
  return api.get(fieldChangeUrls.comparison(projectId, systemId, fieldChangeId), ComparisonResponse, signal);
}

export const comparisonQueryOptions = (ids: FieldChangeIds) =>
  queryOptions({ queryKey: fieldChangeKeys.comparison(ids.fieldChangeId), queryFn: ({ signal }) => getComparison(ids, signal) });

export function useComparison(ids: FieldChangeIds) {
  return useQuery(comparisonQueryOptions(ids));
}
