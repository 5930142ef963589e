/** The API addresses of the reviews feature, in one place (ids are encoded). */
const e = encodeURIComponent;

export const reviewUrls = {
  revision: (projectId: string, systemId: string, revisionId: string) =>
    `/api/projects/${e(projectId)}/systems/${e(systemId)}/revisions/${e(revisionId)}/reviews`,
  project: (projectId: string) => `/api/projects/${e(projectId)}/reviews`,
  review: (projectId: string, reviewId: string) => `/api/projects/${e(projectId)}/reviews/${e(reviewId)}`,
  reply: (projectId: string, reviewId: string, commentId: string) => `/api/projects/${e(projectId)}/reviews/${e(reviewId)}/comments/${e(commentId)}/reply`,
  answers: (projectId: string, systemId: string, revisionId: string) =>
    `/api/projects/${e(projectId)}/systems/${e(systemId)}/revisions/${e(revisionId)}/answers`,
};
