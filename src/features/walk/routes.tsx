/**
 * The walk's routes, for the lead to place among the signed-in routes. Every page is loaded
 * lazily, so the engine (which the walk runs in the browser) stays out of the first page's
 * JavaScript; each page has its own error boundary.
 */
import type { QueryClient } from '@tanstack/react-query';
import { Navigate, useParams } from 'react-router-dom';
import type { RouteObject } from 'react-router-dom';
import { startQueries } from '../../lib/route-data';
import { projectQueryOptions } from '../projects/api/get-project';
import { systemQueryOptions } from '../systems/api/get-system';
import { revisionQueryOptions } from '../systems/api/get-revision';
import { catalogQueryOptions } from '../systems/api/get-catalog';
import { guarded } from '../../components/errors/route-error-boundary';
import { walkPaths } from './paths';
import { buildingRevisionRoutes } from '../building/routes';

/** The revision's own address opens its first step. */
function RevisionIndex() {
  const { projectId = '', systemId = '', revisionId = '' } = useParams();
  return <Navigate replace to={walkPaths.step.getHref(projectId, systemId, revisionId, 'supply')} />;
}

/** The walk's routes; their loaders start the frame's queries beside the page's code (src/lib/route-data.ts). */
export const walkRoutes = (queryClient: QueryClient): RouteObject[] => [
  {
    path: walkPaths.system.path,
    loader: startQueries(queryClient, ({ projectId = '', systemId = '' }) => [projectQueryOptions(projectId), systemQueryOptions(projectId, systemId)]),
    lazy: async () => ({ Component: guarded('this system', (await import('./pages/system-overview-page')).SystemOverviewPage) }),
  },
  {
    path: walkPaths.compare.path,
    lazy: async () => ({ Component: guarded('the comparison', (await import('./pages/compare-page')).ComparePage) }),
  },
  {
    path: walkPaths.revision.path,
    // the frame reads the project, the system, the revision and the catalog before it shows a step
    loader: startQueries(queryClient, ({ projectId = '', systemId = '', revisionId = '' }) => [
      projectQueryOptions(projectId),
      systemQueryOptions(projectId, systemId),
      revisionQueryOptions(projectId, systemId, revisionId),
      catalogQueryOptions(),
    ]),
    lazy: async () => ({ Component: guarded('this revision', (await import('./components/walk-layout')).WalkLayout) }),
    children: [
      { index: true, Component: RevisionIndex },
      { path: walkPaths.table.path, lazy: async () => ({ Component: (await import('./pages/segment-table-page')).SegmentTablePage }) },
      ...buildingRevisionRoutes,
      { path: walkPaths.diagram.path, lazy: async () => ({ Component: (await import('./pages/riser-diagram-page')).RiserDiagramPage }) },
      { path: walkPaths.step.path, lazy: async () => ({ Component: (await import('./pages/step-page')).StepPage }) },
    ],
  },
];
