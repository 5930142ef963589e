import type { Knex } from 'knex';

/**
 * "Forgot my password" links (issue 7). Kept apart from invitations: an invitation activates an
 * account an administrator made, a reset link is asked for by anyone who types an e-mail address,
 * and the two must never open each other's door.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('password_resets', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    // only a SHA-256 of the token is stored: a database leak reveals no usable link
    t.text('token_hash').notNullable().unique();
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('used_at', { useTz: true });
    // the client address the request came from, for the account owner's or an administrator's inquiry
    t.text('requested_from');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['user_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('password_resets');
}
