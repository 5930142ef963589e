import { queryOptions, useQuery } from '@tanstack/react-query';
import { ReviewsResponse } from '../../../shared/api/summaries';
import { api } from '../../../lib/api-client';
import { reviewKeys } from './keys';
import { reviewUrls } from './urls';

export async function getRevisionReviews(projectId: string, systemId: string, revisionId: string, signal?: AbortSignal) {
  const { reviews } = await api.get(reviewUrls.revision(projectId, systemId, revisionId), ReviewsResponse, signal);
  return reviews;
}

/** The reviews of one revision: one per inspector it was sent to. */
export const revisionReviewsQueryOptions = (projectId: string, systemId: string, revisionId: string) =>
  queryOptions({
    queryKey: reviewKeys.revision(projectId, systemId, revisionId),
    queryFn: ({ signal }) => getRevisionReviews(projectId, systemId, revisionId, signal),
  });

export function useRevisionReviews(projectId: string, systemId: string, revisionId: string, enabled = true) {
  return useQuery({ ...revisionReviewsQueryOptions(projectId, systemId, revisionId), enabled });
}
