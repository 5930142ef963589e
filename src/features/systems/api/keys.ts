/** Query keys of the systems feature; every key starts with `systems`. */
export const systemKeys = {
  all: ['systems'] as const,
  lists: () => [...systemKeys.all, 'list'] as const,
  list: (projectId: string) => [...systemKeys.lists(), projectId] as const,
  details: () => [...systemKeys.all, 'detail'] as const,
  detail: (projectId: string, systemId: string) => [...systemKeys.details(), projectId, systemId] as const,
  revisions: () => [...systemKeys.all, 'revision'] as const,
  revision: (projectId: string, systemId: string, revisionId: string) => [...systemKeys.revisions(), projectId, systemId, revisionId] as const,
  comparisons: () => [...systemKeys.all, 'compare'] as const,
  compare: (projectId: string, systemId: string, a: string, b: string) => [...systemKeys.comparisons(), projectId, systemId, a, b] as const,
  catalog: () => [...systemKeys.all, 'catalog'] as const,
  /** what a hot system fed from a cold one reads of it (get-cold-supply.ts) */
  coldSupply: (projectId: string, systemId: string) => [...systemKeys.all, 'cold-supply', projectId, systemId] as const,
};
