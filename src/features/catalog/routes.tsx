/** The project catalog's route, for the lead to place among the signed-in routes; loaded lazily, with its own error boundary. */
import type { RouteObject } from 'react-router-dom';
import { RouteErrorBoundary } from '../../components/errors/route-error-boundary';
import { catalogPaths } from './paths';

export const catalogRoutes: RouteObject[] = [
  {
    path: catalogPaths.projectCatalog.path,
    lazy: async () => {
      const { ProjectCatalogPage } = await import('./pages/project-catalog-page');
      return {
        Component: function GuardedCatalogPage() {
          return (
            <RouteErrorBoundary what="the project catalog">
              <ProjectCatalogPage />
            </RouteErrorBoundary>
          );
        },
      };
    },
  },
];
