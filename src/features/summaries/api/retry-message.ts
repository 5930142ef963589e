import { useMutation, useQueryClient } from '@tanstack/react-query';
import { MessageResponse } from '../../../shared/api/summaries';
import { api } from '../../../lib/api-client';
import { summaryKeys } from './keys';
import { summaryUrls } from './urls';

export type RetryMessageVariables = { projectId: string; messageId: string };

/** Puts a failed message back in the outbox (designers). */
export async function retryMessage({ projectId, messageId }: RetryMessageVariables) {
  const { message } = await api.post(summaryUrls.retryMessage(projectId, messageId), undefined, MessageResponse);
  return message;
}

export function useRetryMessage() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: retryMessage,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: summaryKeys.messageLists() }),
  });
}
