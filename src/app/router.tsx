import type { ReactNode } from 'react';
import type { QueryClient } from '@tanstack/react-query';
import { Navigate, createBrowserRouter } from 'react-router-dom';
import type { RouteObject } from 'react-router-dom';
import { RouteErrorBoundary, RouterErrorView } from '../components/errors/route-error-boundary';
import { paths } from './paths';
import { AppRoot } from './routes/app-root';
import { ForgotPasswordRoute } from './routes/forgot-password';
import { InvitationRoute } from './routes/invitation';
import { ResetPasswordRoute } from './routes/reset-password';
import { NewProjectRoute } from './routes/new-project';
import { NotFoundRoute } from './routes/not-found';
import { ProjectRoute } from './routes/project';
import { ProjectsRoute } from './routes/projects';
import { SignInRoute } from './routes/sign-in';
import { UsersRoute } from './routes/users';
import { walkRoutes } from '../features/walk/routes';
import { summaryRoutes } from '../features/summaries/routes';
import { catalogRoutes } from '../features/catalog/routes';
import { fieldChangeRoutes } from '../features/field-changes/routes';

/** Each major route gets its own error boundary, so one failing page leaves the shell and the others working. */
const guarded = (what: string, element: ReactNode) => <RouteErrorBoundary what={what}>{element}</RouteErrorBoundary>;

/** The app's routes; loaders that start a page's queries get the app's query client (src/lib/route-data.ts). */
export const appRoutes = (queryClient: QueryClient): RouteObject[] => [
  { path: paths.signIn.path, element: guarded('the sign-in page', <SignInRoute />), errorElement: <RouterErrorView /> },
  { path: paths.invitation.path, element: guarded('the invitation', <InvitationRoute />), errorElement: <RouterErrorView /> },
  { path: paths.forgotPassword.path, element: guarded('the forgotten-password page', <ForgotPasswordRoute />), errorElement: <RouterErrorView /> },
  { path: paths.resetPassword.path, element: guarded('the new-password page', <ResetPasswordRoute />), errorElement: <RouterErrorView /> },
  {
    element: <AppRoot />,
    errorElement: <RouterErrorView />,
    children: [
      { path: paths.home.path, element: <Navigate replace to={paths.projects.getHref()} /> },
      { path: paths.projects.path, element: guarded('your projects', <ProjectsRoute />) },
      { path: paths.newProject.path, element: guarded('the new-project form', <NewProjectRoute />) },
      { path: paths.project.path, element: guarded('this project', <ProjectRoute />) },
      { path: paths.users.path, element: guarded('the accounts', <UsersRoute />) },
      ...summaryRoutes(queryClient),
      ...catalogRoutes,
      ...fieldChangeRoutes(queryClient),
      ...walkRoutes(queryClient),
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
];

export function createRouter(queryClient: QueryClient) {
  return createBrowserRouter(appRoutes(queryClient));
}
