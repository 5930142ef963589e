import type { Knex } from 'knex';

/**
 * One submission for a building: several systems of a project (cold, hot, each zone) sent to the
 * inspector together. The package groups one review per system revision and inspector (so the
 * comments stay per system); its e-mail carries one PDF per system (the first in
 * attachment_summary_id, the others in extra_summary_ids, in the order sent).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('submission_packages', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('project_id').notNullable().references('projects.id').onDelete('CASCADE');
    t.uuid('sent_by').references('users.id').onDelete('SET NULL');
    t.jsonb('revision_ids').notNullable();
    t.text('message').notNullable().defaultTo('');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['project_id']);
  });
  await knex.schema.alterTable('reviews', (t) => {
    t.uuid('package_id').references('submission_packages.id').onDelete('SET NULL');
  });
  await knex.schema.alterTable('outbox', (t) => {
    t.specificType('extra_summary_ids', 'uuid[]');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('outbox', (t) => t.dropColumn('extra_summary_ids'));
  await knex.schema.alterTable('reviews', (t) => t.dropColumn('package_id'));
  await knex.schema.dropTableIfExists('submission_packages');
}
