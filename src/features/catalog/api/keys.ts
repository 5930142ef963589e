/** Query keys of the catalog feature; every key starts with `catalog`. */
export const catalogKeys = {
  all: ['catalog'] as const,
  projects: () => [...catalogKeys.all, 'project'] as const,
  project: (projectId: string) => [...catalogKeys.projects(), projectId] as const,
};
