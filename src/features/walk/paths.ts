/**
 * The walk's routes, in the style of src/app/paths.ts: the router reads `path`, links call
 * `getHref`. No other file of the walk writes a route string by hand.
 */
import type { WalkStepId } from './steps';

const e = encodeURIComponent;
const system = (projectId: string, systemId: string) => `/projects/${e(projectId)}/systems/${e(systemId)}`;
const revision = (projectId: string, systemId: string, revisionId: string) => `${system(projectId, systemId)}/revisions/${e(revisionId)}`;

export const walkPaths = {
  system: {
    path: '/projects/:projectId/systems/:systemId',
    getHref: system,
  },
  /** the revision's frame: its children are the steps, the table and the diagram */
  revision: {
    path: '/projects/:projectId/systems/:systemId/revisions/:revisionId',
    getHref: revision,
  },
  step: {
    path: '/projects/:projectId/systems/:systemId/revisions/:revisionId/:step',
    getHref: (projectId: string, systemId: string, revisionId: string, step: WalkStepId) => `${revision(projectId, systemId, revisionId)}/${e(step)}`,
  },
  table: {
    path: '/projects/:projectId/systems/:systemId/revisions/:revisionId/table',
    getHref: (projectId: string, systemId: string, revisionId: string) => `${revision(projectId, systemId, revisionId)}/table`,
  },
  diagram: {
    path: '/projects/:projectId/systems/:systemId/revisions/:revisionId/diagram',
    getHref: (projectId: string, systemId: string, revisionId: string) => `${revision(projectId, systemId, revisionId)}/diagram`,
  },
  compare: {
    path: '/projects/:projectId/systems/:systemId/compare',
    /** `a` and `b` are revision ids; either may be left out to pick it on the page */
    getHref: (projectId: string, systemId: string, a?: string, b?: string) => {
      const query = new URLSearchParams();
      if (a) query.set('a', a);
      if (b) query.set('b', b);
      const text = query.toString();
      return `${system(projectId, systemId)}/compare${text ? `?${text}` : ''}`;
    },
  },
} as const;

export type WalkPathName = keyof typeof walkPaths;
