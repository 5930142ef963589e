/** The API addresses of the summaries feature, in one place (ids are encoded). */
const e = encodeURIComponent;
const revision = (projectId: string, systemId: string, revisionId: string) => `/api/projects/${e(projectId)}/systems/${e(systemId)}/revisions/${e(revisionId)}`;

export const summaryUrls = {
  summary: (projectId: string, systemId: string, revisionId: string) => `${revision(projectId, systemId, revisionId)}/summary`,
  pdf: (projectId: string, systemId: string, revisionId: string) => `${revision(projectId, systemId, revisionId)}/summary.pdf`,
  retry: (projectId: string, systemId: string, revisionId: string) => `${revision(projectId, systemId, revisionId)}/summary/retry`,
  send: (projectId: string, systemId: string, revisionId: string) => `${revision(projectId, systemId, revisionId)}/summary/send`,
  messages: (projectId: string, systemId: string, revisionId: string) => `${revision(projectId, systemId, revisionId)}/messages`,
  retryMessage: (projectId: string, messageId: string) => `/api/projects/${e(projectId)}/messages/${e(messageId)}/retry`,
  audit: (projectId: string, before?: number, limit?: number) => {
    const query = new URLSearchParams();
    if (before !== undefined) query.set('before', String(before));
    if (limit !== undefined) query.set('limit', String(limit));
    const text = query.toString();
    return `/api/projects/${e(projectId)}/audit${text ? `?${text}` : ''}`;
  },
};
