import { randomBytes, scrypt as scryptCb, timingSafeEqual, type ScryptOptions } from 'node:crypto';

const scrypt = (password: string, salt: Buffer, keylen: number, options: ScryptOptions) =>
  new Promise<Buffer>((resolve, reject) =>
    scryptCb(password, salt, keylen, options, (err, key) => (err ? reject(err) : resolve(key))),
  );

// scrypt parameters N=2^15, r=8, p=1: the OWASP Password Storage Cheat Sheet's minimum for scrypt.
const N = 2 ** 15;
const r = 8;
const p = 1;
const KEYLEN = 32;
const maxmem = 64 * 1024 * 1024;

/** `scrypt$N$r$p$salt$hash` (base64): self-describing, so parameters can be raised later. */
export async function hashPassword(password: string): Promise<string> {
  const salt = randomBytes(16);
  const key = await scrypt(password, salt, KEYLEN, { N, r, p, maxmem });
  return ['scrypt', N, r, p, salt.toString('base64'), key.toString('base64')].join('$');
}

export async function verifyPassword(password: string, stored: string | null): Promise<boolean> {
  if (!stored) {
    // same work as a real check, so timing does not tell whether the account exists
    await scrypt(password, randomBytes(16), KEYLEN, { N, r, p, maxmem });
    return false;
  }
  const [scheme, n, rr, pp, salt, hash] = stored.split('$');
  if (scheme !== 'scrypt') return false;
  const expected = Buffer.from(hash, 'base64');
  const key = await scrypt(password, Buffer.from(salt, 'base64'), expected.length, { N: Number(n), r: Number(rr), p: Number(pp), maxmem });
  return timingSafeEqual(key, expected);
}
