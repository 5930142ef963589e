/**
 * The building page's route, in the style of src/app/paths.ts: the router reads `path`, links
 * call `getHref`. It sits under a revision, beside the walk's steps, table and diagram.
 */
const e = encodeURIComponent;

export const buildingPaths = {
  /** floors, typical units, the riser builder and fixture schedules of one draft revision */
  building: {
    path: '/projects/:projectId/systems/:systemId/revisions/:revisionId/building',
    getHref: (projectId: string, systemId: string, revisionId: string) =>
      `/projects/${e(projectId)}/systems/${e(systemId)}/revisions/${e(revisionId)}/building`,
  },
} as const;

export type BuildingPathName = keyof typeof buildingPaths;
