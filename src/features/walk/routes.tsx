/**
 * The walk's routes, for the lead to place among the signed-in routes. Every page is loaded
 * lazily, so the engine (which the walk runs in the browser) stays out of the first page's
 * JavaScript; each page has its own error boundary.
 */
import { Navigate, useParams } from 'react-router-dom';
import type { RouteObject } from 'react-router-dom';
import { guarded } from '../../components/errors/route-error-boundary';
import { walkPaths } from './paths';
import { buildingRevisionRoutes } from '../building/routes';

/** The revision's own address opens its first step. */
function RevisionIndex() {
  const { projectId = '', systemId = '', revisionId = '' } = useParams();
  return <Navigate replace to={walkPaths.step.getHref(projectId, systemId, revisionId, 'supply')} />;
}

export const walkRoutes: RouteObject[] = [
  {
    path: walkPaths.system.path,
    lazy: async () => ({ Component: guarded('this system', (await import('./pages/system-overview-page')).SystemOverviewPage) }),
  },
  {
    path: walkPaths.compare.path,
    lazy: async () => ({ Component: guarded('the comparison', (await import('./pages/compare-page')).ComparePage) }),
  },
  {
    path: walkPaths.revision.path,
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
