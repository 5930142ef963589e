import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { DevMailListResponse } from '../../../shared/api/summaries';
import { api } from '../../../lib/api-client';
import { devMailKeys } from './keys';

/** The newest messages the local SMTP sink caught (the API's default page is 100). */
export const DEV_MAIL_LIMIT = 100;

export async function getDevMail(to: string, signal?: AbortSignal) {
  const query = new URLSearchParams({ limit: String(DEV_MAIL_LIMIT) });
  if (to.trim() !== '') query.set('to', to.trim());
  const { messages } = await api.get(`/api/dev/mail?${query.toString()}`, DevMailListResponse, signal);
  return messages;
}

/** Administrators, and only when the server runs with HEADROOM_DEV_MAIL=1 (else the API answers 404). */
export const devMailQueryOptions = (to: string) =>
  queryOptions({
    queryKey: devMailKeys.list(to.trim().toLowerCase()),
    queryFn: ({ signal }) => getDevMail(to, signal),
    placeholderData: keepPreviousData,
  });

export function useDevMail(to: string) {
  return useQuery(devMailQueryOptions(to));
}
