/**
 * What a new password must not be, beyond the length the shared schema checks (issue 13 finding
 * 7): one of the commonest passwords, or the account's own e-mail address (or its part before
 * the @). The list is the "passwords-common" dictionary of @zxcvbn-ts/language-common (about
 * 49,000 passwords most found in published breach corpora, as the zxcvbn estimator ships them).
 * NIST SP 800-63B §5.1.1.2 asks verifiers to refuse values "commonly-used, expected, or compromised".
 */
import { dictionary } from '@zxcvbn-ts/language-common';
import { AppError } from '../http/errors';

let common: Set<string> | null = null;
const commonPasswords = () => (common ??= new Set(dictionary['passwords-common'].map((p) => p.toLowerCase())));

const normalise = (s: string) => s.normalize('NFKC').trim().toLowerCase();

/** The reason `password` is refused for the account `email`, or null when it may be used. */
export function passwordProblem(password: string, email: string): string | null {
  const p = normalise(password);
  const e = normalise(email);
  if (p === e || p === e.split('@')[0]) return 'Do not use your e-mail address as your password';
  if (commonPasswords().has(p)) return 'This is one of the most common passwords; choose another';
  return null;
}

/** Refuses (400, naming `password`) a password that `passwordProblem` rejects. */
export function assertAcceptablePassword(password: string, email: string): void {
  const problem = passwordProblem(password, email);
  if (problem) throw new AppError(400, 'VALIDATION_FAILED', 'Choose a different password.', { password: problem });
}
