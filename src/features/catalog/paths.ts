/**
 * The routes of the project catalog, in the style of src/app/paths.ts: the router reads `path`,
 * links call `getHref`.
 */
const e = encodeURIComponent;

export const catalogPaths = {
  /** a project's own catalog entries (pipe materials, fitting types, fixture types, device templates) */
  projectCatalog: {
    path: '/projects/:projectId/catalog',
    getHref: (projectId: string) => `/projects/${e(projectId)}/catalog`,
  },
} as const;

export type CatalogPathName = keyof typeof catalogPaths;
