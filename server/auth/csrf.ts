import { doubleCsrf } from 'csrf-csrf';
import type { Config } from '../config';

/**
 * Double-submit CSRF token bound to the session id. The token travels in the
 * `x-csrf-token` header; GET, HEAD and OPTIONS are exempt. After sign-in the session id
 * changes, so the client fetches a new token.
 */
export function createCsrf(config: Config) {
  return doubleCsrf({
    getSecret: () => config.SESSION_SECRET,
    // signed in: bound to the session (a token from before sign-in stops working, as the session id
    // changes then). Anonymous: no session is stored for a visitor who only fetched a token, so
    // the token is bound to the signed CSRF cookie alone (the double-submit pattern without a session).
    getSessionIdentifier: (req) => (req.user ? (req.session?.id ?? '') : ''),
    cookieName: config.COOKIE_SECURE === '1' ? '__Host-headroom.csrf' : 'headroom.csrf',
    cookieOptions: { sameSite: 'lax', secure: config.COOKIE_SECURE === '1', httpOnly: true, path: '/' },
    getCsrfTokenFromRequest: (req) => req.headers['x-csrf-token'] as string | undefined,
    errorConfig: { statusCode: 403, message: 'The form expired. Reload the page and try again.', code: 'CSRF_FAILED' },
  });
}
