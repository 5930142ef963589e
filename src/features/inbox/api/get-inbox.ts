import { queryOptions, useQuery } from '@tanstack/react-query';
import { InboxResponse } from '../../../shared/api/summaries';
import type { InboxItem } from '../../../shared/api/summaries';
import { api } from '../../../lib/api-client';
import { inboxKeys } from './keys';

/** How often the nav link's count is refreshed while a page is open (a minute: new summaries are not urgent to the second; common practice). */
export const INBOX_REFRESH_MS = 60_000;

export async function getInbox(signal?: AbortSignal) {
  const { items } = await api.get('/api/inbox', InboxResponse, signal);
  return items;
}

export const inboxQueryOptions = () =>
  queryOptions({
    queryKey: inboxKeys.list(),
    queryFn: ({ signal }) => getInbox(signal),
    refetchInterval: INBOX_REFRESH_MS,
  });

export function useInbox() {
  return useQuery(inboxQueryOptions());
}

/** Received and not yet decided, on a revision that is still the issued one (a superseded revision can no longer be decided). */
export function isAwaitingDecision(item: InboxItem): boolean {
  return item.review.status === 'received' && item.review.revisionStatus === 'issued';
}
