import { queryOptions, useQuery } from '@tanstack/react-query';
import { MessagesResponse } from '../../../shared/api/summaries';
import type { MessageInfo } from '../../../shared/api/summaries';
import { api } from '../../../lib/api-client';
import { summaryKeys } from './keys';
import { summaryUrls } from './urls';

/** How often the list is asked again while a message is on its way (the outbox worker polls about as often; common practice for a status list). */
export const MESSAGES_POLL_MS = 2000;

export const isInFlight = (m: Pick<MessageInfo, 'status'>) => m.status === 'queued' || m.status === 'sending';

export async function getMessages(projectId: string, systemId: string, revisionId: string, signal?: AbortSignal) {
  const { messages } = await api.get(summaryUrls.messages(projectId, systemId, revisionId), MessagesResponse, signal);
  return messages;
}

/** The e-mail sent with a revision's summary (designers); asked again while any is queued or sending. */
export const messagesQueryOptions = (projectId: string, systemId: string, revisionId: string) =>
  queryOptions({
    queryKey: summaryKeys.messages(projectId, systemId, revisionId),
    queryFn: ({ signal }) => getMessages(projectId, systemId, revisionId, signal),
    refetchInterval: (query) => (query.state.data?.some(isInFlight) ? MESSAGES_POLL_MS : false),
  });

export function useMessages(projectId: string, systemId: string, revisionId: string, enabled = true) {
  return useQuery({ ...messagesQueryOptions(projectId, systemId, revisionId), enabled });
}
