/** Query keys of the summaries feature; every key starts with `summaries`. */
export const summaryKeys = {
  all: ['summaries'] as const,
  summaries: () => [...summaryKeys.all, 'summary'] as const,
  summary: (projectId: string, systemId: string, revisionId: string) => [...summaryKeys.summaries(), projectId, systemId, revisionId] as const,
  messageLists: () => [...summaryKeys.all, 'messages'] as const,
  messages: (projectId: string, systemId: string, revisionId: string) => [...summaryKeys.messageLists(), projectId, systemId, revisionId] as const,
  audits: () => [...summaryKeys.all, 'audit'] as const,
  audit: (projectId: string) => [...summaryKeys.audits(), projectId] as const,
};
