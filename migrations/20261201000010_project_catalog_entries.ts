import type { Knex } from 'knex';

/**
 * A project's own catalog entries are edited by its designers: each row gets an optimistic
 * version, when it last changed and who added it. Seeded rows (project_id null) keep version 1.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('catalog_entries', (t) => {
    t.integer('version').notNullable().defaultTo(1);
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.uuid('created_by').references('users.id').onDelete('SET NULL');
  });
  await knex.raw('CREATE INDEX catalog_entries_project ON catalog_entries (project_id) WHERE project_id IS NOT NULL');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP INDEX IF EXISTS catalog_entries_project');
  await knex.schema.alterTable('catalog_entries', (t) => {
    t.dropColumn('created_by');
    t.dropColumn('updated_at');
    t.dropColumn('version');
  });
}
