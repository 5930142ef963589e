/** Query keys of the field-changes feature; every key starts with `field-changes`. */
export const fieldChangeKeys = {
  all: ['field-changes'] as const,
  lists: () => [...fieldChangeKeys.all, 'list'] as const,
  forProject: (projectId: string, status?: string) => [...fieldChangeKeys.lists(), 'project', projectId, status ?? 'all'] as const,
  forSystem: (projectId: string, systemId: string) => [...fieldChangeKeys.lists(), 'system', projectId, systemId] as const,
  details: () => [...fieldChangeKeys.all, 'detail'] as const,
  detail: (fieldChangeId: string) => [...fieldChangeKeys.details(), fieldChangeId] as const,
  comparison: (fieldChangeId: string) => [...fieldChangeKeys.all, 'comparison', fieldChangeId] as const,
};
