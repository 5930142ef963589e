import { z } from 'zod';
import { AccountRole, Email, User } from './auth';

export const CreateUserBody = z.object({
  email: Email,
  name: z.string().trim().min(1, 'Enter a name').max(120),
  accountRole: AccountRole,
  isAdmin: z.boolean().default(false),
});
export type CreateUserBody = z.input<typeof CreateUserBody>;

export const UpdateUserBody = z
  .object({
    name: z.string().trim().min(1, 'Enter a name').max(120).optional(),
    accountRole: AccountRole.optional(),
    isAdmin: z.boolean().optional(),
    disabled: z.boolean().optional(),
    version: z.number().int().min(1),
  })
  .strict();
export type UpdateUserBody = z.infer<typeof UpdateUserBody>;

export const Invitation = z.object({
  /** the one-time link; shown to the administrator (and, with e-mail, sent to the person) */
  url: z.string(),
  expiresAt: z.string(),
});
export type Invitation = z.infer<typeof Invitation>;

export const UserListResponse = z.object({ users: z.array(User) });
export const CreateUserResponse = z.object({ user: User, invitation: Invitation });
export const UserResponse = z.object({ user: User });
export const InvitationResponse = z.object({ invitation: Invitation });
export const UserIdParams = z.object({ userId: z.string().uuid('Not a user id') });
