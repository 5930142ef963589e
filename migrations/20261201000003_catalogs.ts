import type { Knex } from 'knex';

/**
 * Catalogs: materials with sizes and inside diameters, fitting types with their K data, fixture
 * types with fixture units and minimum pressures, device templates. Each row names its published
 * source. project_id is null for the seeded rows; a project's own custom entries carry its id.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('catalog_entries', (t) => {
    t.bigIncrements('row_id');
    t.text('kind').notNullable().checkIn(['material', 'fitting-type', 'fixture-type', 'device-template']);
    t.text('id').notNullable();
    t.uuid('project_id').references('projects.id').onDelete('CASCADE');
    t.text('label').notNullable();
    t.text('source').notNullable();
    t.boolean('from_memory').notNullable().defaultTo(false);
    t.jsonb('data').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(`CREATE UNIQUE INDEX catalog_entries_unique ON catalog_entries (kind, id, coalesce(project_id, '00000000-0000-0000-0000-000000000000'))`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('catalog_entries');
}
