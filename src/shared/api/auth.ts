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

// ---- "forgot my password" (issue 7)

export const PasswordResetRequestBody = z.object({ email: Email });
export type PasswordResetRequestBody = z.infer<typeof PasswordResetRequestBody>;

/** The one answer to every request, whether or not the address has an account (no user enumeration). */
export const PASSWORD_RESET_REQUESTED_MESSAGE =
  'If an active account has this e-mail address, a link to choose a new password is on its way. Check your inbox, and the spam folder.';
export const PasswordResetRequestedResponse = z.object({ message: z.string() });
export type PasswordResetRequestedResponse = z.infer<typeof PasswordResetRequestedResponse>;

/** 43 characters from server/auth/tokens.ts (32 bytes, base64url); the upper bound only refuses junk. */
export const PasswordResetConfirmBody = z.object({
  token: z.string().min(1, 'The link is incomplete: open it again from the e-mail').max(200, 'The link is not valid'),
  password: NewPassword,
});
export type PasswordResetConfirmBody = z.infer<typeof PasswordResetConfirmBody>;

export const PasswordResetDoneResponse = z.object({ message: z.string() });
export type PasswordResetDoneResponse = z.infer<typeof PasswordResetDoneResponse>;

/** Where a reset link leads; the server writes it into the e-mail, the client's route table reads it. */
export const RESET_PASSWORD_PATH = '/reset-password';
export const resetPasswordPath = (token: string) => `${RESET_PASSWORD_PATH}?token=${encodeURIComponent(token)}`;
