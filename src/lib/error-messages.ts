import { isApiError } from './api-client';

/**
 * What to tell a person when something failed, in plain words. The server's own message is
 * used where it is the most specific thing we have (e.g. a rule that was broken).
 */
const MESSAGES: Partial<Record<string, string>> = {
  NOT_SIGNED_IN: 'You are signed out. Sign in again to continue.',
  FORBIDDEN: 'Your role does not allow this.',
  NOT_FOUND: 'This page does not exist, or you are not a member of it.',
  STALE_VERSION: 'Someone else changed this since you opened it. Your changes were not saved.',
  CSRF_FAILED: 'The form expired. Reload the page and try again.',
  RATE_LIMITED: 'Too many attempts. Wait a few minutes, then try again.',
  BAD_CREDENTIALS: 'That e-mail and password do not match an active account.',
  INVITATION_INVALID: 'This invitation link has been used, has expired, or was replaced by a newer one. Ask your administrator for a new link.',
  USER_NOT_FOUND: 'No account has this e-mail address. An administrator must create the account first.',
  LAST_DESIGNER: 'A project needs at least one designer. Add another designer before changing or removing this one.',
  DATABASE_UNAVAILABLE: 'The database is not answering. Try again in a moment.',
  NETWORK: 'Headroom could not reach the server. Check the connection and try again.',
  BAD_RESPONSE: 'The server answered in a form this page does not understand. Reload the page.',
  INTERNAL: 'Something went wrong on the server. Try again; if it keeps happening, tell your administrator.',
};

/** Codes whose server message says more than our generic wording. */
const PREFER_SERVER_MESSAGE = new Set(['CONFLICT', 'VALIDATION_FAILED', 'FORBIDDEN']);

export function errorMessage(error: unknown): string {
  if (isApiError(error)) {
    if (PREFER_SERVER_MESSAGE.has(error.code) && error.message) return error.message;
    return MESSAGES[error.code] ?? (error.message || 'Something went wrong.');
  }
  if (error instanceof Error && error.message) return `Something went wrong: ${error.message}`;
  return 'Something went wrong.';
}

export function isStaleVersion(error: unknown): boolean {
  return isApiError(error) && error.code === 'STALE_VERSION';
}

export function isNotFound(error: unknown): boolean {
  return isApiError(error) && error.status === 404;
}

export function isSignedOut(error: unknown): boolean {
  return isApiError(error) && error.status === 401;
}
