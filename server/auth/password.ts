import { randomBytes, scrypt as scryptCb, timingSafeEqual, type ScryptOptions } from 'node:crypto';
import pLimit from 'p-limit';
import { AppError } from '../http/errors';

const scryptRaw = (password: string, salt: Buffer, keylen: number, options: ScryptOptions) =>
  new Promise<Buffer>((resolve, reject) => scryptCb(password, salt, keylen, options, (err, key) => (err ? reject(err) : resolve(key))));

/**
 * At most this many scrypt computations at once. Each takes a thread of libuv's pool (4 threads
 * by default, shared with file and DNS work) and 32 MiB: two leave the rest of the pool free, so a
 * burst of password checks cannot hold up everything else (issue 13 finding 3). A choice.
 */
export const HASH_CONCURRENCY = 2;
/** Waiting hashes beyond this are refused (503) rather than queued without end: 64 × ~50 ms ≈ 2 s of work (a choice). */
export const HASH_QUEUE_LIMIT = 64;
const limit = pLimit(HASH_CONCURRENCY);
const stats = { started: 0, running: 0, mostAtOnce: 0 };
/** How many hashes have started, how many run now and the most that ran at once (for the tests and the load script). */
export const hashStats = () => ({ ...stats });

function scrypt(password: string, salt: Buffer, keylen: number, options: ScryptOptions): Promise<Buffer> {
  if (limit.pendingCount >= HASH_QUEUE_LIMIT) {
    return Promise.reject(new AppError(503, 'RATE_LIMITED', 'The server is busy checking passwords. Try again in a moment; nothing was changed.'));
  }
  return limit(async () => {
    stats.started++;
    stats.running++;
    stats.mostAtOnce = Math.max(stats.mostAtOnce, stats.running);
    try {
      return await scryptRaw(password, salt, keylen, options);
    } finally {
      stats.running--;
    }
  });
}

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

/** The same work as hashing a password, for paths that must cost what the real one costs (timing). */
export async function spendHashTime(password: string): Promise<void> {
  await scrypt(password, randomBytes(16), KEYLEN, { N, r, p, maxmem });
}

export async function verifyPassword(password: string, stored: string | null): Promise<boolean> {
  if (!stored) {
    // same work as a real check, so timing does not tell whether the account exists
    await spendHashTime(password);
    return false;
  }
  const [scheme, n, rr, pp, salt, hash] = stored.split('$');
  if (scheme !== 'scrypt') return false;
  const expected = Buffer.from(hash, 'base64');
  const key = await scrypt(password, Buffer.from(salt, 'base64'), expected.length, { N: Number(n), r: Number(rr), p: Number(pp), maxmem });
  return timingSafeEqual(key, expected);
}
