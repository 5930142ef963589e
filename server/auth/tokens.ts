import { createHash, randomBytes } from 'node:crypto';

/** A one-time link token: 32 random bytes for the person, only its SHA-256 in the database. */
export function newToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, tokenHash: hashToken(token) };
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}
