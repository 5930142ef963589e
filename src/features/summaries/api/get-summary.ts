import { queryOptions, useQuery } from '@tanstack/react-query';
import { SummaryResponse } from '../../../shared/api/summaries';
import { api } from '../../../lib/api-client';
import { summaryKeys } from './keys';
import { summaryUrls } from './urls';

/** How often a pending summary is asked about again: a PDF is meant to take under 300 ms even for 200 segments (issue 5's aim), so a second is rarely waited twice. */
export const SUMMARY_POLL_MS = 1000;

export async function getSummary(projectId: string, systemId: string, revisionId: string, signal?: AbortSignal) {
  const { summary } = await api.get(summaryUrls.summary(projectId, systemId, revisionId), SummaryResponse, signal);
  return summary;
}

/** An issued revision's summary; asked again every second while it is still being made. */
export const summaryQueryOptions = (projectId: string, systemId: string, revisionId: string) =>
  queryOptions({
    queryKey: summaryKeys.summary(projectId, systemId, revisionId),
    queryFn: ({ signal }) => getSummary(projectId, systemId, revisionId, signal),
    refetchInterval: (query) => (query.state.data?.status === 'pending' ? SUMMARY_POLL_MS : false),
  });

export function useSummary(projectId: string, systemId: string, revisionId: string, enabled = true) {
  return useQuery({ ...summaryQueryOptions(projectId, systemId, revisionId), enabled });
}
