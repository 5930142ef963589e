import { Router } from 'express';
import rateLimit, { ipKeyGenerator } from 'express-rate-limit';
import type { PassportStatic } from 'passport';
import { AppError } from '../http/errors';
import { parse } from '../http/validate';
import { requireUser } from '../http/guards';
import { authService } from '../services/auth';
import { AcceptInvitationBody, SignInBody } from '../../src/shared/api/auth';
import type { ServiceContext } from '../services/context';

export function authRoutes(ctx: ServiceContext, passport: PassportStatic, generateCsrfToken: (req: never, res: never, opts?: { overwrite?: boolean }) => string): Router {
  const router = Router();

  router.get('/csrf-token', (req, res) => {
    // mark the session so it is saved and its id (to which the token is bound) stays the same
    (req.session as unknown as { csrf?: boolean }).csrf = true;
    res.json({ token: generateCsrfToken(req as never, res as never) });
  });

  const signInLimiter = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: ctx.config.SIGN_IN_LIMIT,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    // per address and e-mail: one person mistyping does not lock out the office
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${typeof req.body?.email === 'string' ? req.body.email.toLowerCase() : ''}`,
    handler: (_req, res) =>
      res.status(429).json({ error: { code: 'RATE_LIMITED', message: 'Too many sign-in attempts. Wait 15 minutes and try again.' } }),
  });

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
