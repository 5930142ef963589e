import { conflict, notFound, staleVersion } from './errors';
import { newToken } from '../auth/tokens';
import { invitationsRepo } from '../repositories/invitations';
import { toUser, usersRepo, type UserRow } from '../repositories/users';
import { auditRepo } from '../repositories/audit';
import { outboxService } from './outbox';
import type { Actor, ServiceContext } from './context';
import type { CreateUserBody, Invitation, UpdateUserBody } from '../../src/shared/api/users';
import type { User } from '../../src/shared/api/auth';
import type { Tx } from '../db/rows';

/**
 * A new invitation link for the user (earlier open links stop working). The link is returned to
 * the administrator and, unless `send` is false (the caller puts it in a message of its own), it
 * is e-mailed through the outbox in the same transaction.
 */
export async function issueInvitation(ctx: ServiceContext, trx: Tx, userId: string, actor: Actor | null, opts: { send?: boolean } = {}): Promise<Invitation> {
  await invitationsRepo.revokeOpen(trx, userId);
  const { token, tokenHash } = newToken();
  const expiresAt = new Date(Date.now() + ctx.config.INVITATION_HOURS * 3600_000);
  await invitationsRepo.insert(trx, { user_id: userId, token_hash: tokenHash, expires_at: expiresAt, created_by: actor?.id ?? null });
  const url = `${ctx.config.PUBLIC_URL.replace(/\/$/, '')}/invitations/${token}`;
  if (opts.send ?? true) {
    const user = await usersRepo.findById(trx, userId);
    if (user)
      await outboxService.enqueueAccountLink(ctx, trx, {
        userId,
        email: user.email,
        name: user.name,
        url,
        expiresAt: expiresAt.toISOString(),
        purpose: 'invitation',
        createdBy: actor?.id ?? null,
      });
  }
  return { url, expiresAt: expiresAt.toISOString() };
}

export const usersService = {
  list: async (ctx: ServiceContext): Promise<User[]> => (await usersRepo.list(ctx.db)).map(toUser),

  async create(ctx: ServiceContext, actor: Actor, body: Required<CreateUserBody>): Promise<{ user: User; invitation: Invitation }> {
    return ctx.db.transaction(async (trx) => {
      if (await usersRepo.findByEmail(trx, body.email)) {
        throw conflict('An account with this e-mail already exists.', { email: 'Already has an account' });
      }
      const row = await usersRepo.insert(trx, { email: body.email, name: body.name, is_admin: body.isAdmin, account_role: body.accountRole });
      const invitation = await issueInvitation(ctx, trx, row.id, actor);
      await auditRepo.record(trx, { actorId: actor.id, action: 'user.created', subjectType: 'user', subjectId: row.id, details: { email: row.email } });
      return { user: toUser(row), invitation };
    });
  },

  async update(ctx: ServiceContext, actor: Actor, userId: string, body: UpdateUserBody): Promise<User> {
    return ctx.db.transaction(async (trx) => {
      const current = await usersRepo.findById(trx, userId);
      if (!current) throw notFound('The user');
      if (userId === actor.id && (body.isAdmin === false || body.disabled === true)) {
        throw conflict('You cannot remove your own administrator access or disable yourself.');
      }
      const values: Partial<UserRow> = {};
      if (body.name !== undefined) values.name = body.name;
      if (body.accountRole !== undefined) values.account_role = body.accountRole;
      if (body.isAdmin !== undefined) values.is_admin = body.isAdmin;
      if (body.disabled !== undefined) values.status = body.disabled ? 'disabled' : current.password_hash ? 'active' : 'invited';
      const row = await usersRepo.update(trx, userId, body.version, values);
      if (!row) throw staleVersion();
      if (body.disabled) await trx('session').whereRaw(`(sess->'passport'->>'user') = ?`, [userId]).delete();
      await auditRepo.record(trx, { actorId: actor.id, action: 'user.updated', subjectType: 'user', subjectId: userId, details: { ...body } });
      return toUser(row);
    });
  },

  async reinvite(ctx: ServiceContext, actor: Actor, userId: string): Promise<Invitation> {
    return ctx.db.transaction(async (trx) => {
      const user = await usersRepo.findById(trx, userId);
      if (!user) throw notFound('The user');
      if (user.status === 'disabled') throw conflict('Enable the account before sending a new link.');
      const invitation = await issueInvitation(ctx, trx, userId, actor);
      await auditRepo.record(trx, { actorId: actor.id, action: 'user.invited', subjectType: 'user', subjectId: userId });
      return invitation;
    });
  },
};
