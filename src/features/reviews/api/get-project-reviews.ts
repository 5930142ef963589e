import { queryOptions, useQuery } from '@tanstack/react-query';
import { ReviewsResponse } from '../../../shared/api/summaries';
import { api } from '../../../lib/api-client';
import { reviewKeys } from './keys';
import { reviewUrls } from './urls';

export async function getProjectReviews(projectId: string, signal?: AbortSignal) {
  const { reviews } = await api.get(reviewUrls.project(projectId), ReviewsResponse, signal);
  return reviews;
}

/** Every review across the project's revisions, for the project page. */
export const projectReviewsQueryOptions = (projectId: string) =>
  queryOptions({
    queryKey: reviewKeys.project(projectId),
    queryFn: ({ signal }) => getProjectReviews(projectId, signal),
  });

export function useProjectReviews(projectId: string) {
  return useQuery(projectReviewsQueryOptions(projectId));
}
