/**
 * The field-change routes, for the lead to place among the signed-in routes. The frame loads the
 * field change and the issued revision; its index is the side by side, its children the steps.
 */
import type { RouteObject } from 'react-router-dom';
import { guarded } from '../../components/errors/route-error-boundary';
import { fieldChangePaths } from './paths';

export const fieldChangeRoutes: RouteObject[] = [
  {
    path: fieldChangePaths.view.path,
    lazy: async () => ({ Component: guarded('this field change', (await import('./components/field-change-frame')).FieldChangeFrame) }),
    children: [
      { index: true, lazy: async () => ({ Component: (await import('./pages/field-change-page')).FieldChangePage }) },
      { path: fieldChangePaths.diagram.path, lazy: async () => ({ Component: (await import('../walk/pages/riser-diagram-page')).RiserDiagramPage }) },
      { path: fieldChangePaths.step.path, lazy: async () => ({ Component: (await import('./pages/field-change-step-page')).FieldChangeStepPage }) },
    ],
  },
];
