import type { Tx } from '../db/rows';

export interface RateLimitCount {
  hits: number;
  resetAt: Date;
}

/** The shared counters of the rate limits (table rate_limits); the database's clock decides the windows. */
export const rateLimitsRepo = {
  /** One more hit for `key`; a window that has ended starts again at 1 and ends `windowMs` from now. */
  async increment(db: Tx, key: string, windowMs: number): Promise<RateLimitCount> {
    const { rows } = await db.raw(
      `INSERT INTO rate_limits (key, hits, reset_at) VALUES (?, 1, now() + (? * interval '1 millisecond'))
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN rate_limits.reset_at <= now() THEN 1 ELSE rate_limits.hits + 1 END,
         reset_at = CASE WHEN rate_limits.reset_at <= now() THEN excluded.reset_at ELSE rate_limits.reset_at END
       RETURNING hits, reset_at`,
      [key, windowMs],
    );
    return { hits: rows[0].hits as number, resetAt: rows[0].reset_at as Date };
  },
  /** One hit fewer (a request that the limiter decided not to count after all, e.g. a successful sign-in). */
  async decrement(db: Tx, key: string): Promise<void> {
    await db('rate_limits').where({ key }).where('reset_at', '>', db.fn.now()).where('hits', '>', 0).decrement('hits', 1);
  },
  async get(db: Tx, key: string): Promise<RateLimitCount | undefined> {
    const row = await db('rate_limits').where({ key }).where('reset_at', '>', db.fn.now()).first('hits', 'reset_at');
    return row ? { hits: row.hits, resetAt: row.reset_at } : undefined;
  },
  async reset(db: Tx, key: string): Promise<void> {
    await db('rate_limits').where({ key }).delete();
  },
  /** Removes the counters whose window has ended; returns how many. */
  prune: (db: Tx): Promise<number> => db('rate_limits').where('reset_at', '<=', db.fn.now()).delete(),
};
