/**
 * Counters of the sign-in and link rate limits, shared by every app process (and every machine)
 * over the one database: with HEADROOM_PROCESSES > 1 (or RATE_LIMIT_STORE=postgres) a limit counted
 * in each process's memory would allow its count once per process. One row per limiter and key,
 * its count and the end of its window; an ended window starts again at 1.
 */
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('rate_limits', (t) => {
    // "<limiter>:<client address>|<e-mail>": bounded by the limiters' own keys (an address and an e-mail of at most 254)
    t.text('key').primary();
    t.integer('hits').notNullable();
    t.timestamp('reset_at', { useTz: true }).notNullable();
  });
  await knex.raw('CREATE INDEX rate_limits_reset_at ON rate_limits (reset_at)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('rate_limits');
}
