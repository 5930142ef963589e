/**
 * The routes of the issued summary, the review inbox and the development mail page, for the lead
 * to place among the signed-in routes. Every page is loaded lazily and has its own error boundary.
 */
import type { QueryClient } from '@tanstack/react-query';
import type { RouteObject } from 'react-router-dom';
import { startQueries } from '../../lib/route-data';
import { projectQueryOptions } from '../projects/api/get-project';
import { systemQueryOptions } from '../systems/api/get-system';
import { revisionQueryOptions } from '../systems/api/get-revision';
import { guarded } from '../../components/errors/route-error-boundary';
import { summaryPaths } from './paths';

/** The summary routes; the revision summary's loader starts its queries beside its code (src/lib/route-data.ts). */
export const summaryRoutes = (queryClient: QueryClient): RouteObject[] => [
  {
    path: summaryPaths.inbox.path,
    lazy: async () => ({ Component: guarded('your review inbox', (await import('../inbox/pages/inbox-page')).InboxPage) }),
  },
  {
    path: summaryPaths.revisionSummary.path,
    loader: startQueries(queryClient, ({ projectId = '', systemId = '', revisionId = '' }) => [
      projectQueryOptions(projectId),
      systemQueryOptions(projectId, systemId),
      revisionQueryOptions(projectId, systemId, revisionId),
    ]),
    lazy: async () => ({ Component: guarded('this summary', (await import('./pages/revision-summary-page')).RevisionSummaryPage) }),
  },
  {
    path: summaryPaths.devMail.path,
    lazy: async () => ({ Component: guarded('the development mail', (await import('../dev-mail/pages/dev-mail-page')).DevMailPage) }),
  },
];
