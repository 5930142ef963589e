import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { ProjectCatalogResponse, type CatalogKind, type ProjectCatalogEntry, type ProjectEntryOf } from '../../../shared/api/catalog';
import { catalogKeys } from './keys';
import { catalogUrls } from './urls';

export interface ProjectCatalog {
  entries: ProjectCatalogEntry[];
  of: <K extends CatalogKind>(kind: K) => ProjectEntryOf<K>[];
  find: <K extends CatalogKind>(kind: K, id: string | null | undefined) => ProjectEntryOf<K> | undefined;
}

export function indexProjectCatalog(entries: ProjectCatalogEntry[]): ProjectCatalog {
  const of = <K extends CatalogKind>(kind: K) => entries.filter((e): e is ProjectEntryOf<K> => e.kind === kind);
  return { entries, of, find: (kind, id) => (id ? of(kind).find((e) => e.id === id) : undefined) };
}

/** The project's own catalog entries (the seeded ones come with the answer too; the walk reads those from /api/catalog). */
export async function getProjectCatalog(projectId: string, signal?: AbortSignal): Promise<ProjectCatalog> {
  const { projectEntries } = await api.get(catalogUrls.project(projectId), ProjectCatalogResponse, signal);
  return indexProjectCatalog(projectEntries);
}

export const projectCatalogQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: catalogKeys.project(projectId), queryFn: ({ signal }) => getProjectCatalog(projectId, signal), staleTime: 60_000 });

export function useProjectCatalog(projectId: string) {
  return useQuery(projectCatalogQueryOptions(projectId));
}

const EMPTY = indexProjectCatalog([]);
/** The project's entries for a picker: empty until loaded (or when loading fails), so the seeded entries always work. */
export function useProjectEntries(projectId: string): ProjectCatalog {
  return useProjectCatalog(projectId).data ?? EMPTY;
}
