import { Router } from 'express';
import rateLimit, { ipKeyGenerator } from 'express-rate-limit';
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

export function authRoutes(ctx: ServiceContext, passport: PassportStatic, generateCsrfToken: (req: never, res: never, opts?: { overwrite?: boolean }) => string): Router {
  const router = Router();

  router.get('/csrf-token', (req, res) => {
    // mark the session so it is saved and its id (to which the token is bound) stays the same
    (req.session as unknown as { csrf?: boolean }).csrf = true;
    res.json({ token: generateCsrfToken(req as never, res as never) });
  });

  /** SIGN_IN_LIMIT calls per 15 minutes per address and e-mail; each limiter keeps its own count. */
  const perAddressAndEmail = (message: string) =>
    rateLimit({
      windowMs: 15 * 60 * 1000,
      limit: ctx.config.SIGN_IN_LIMIT,
      standardHeaders: 'draft-7',
      legacyHeaders: false,
      // per address and e-mail (as the schema normalises it, so spaces and capitals do not make a new count):
      // one person mistyping does not lock out the office
      keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase() : ''}`,
      handler: (_req, res) => res.status(429).json({ error: { code: 'RATE_LIMITED', message } }),
    });
  const signInLimiter = perAddressAndEmail('Too many sign-in attempts. Wait 15 minutes and try again.');
  // also keeps anyone from filling a person's mailbox with reset links
  const passwordResetLimiter = perAddressAndEmail('Too many requests for a new password link. Wait 15 minutes and try again.');

  router.post('/auth/sign-in', signInLimiter, async (req, res, next) => {
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
    await passwordResetService.request(ctx, body.email, req.ip ?? null);
    // the same answer whether or not the address has an account
    res.status(202).json({ message: PASSWORD_RESET_REQUESTED_MESSAGE } satisfies PasswordResetRequestedResponse);
  });

  router.post('/auth/password-reset/confirm', async (req, res, next) => {
    const body = parse(PasswordResetConfirmBody, req.body);
    const { userId } = await passwordResetService.confirm(ctx, body.token, body.password);
    const done = { message: 'Your password is changed, and every session of your account has ended. Sign in with the new password.' } satisfies PasswordResetDoneResponse;
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
    res.json(await authService.invitationInfo(ctx, req.params.token));
  });

  router.post('/invitations/:token', async (req, res, next) => {
    const body = parse(AcceptInvitationBody, req.body);
    const user = await authService.acceptInvitation(ctx, req.params.token, body.password);
    req.logIn(user, (err) => (err ? next(err) : res.json({ user })));
  });

  return router;
}
