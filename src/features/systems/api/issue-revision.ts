import { useMutation, useQueryClient } from '@tanstack/react-query';
import { IssueBody, RevisionResponse, type Attestation } from '../../../shared/api/systems';
import { api, isApiError } from '../../../lib/api-client';
import { systemKeys } from './keys';
import { systemUrls } from './urls';

/** The issue form: an optional note (the version comes from the open draft, not from the form). */
export const issueRevisionInputSchema = IssueBody.pick({ note: true });

export type IssueRevisionVariables = {
  projectId: string;
  systemId: string;
  revisionId: string;
  version: number;
  note?: string;
  /** the preparer's attestation, confirmed in the issue dialog (required by the server) */
  attestation: Attestation;
  /** a failing revision is issued only with the designer's recorded statement (the server answers 409 without it) */
  acknowledgeFailure?: { statement: string };
};

export async function issueRevision({ projectId, systemId, revisionId, version, note, attestation, acknowledgeFailure }: IssueRevisionVariables) {
  const body = {
    version,
    attestation,
    ...(note && note.trim() !== '' ? { note: note.trim() } : {}),
    ...(acknowledgeFailure ? { acknowledgeFailure: { statement: acknowledgeFailure.statement.trim() } } : {}),
  };
  const { revision } = await api.post(systemUrls.issue(projectId, systemId, revisionId), body, RevisionResponse);
  return revision;
}

/** The reasons a 409 REVISION_INCOMPLETE names (each `{ message }`, or a plain string), in order. */
export function incompleteReasonsOf(error: unknown): string[] {
  if (!isApiError(error) || error.code !== 'REVISION_INCOMPLETE') return [];
  const reasons = error.raw.reasons ?? (error.raw.details as { reasons?: unknown } | undefined)?.reasons;
  if (!Array.isArray(reasons)) return [];
  return reasons
    .map((r: unknown) =>
      typeof r === 'string'
        ? r
        : r && typeof r === 'object' && typeof (r as { message?: unknown }).message === 'string'
          ? (r as { message: string }).message
          : null,
    )
    .filter((m): m is string => m !== null);
}

export function useIssueRevision() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: issueRevision,
    onSuccess: (revision, { projectId, systemId, revisionId }) => {
      queryClient.setQueryData(systemKeys.revision(projectId, systemId, revisionId), revision);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: systemKeys.detail(projectId, systemId) }),
        queryClient.invalidateQueries({ queryKey: systemKeys.list(projectId) }),
        // an issued revision supersedes the one issued before it
        queryClient.invalidateQueries({ queryKey: systemKeys.revisions(), refetchType: 'none' }),
      ]);
    },
  });
}
