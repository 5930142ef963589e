/**
 * "Forgot my password": a one-time link by e-mail, then a new password through it.
 *
 * What an answer may reveal: nothing about whether an address has an account. The request always
 * ends with the same answer (the route's 202); only for an active account is a link made, mailed
 * through the outbox and audited. A wrong, used and expired link are refused alike.
 */
import { ServiceError } from './errors';
import { hashPassword } from '../auth/password';
import { assertAcceptablePassword } from '../auth/passwordPolicy';
import { hashToken, newToken } from '../auth/tokens';
import { passwordResetsRepo } from '../repositories/passwordResets';
import { sessionsRepo } from '../repositories/sessions';
import { usersRepo } from '../repositories/users';
import { auditRepo } from '../repositories/audit';
import { outboxService } from './outbox';
import type { ServiceContext } from './context';
import { resetPasswordPath } from '../../src/shared/api/auth';

export const invalidResetLink = () =>
  new ServiceError(
    'RESET_LINK_INVALID',
    'This link to choose a new password cannot be used: it is incomplete, was already used, or has expired. Ask for a new one.',
  );

export const passwordResetService = {
  /**
   * Makes and mails a link when `email` is an active account's; otherwise does nothing. Returns
   * nothing either way, so a caller cannot tell the two apart. Invited accounts use their
   * invitation; disabled ones get no link.
   */
  async request(ctx: ServiceContext, email: string, requestedFrom: string | null): Promise<void> {
    const user = await usersRepo.findByEmail(ctx.db, email);
    if (!user || user.status !== 'active') return;
    const { token, tokenHash } = newToken();
    const expiresAt = new Date(Date.now() + ctx.config.RESET_TOKEN_MINUTES * 60_000);
    const url = `${ctx.config.PUBLIC_URL.replace(/\/$/, '')}${resetPasswordPath(token)}`;
    await ctx.db.transaction(async (trx) => {
      // earlier open links stay valid until one is used: a slow first e-mail still works
      const reset = await passwordResetsRepo.insert(trx, { user_id: user.id, token_hash: tokenHash, expires_at: expiresAt, requested_from: requestedFrom });
      await outboxService.enqueueAccountLink(ctx, trx, {
        userId: user.id,
        email: user.email,
        name: user.name,
        url,
        expiresAt: expiresAt.toISOString(),
        purpose: 'password-reset',
        createdBy: null,
      });
      await auditRepo.record(trx, {
        actorId: null,
        action: 'password-reset.requested',
        subjectType: 'user',
        subjectId: user.id,
        details: { resetId: reset.id, requestedFrom, expiresAt: expiresAt.toISOString() },
      });
    });
  },

  /**
   * Sets the new password through the link, in one transaction: the link is spent, the user's
   * other open links too, and every session of the user ends (whoever had the old password is
   * signed out). The person signs in afresh with the new password.
   */
  async confirm(ctx: ServiceContext, token: string, password: string): Promise<{ userId: string; sessionsEnded: number }> {
    // the link first: a wrong one is refused without hashing (issue 13 finding 3). A link is 32
    // random bytes, so the time a wrong one takes tells nothing an attacker could use.
    const tokenHash = hashToken(token);
    const usable = await passwordResetsRepo.findUsable(ctx.db, tokenHash);
    if (!usable) throw invalidResetLink();
    const owner = await usersRepo.findById(ctx.db, usable.user_id);
    if (owner) assertAcceptablePassword(password, owner.email);
    const passwordHash = await hashPassword(password);
    return ctx.db.transaction(async (trx) => {
      const reset = await passwordResetsRepo.findUsable(trx, tokenHash);
      if (!reset || !(await passwordResetsRepo.consume(trx, reset.id))) throw invalidResetLink();
      const user = await usersRepo.findById(trx, reset.user_id);
      // disabled after asking: the link dies with the account (the rollback leaves it unused, still refused)
      if (!user || user.status !== 'active') throw invalidResetLink();
      await usersRepo.setPassword(trx, user.id, passwordHash);
      const otherLinksRevoked = await passwordResetsRepo.revokeOpen(trx, user.id);
      const sessionsEnded = await sessionsRepo.endAllOf(trx, user.id);
      await auditRepo.record(trx, {
        actorId: user.id,
        action: 'password-reset.completed',
        subjectType: 'user',
        subjectId: user.id,
        details: { resetId: reset.id, otherLinksRevoked, sessionsEnded },
      });
      return { userId: user.id, sessionsEnded };
    });
  },
};
