import { queryOptions, useQuery } from '@tanstack/react-query';
import { AnswersResponse } from '../../../shared/api/reviewLoop';
import { api } from '../../../lib/api-client';
import { reviewKeys } from './keys';
import { reviewUrls } from './urls';

export async function getAnswers(projectId: string, systemId: string, revisionId: string, signal?: AbortSignal) {
  const { answers } = await api.get(reviewUrls.answers(projectId, systemId, revisionId), AnswersResponse, signal);
  return answers;
}

/** The returned review(s) a revision answers, with the replies and the compare against the returned revision (null when none). */
export const answersQueryOptions = (projectId: string, systemId: string, revisionId: string) =>
  queryOptions({
    queryKey: reviewKeys.answers(projectId, systemId, revisionId),
    queryFn: ({ signal }) => getAnswers(projectId, systemId, revisionId, signal),
  });

export function useAnswers(projectId: string, systemId: string, revisionId: string, enabled = true) {
  return useQuery({ ...answersQueryOptions(projectId, systemId, revisionId), enabled });
}
