import { ServiceError } from './errors';
import { hashPassword, verifyPassword } from '../auth/password';
import { assertAcceptablePassword } from '../auth/passwordPolicy';
import { hashToken } from '../auth/tokens';
import { invitationsRepo } from '../repositories/invitations';
import { toUser, usersRepo } from '../repositories/users';
import { auditRepo } from '../repositories/audit';
import type { ServiceContext } from './context';
import type { InvitationInfo, User } from '../../src/shared/api/auth';
import type { ProjectRole } from '../../src/shared/api/projects';

const invalidInvitation = () => new ServiceError('INVITATION_INVALID', 'This link has expired or was already used. Ask your administrator for a new one.');

export const authService = {
  /** The same answer for an unknown e-mail and a wrong password: no user enumeration. */
  async verifyCredentials(ctx: ServiceContext, email: string, password: string): Promise<User | null> {
    const row = await usersRepo.findByEmail(ctx.db, email);
    const ok = await verifyPassword(password, row?.status === 'active' ? row.password_hash : null);
    return ok && row ? toUser(row) : null;
  },

  async findActiveUser(ctx: ServiceContext, id: string): Promise<User | null> {
    const row = await usersRepo.findById(ctx.db, id);
    return row && row.status === 'active' ? toUser(row) : null;
  },

  /** The active user and their role in `projectId` (undefined when not a member); null for no active user. */
  async findActiveUserWithRole(ctx: ServiceContext, id: string, projectId: string): Promise<{ user: User; role: ProjectRole | undefined } | null> {
    const row = await usersRepo.findWithRole(ctx.db, id, projectId);
    return row && row.status === 'active' ? { user: toUser(row), role: (row.project_role ?? undefined) as ProjectRole | undefined } : null;
  },

  async invitationInfo(ctx: ServiceContext, token: string): Promise<InvitationInfo> {
    const invitation = await invitationsRepo.findUsable(ctx.db, hashToken(token));
    if (!invitation) throw invalidInvitation();
    const user = await usersRepo.findById(ctx.db, invitation.user_id);
    if (!user || user.status === 'disabled') throw invalidInvitation();
    return { email: user.email, name: user.name, expiresAt: invitation.expires_at.toISOString() };
  },

  /** Sets the password and spends the link, in one transaction: a link works once. */
  async acceptInvitation(ctx: ServiceContext, token: string, password: string): Promise<User> {
    // the link first: a wrong one is refused without hashing (issue 13 finding 3)
    const tokenHash = hashToken(token);
    const usable = await invitationsRepo.findUsable(ctx.db, tokenHash);
    if (!usable) throw invalidInvitation();
    const invited = await usersRepo.findById(ctx.db, usable.user_id);
    if (invited) assertAcceptablePassword(password, invited.email);
    const passwordHash = await hashPassword(password);
    return ctx.db.transaction(async (trx) => {
      // looked up again inside the transaction: single use under concurrency
      const invitation = await invitationsRepo.findUsable(trx, tokenHash);
      if (!invitation || !(await invitationsRepo.consume(trx, invitation.id))) throw invalidInvitation();
      const user = await usersRepo.findById(trx, invitation.user_id);
      if (!user || user.status === 'disabled') throw invalidInvitation();
      await usersRepo.setPassword(trx, user.id, passwordHash);
      await auditRepo.record(trx, { actorId: user.id, action: 'invitation.accepted', subjectType: 'user', subjectId: user.id });
      return toUser((await usersRepo.findById(trx, user.id))!);
    });
  },
};
