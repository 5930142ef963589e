import type { Knex } from 'knex';

/**
 * The review loop: the designer answers each comment of a returned review with a reply (frozen once
 * the next revision is issued), the returned review remembers the revision that answered it, and an
 * accepted review keeps its printable acceptance record (a one-page PDF that never changes).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('review_comments', (t) => {
    t.text('reply');
    t.uuid('replied_by').references('users.id').onDelete('SET NULL');
    t.timestamp('replied_at', { useTz: true });
  });
  await knex.schema.alterTable('reviews', (t) => {
    // set in the transaction that issues the next revision of the system: from then on the replies are frozen
    t.uuid('answered_in_revision_id').references('revisions.id').onDelete('SET NULL');
    t.index(['answered_in_revision_id']);
  });
  await knex.schema.createTable('acceptance_records', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('review_id').notNullable().unique().references('reviews.id').onDelete('CASCADE');
    t.uuid('project_id').notNullable().references('projects.id').onDelete('CASCADE');
    t.uuid('revision_id').notNullable().references('revisions.id').onDelete('CASCADE');
    t.text('file_name').notNullable();
    t.binary('pdf').notNullable();
    t.text('sha256').notNullable();
    t.integer('byte_length').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  // a stored record never changes (like a ready summary)
  await knex.raw(`
    CREATE FUNCTION acceptance_records_frozen() RETURNS trigger AS $$
    BEGIN
      RAISE EXCEPTION 'acceptance record % is stored, it cannot change', OLD.id;
    END $$ LANGUAGE plpgsql;
    CREATE TRIGGER acceptance_records_frozen BEFORE UPDATE ON acceptance_records FOR EACH ROW EXECUTE FUNCTION acceptance_records_frozen();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS acceptance_records_frozen ON acceptance_records; DROP FUNCTION IF EXISTS acceptance_records_frozen();');
  await knex.schema.dropTableIfExists('acceptance_records');
  await knex.schema.alterTable('reviews', (t) => {
    t.dropIndex(['answered_in_revision_id']);
    t.dropColumn('answered_in_revision_id');
  });
  await knex.schema.alterTable('review_comments', (t) => {
    t.dropColumn('reply');
    t.dropColumn('replied_by');
    t.dropColumn('replied_at');
  });
}
