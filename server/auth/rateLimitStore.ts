import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import type { Db } from '../db/knex';
import { rateLimitsRepo } from '../repositories/rateLimits';

/**
 * An express-rate-limit store that counts in PostgreSQL (table rate_limits), so that every app
 * process — and every machine on the one database — sees the same count: with N processes a
 * limit counted in memory would allow N times its number. Each limiter has its own store and
 * prefix. Ended windows are pruned now and then by the process that notices them.
 */
export class PostgresRateLimitStore implements Store {
  /** the counters are not in this process: express-rate-limit must not assume they are */
  localKeys = false;
  private windowMs = 60_000;
  private lastPrune = 0;

  constructor(
    private readonly db: Db,
    readonly prefix: string,
  ) {}

  init(options: Options) {
    this.windowMs = options.windowMs;
  }

  private key(key: string) {
    return `${this.prefix}:${key}`;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const row = await rateLimitsRepo.get(this.db, this.key(key));
    return row ? { totalHits: row.hits, resetTime: row.resetAt } : undefined;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const row = await rateLimitsRepo.increment(this.db, this.key(key), this.windowMs);
    // at most once a window per process: ended windows go (a choice: the table stays the size of one window's clients)
    if (Date.now() - this.lastPrune > this.windowMs) {
      this.lastPrune = Date.now();
      void rateLimitsRepo.prune(this.db).catch(() => {});
    }
    return { totalHits: row.hits, resetTime: row.resetAt };
  }

  async decrement(key: string): Promise<void> {
    await rateLimitsRepo.decrement(this.db, this.key(key));
  }

  async resetKey(key: string): Promise<void> {
    await rateLimitsRepo.reset(this.db, this.key(key));
  }
}
