/**
 * The field-change routes, for the lead to place among the signed-in routes. The frame loads the
 * field change and the issued revision; its index is the side by side, its children the steps.
 */
import type { QueryClient } from '@tanstack/react-query';
import type { RouteObject } from 'react-router-dom';
import { startQueries } from '../../lib/route-data';
import { projectQueryOptions } from '../projects/api/get-project';
import { systemQueryOptions } from '../systems/api/get-system';
import { catalogQueryOptions } from '../systems/api/get-catalog';
import { fieldChangeQueryOptions } from './api/get-field-change';
import { guarded } from '../../components/errors/route-error-boundary';
import { fieldChangePaths } from './paths';

/** The field change's routes; the loader starts the frame's queries beside its code (src/lib/route-data.ts). */
export const fieldChangeRoutes = (queryClient: QueryClient): RouteObject[] => [
  {
    path: fieldChangePaths.view.path,
    loader: startQueries(queryClient, ({ projectId = '', systemId = '', fieldChangeId = '' }) => [
      projectQueryOptions(projectId),
      systemQueryOptions(projectId, systemId),
      fieldChangeQueryOptions({ projectId, systemId, fieldChangeId }),
      catalogQueryOptions(),
    ]),
    lazy: async () => ({ Component: guarded('this field change', (await import('./components/field-change-frame')).FieldChangeFrame) }),
    children: [
      { index: true, lazy: async () => ({ Component: (await import('./pages/field-change-page')).FieldChangePage }) },
      { path: fieldChangePaths.diagram.path, lazy: async () => ({ Component: (await import('../walk/pages/riser-diagram-page')).RiserDiagramPage }) },
      { path: fieldChangePaths.step.path, lazy: async () => ({ Component: (await import('./pages/field-change-step-page')).FieldChangeStepPage }) },
    ],
  },
];
