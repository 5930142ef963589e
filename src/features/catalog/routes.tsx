/** The project catalog's route, for the lead to place among the signed-in routes; loaded lazily, with its own error boundary. */
import type { RouteObject } from 'react-router-dom';
import { guarded } from '../../components/errors/route-error-boundary';
import { catalogPaths } from './paths';

export const catalogRoutes: RouteObject[] = [
  {
    path: catalogPaths.projectCatalog.path,
    lazy: async () => ({ Component: guarded('the project catalog', (await import('./pages/project-catalog-page')).ProjectCatalogPage) }),
  },
];
