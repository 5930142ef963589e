import { RESET_PASSWORD_PATH, resetPasswordPath } from '../shared/api/auth';

/**
 * Every route of the client, in one table: the router reads `path`, links call `getHref`.
 * No other file writes a route string by hand.
 */
export const paths = {
  home: {
    path: '/',
    getHref: () => '/',
  },
  signIn: {
    path: '/sign-in',
    /** `redirectTo` is where to return after signing in; only same-site paths are kept. */
    getHref: (redirectTo?: string | null) =>
      redirectTo && isSafeRedirect(redirectTo) && redirectTo !== '/sign-in' ? `/sign-in?redirectTo=${encodeURIComponent(redirectTo)}` : '/sign-in',
  },
  invitation: {
    path: '/invitations/:token',
    getHref: (token: string) => `/invitations/${encodeURIComponent(token)}`,
  },
  forgotPassword: {
    path: '/forgot-password',
    getHref: () => '/forgot-password',
  },
  /** the page a reset e-mail links to (the server writes the same address: src/shared/api/auth.ts) */
  resetPassword: {
    path: RESET_PASSWORD_PATH,
    getHref: (token: string) => resetPasswordPath(token),
  },
  projects: {
    path: '/projects',
    getHref: () => '/projects',
  },
  newProject: {
    path: '/projects/new',
    getHref: () => '/projects/new',
  },
  project: {
    path: '/projects/:projectId',
    getHref: (projectId: string) => `/projects/${encodeURIComponent(projectId)}`,
  },
  users: {
    path: '/users',
    getHref: () => '/users',
  },
} as const;

export type PathName = keyof typeof paths;

/** A path on this site (starts with one slash, not two, no scheme): safe to send someone to after sign-in. */
export function isSafeRedirect(target: string): boolean {
  return target.startsWith('/') && !target.startsWith('//') && !target.startsWith('/\\');
}
