import { z } from 'zod';

export const ACCOUNT_ROLES = ['designer', 'contractor', 'inspector'] as const;
export const AccountRole = z.enum(ACCOUNT_ROLES);
export type AccountRole = z.infer<typeof AccountRole>;

export const Email = z.string().trim().toLowerCase().email('Enter a valid e-mail address').max(254);
/** 10 characters minimum: common practice (NIST SP 800-63B asks at least 8). */
export const NewPassword = z.string().min(10, 'Use at least 10 characters').max(200, 'Use at most 200 characters');

export const SignInBody = z.object({
  email: Email,
  password: z.string().min(1, 'Enter your password').max(200),
});
export type SignInBody = z.infer<typeof SignInBody>;

export const User = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  isAdmin: z.boolean(),
  accountRole: AccountRole,
  status: z.enum(['invited', 'active', 'disabled']),
  version: z.number().int(),
  createdAt: z.string(),
});
export type User = z.infer<typeof User>;

export const MeResponse = z.object({ user: User });

export const InvitationInfo = z.object({
  email: z.string(),
  name: z.string(),
  expiresAt: z.string(),
});
export type InvitationInfo = z.infer<typeof InvitationInfo>;

export const AcceptInvitationBody = z.object({ password: NewPassword });
export type AcceptInvitationBody = z.infer<typeof AcceptInvitationBody>;
