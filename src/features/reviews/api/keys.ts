/** Query keys of the reviews feature; every key starts with `reviews`. */
export const reviewKeys = {
  all: ['reviews'] as const,
  revisions: () => [...reviewKeys.all, 'revision'] as const,
  revision: (projectId: string, systemId: string, revisionId: string) => [...reviewKeys.revisions(), projectId, systemId, revisionId] as const,
  projects: () => [...reviewKeys.all, 'project'] as const,
  project: (projectId: string) => [...reviewKeys.projects(), projectId] as const,
  answers: (projectId: string, systemId: string, revisionId: string) => [...reviewKeys.all, 'answers', projectId, systemId, revisionId] as const,
};
