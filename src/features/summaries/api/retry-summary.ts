import { useMutation, useQueryClient } from '@tanstack/react-query';
import { SummaryResponse } from '../../../shared/api/summaries';
import { api } from '../../../lib/api-client';
import { summaryKeys } from './keys';
import { summaryUrls } from './urls';

export type RetrySummaryVariables = { projectId: string; systemId: string; revisionId: string };

/** Makes a failed summary's PDF again (designers; a ready one is never made again). */
export async function retrySummary({ projectId, systemId, revisionId }: RetrySummaryVariables) {
  const { summary } = await api.post(summaryUrls.retry(projectId, systemId, revisionId), undefined, SummaryResponse);
  return summary;
}

export function useRetrySummary() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: retrySummary,
    onSuccess: (summary, { projectId, systemId, revisionId }) => {
      queryClient.setQueryData(summaryKeys.summary(projectId, systemId, revisionId), summary);
    },
  });
}
