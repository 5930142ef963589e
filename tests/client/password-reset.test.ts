import { describe, expect, it } from 'vitest';
import { confirmPasswordResetInputSchema } from '../../src/features/auth/api/confirm-password-reset';
import { requestPasswordResetInputSchema } from '../../src/features/auth/api/request-password-reset';
import { paths } from '../../src/app/paths';

const issuePaths = (result: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }) =>
  (result.error?.issues ?? []).map((issue) => issue.path.join('.'));

describe('the password reset forms (derived from the shared API schemas)', () => {
  it('when the two new passwords differ, then the second entry is the field in error', () => {
    const result = confirmPasswordResetInputSchema.safeParse({ password: 'long-enough-1', confirmPassword: 'long-enough-2' });
    expect(issuePaths(result)).toEqual(['confirmPassword']);
  });

  it('when the new password is shorter than the API allows, then the form refuses it before sending', () => {
    expect(issuePaths(confirmPasswordResetInputSchema.safeParse({ password: 'short', confirmPassword: 'short' }))).toContain('password');
    expect(confirmPasswordResetInputSchema.safeParse({ password: 'long enough now', confirmPassword: 'long enough now' }).success).toBe(true);
  });

  it('when an address is asked for with capitals and spaces, then it is sent trimmed and lower-cased', () => {
    expect(requestPasswordResetInputSchema.parse({ email: '  Outsider@Alder-Finch.Example ' }).email).toBe('outsider@alder-finch.example');
    expect(issuePaths(requestPasswordResetInputSchema.safeParse({ email: 'not an address' }))).toEqual(['email']);
  });

  it('when a reset link is made for a token with awkward characters, then the page reads the same token back', () => {
    const token = 'a+b/c=d&e';
    const url = new URL(paths.resetPassword.getHref(token), 'http://headroom.test');
    expect(url.pathname).toBe(paths.resetPassword.path);
    expect(url.searchParams.get('token')).toBe(token);
  });
});
