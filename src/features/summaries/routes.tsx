/**
 * The routes of the issued summary, the review inbox and the development mail page, for the lead
 * to place among the signed-in routes. Every page is loaded lazily and has its own error boundary.
 */
import type { RouteObject } from 'react-router-dom';
import { guarded } from '../../components/errors/route-error-boundary';
import { summaryPaths } from './paths';

export const summaryRoutes: RouteObject[] = [
  {
    path: summaryPaths.inbox.path,
    lazy: async () => ({ Component: guarded('your review inbox', (await import('../inbox/pages/inbox-page')).InboxPage) }),
  },
  {
    path: summaryPaths.revisionSummary.path,
    lazy: async () => ({ Component: guarded('this summary', (await import('./pages/revision-summary-page')).RevisionSummaryPage) }),
  },
  {
    path: summaryPaths.devMail.path,
    lazy: async () => ({ Component: guarded('the development mail', (await import('../dev-mail/pages/dev-mail-page')).DevMailPage) }),
  },
];
