/**
 * The routes of the issued summary, the review inbox and the development mail page, in the style
 * of src/app/paths.ts: the router reads `path`, links call `getHref`.
 */
const e = encodeURIComponent;

export const summaryPaths = {
  /** the inspector's received summaries across their projects */
  inbox: {
    path: '/inbox',
    getHref: () => '/inbox',
  },
  /** one issued revision's summary: PDF, sending, messages, reviews (and the inspector's review form) */
  revisionSummary: {
    path: '/projects/:projectId/systems/:systemId/revisions/:revisionId/summary',
    getHref: (projectId: string, systemId: string, revisionId: string) => `/projects/${e(projectId)}/systems/${e(systemId)}/revisions/${e(revisionId)}/summary`,
  },
  /** administrators, development only: the messages the local SMTP sink caught */
  devMail: {
    path: '/dev/mail',
    getHref: () => '/dev/mail',
  },
} as const;

export type SummaryPathName = keyof typeof summaryPaths;
