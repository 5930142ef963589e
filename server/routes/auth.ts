import { Router, type Request } from 'express';
import rateLimit, { ipKeyGenerator, type Store } from 'express-rate-limit';
import type { PassportStatic } from 'passport';
import { AppError } from '../http/errors';
import { parse } from '../http/validate';
import { requireUser } from '../http/guards';
import { authService } from '../services/auth';
import { passwordResetService } from '../services/passwordReset';
import { SESSION_COOKIE } from '../auth/session';
import {
  AcceptInvitationBody,
  PASSWORD_RESET_REQUESTED_MESSAGE,
  PasswordResetConfirmBody,
  PasswordResetRequestBody,
  SignInBody,
  type PasswordResetDoneResponse,
  type PasswordResetRequestedResponse,
} from '../../src/shared/api/auth';
import type { ServiceContext } from '../services/context';

/**
 * A "forgot my password" request is answered this long after it arrived, whatever the address:
 * well above the slower (known-address) path's time on a busy machine (a choice).
 */
export const RESET_ANSWER_MS = 250;

export function authRoutes(
  ctx: ServiceContext,
  passport: PassportStatic,
  generateCsrfToken: (req: never, res: never, opts?: { overwrite?: boolean }) => string,
  /** a store per limiter, by name, when the counts must be shared by several processes; in memory otherwise */
  rateLimitStore?: (prefix: string) => Store,
): Router {
  const router = Router();

  router.get('/csrf-token', (req, res) => {
    // the session is not touched: an anonymous caller's token is bound to its CSRF cookie alone,
    // so no session row is stored for it (issue 13 finding 7); a signed-in one's to the session
    res.json({ token: generateCsrfToken(req as never, res as never) });
  });

  const limiter = (o: { name: string; limit: number; key: (req: Request) => string; message: string; onlyFailures?: boolean }) =>
    rateLimit({
      ...(rateLimitStore ? { store: rateLimitStore(o.name) } : {}),
      windowMs: 15 * 60 * 1000,
      limit: o.limit,
      standardHeaders: 'draft-7',
      legacyHeaders: false,
      keyGenerator: o.key,
      // a successful sign-in is not an attempt to guess: it does not count (issue 13 finding 7)
      skipSuccessfulRequests: o.onlyFailures ?? false,
      handler: (_req, res) => res.status(429).json({ error: { code: 'RATE_LIMITED', message: o.message } }),
    });
  const client = (req: Request) => ipKeyGenerator(req.ip ?? '');
  // per address and e-mail (as the schema normalises it, so spaces and capitals do not make a new count):
  // one person mistyping does not lock out the office
  const clientAndEmail = (req: Request) => `${client(req)}|${typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase() : ''}`;
  const signInMessage = 'Too many sign-in attempts. Wait 15 minutes and try again.';
  /** SIGN_IN_LIMIT failed sign-ins per 15 minutes per address and e-mail; SIGN_IN_CLIENT_LIMIT per address across e-mails (spraying) */
  const signInLimiters = [
    limiter({ name: 'sign-in', limit: ctx.config.SIGN_IN_LIMIT, key: clientAndEmail, message: signInMessage, onlyFailures: true }),
    limiter({ name: 'sign-in-client', limit: ctx.config.SIGN_IN_CLIENT_LIMIT, key: client, message: signInMessage, onlyFailures: true }),
  ];
  // also keeps anyone from filling a person's mailbox with reset links
  const passwordResetLimiter = limiter({
    name: 'password-reset',
    limit: ctx.config.SIGN_IN_LIMIT,
    key: clientAndEmail,
    message: 'Too many requests for a new password link. Wait 15 minutes and try again.',
  });
  /** LINK_LIMIT uses of reset and invitation links per 15 minutes per address: each may cost a password hash (issue 13 finding 3) */
  const linkLimiter = limiter({
    name: 'link',
    limit: ctx.config.LINK_LIMIT,
    key: client,
    message: 'Too many tries with this kind of link. Wait 15 minutes and try again.',
  });

  router.post('/auth/sign-in', ...signInLimiters, async (req, res, next) => {
    const body = parse(SignInBody, req.body);
    req.body = body;
    passport.authenticate('local', (err: unknown, user: Express.User | false) => {
      if (err) return next(err);
      if (!user) return next(new AppError(401, 'BAD_CREDENTIALS', 'That e-mail and password do not match an active account.'));
      // passport 0.7 regenerates the session here: the session id changes at sign-in
      req.logIn(user, (loginErr) => (loginErr ? next(loginErr) : res.json({ user })));
    })(req, res, next);
  });

  router.post('/auth/sign-out', requireUser, (req, res, next) => {
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy(() => {
        res.clearCookie('headroom.sid');
        res.status(204).end();
      });
    });
  });

  router.post('/auth/password-reset', passwordResetLimiter, async (req, res) => {
    const body = parse(PasswordResetRequestBody, req.body);
    // both paths answer after the same time: a known address (a link written and queued) took
    // ~19 ms and an unknown one ~10 ms, which told who has an account (issue 13 finding 7)
    const answerAt = performance.now() + RESET_ANSWER_MS;
    await passwordResetService.request(ctx, body.email, req.ip ?? null);
    const wait = answerAt - performance.now();
    if (wait > 0) await new Promise((resolve) => setTimeout(resolve, wait));
    // the same answer whether or not the address has an account
    res.status(202).json({ message: PASSWORD_RESET_REQUESTED_MESSAGE } satisfies PasswordResetRequestedResponse);
  });

  router.post('/auth/password-reset/confirm', linkLimiter, async (req, res, next) => {
    const body = parse(PasswordResetConfirmBody, req.body);
    const { userId } = await passwordResetService.confirm(ctx, body.token, body.password);
    const done = {
      message: 'Your password is changed, and every session of your account has ended. Sign in with the new password.',
    } satisfies PasswordResetDoneResponse;
    // the service already removed this browser's session from the store if it was that user's: drop it here too
    if (req.user?.id !== userId) return res.json(done);
    req.session.destroy((err) => {
      if (err) return next(err);
      res.clearCookie(SESSION_COOKIE);
      res.json(done);
    });
  });

  router.get('/auth/me', requireUser, (req, res) => {
    res.json({ user: req.user });
  });

  router.get('/invitations/:token', async (req, res) => {
    res.json(await authService.invitationInfo(ctx, String(req.params.token)));
  });

  router.post('/invitations/:token', linkLimiter, async (req, res, next) => {
    const body = parse(AcceptInvitationBody, req.body);
    const user = await authService.acceptInvitation(ctx, String(req.params.token), body.password);
    req.logIn(user, (err) => (err ? next(err) : res.json({ user })));
  });

  return router;
}
