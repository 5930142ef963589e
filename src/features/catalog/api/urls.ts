/** The API addresses of the catalog feature, in one place (ids are encoded). */
import type { CatalogKind } from '../../../shared/api/catalog';

const e = encodeURIComponent;
export const catalogUrls = {
  project: (projectId: string) => `/api/projects/${e(projectId)}/catalog`,
  entries: (projectId: string) => `${catalogUrls.project(projectId)}/entries`,
  entry: (projectId: string, kind: CatalogKind, entryId: string) => `${catalogUrls.entries(projectId)}/${e(kind)}/${e(entryId)}`,
};
