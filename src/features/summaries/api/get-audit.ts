import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import { AuditResponse } from '../../../shared/api/summaries';
import { api } from '../../../lib/api-client';
import { summaryKeys } from './keys';
import { summaryUrls } from './urls';

/** Entries per page of the audit log (the API allows up to 500; 50 fit a screen or two). */
export const AUDIT_PAGE_SIZE = 50;

export function getAudit(projectId: string, before: number | undefined, signal?: AbortSignal) {
  return api.get(summaryUrls.audit(projectId, before, AUDIT_PAGE_SIZE), AuditResponse, signal);
}

/** The project's audit log, newest first, a page at a time (designers). */
export const auditQueryOptions = (projectId: string) =>
  infiniteQueryOptions({
    queryKey: summaryKeys.audit(projectId),
    queryFn: ({ signal, pageParam }) => getAudit(projectId, pageParam, signal),
    initialPageParam: undefined as number | undefined,
    getNextPageParam: (last) => last.nextBefore ?? undefined,
  });

export function useAudit(projectId: string) {
  return useInfiniteQuery(auditQueryOptions(projectId));
}
