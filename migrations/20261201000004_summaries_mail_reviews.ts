import type { Knex } from 'knex';

/**
 * Issued summaries (the PDF of an issued revision), the e-mail outbox, the development mail
 * catcher, and the inspectors' reviews.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('summaries', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('revision_id').notNullable().unique().references('revisions.id').onDelete('CASCADE');
    t.uuid('project_id').notNullable().references('projects.id').onDelete('CASCADE');
    t.text('status').notNullable().defaultTo('pending').checkIn(['pending', 'ready', 'failed']);
    // what the page header prints (project, address, preparer, ...), frozen at issue time so a
    // later rename of the project does not change an issued document
    t.jsonb('header').notNullable();
    t.binary('pdf');
    t.text('sha256');
    t.integer('byte_length');
    t.integer('page_count');
    t.integer('generation_ms');
    t.text('error');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('ready_at', { useTz: true });
  });
  // a ready summary never changes (belt and braces under the service, like revisions_frozen)
  await knex.raw(`
    CREATE FUNCTION summaries_frozen() RETURNS trigger AS $$
    BEGIN
      IF OLD.status = 'ready' AND (NEW.pdf IS DISTINCT FROM OLD.pdf OR NEW.sha256 IS DISTINCT FROM OLD.sha256 OR NEW.status IS DISTINCT FROM OLD.status OR NEW.header IS DISTINCT FROM OLD.header) THEN
        RAISE EXCEPTION 'summary % is issued, its PDF cannot change', OLD.id;
      END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql;
    CREATE TRIGGER summaries_frozen BEFORE UPDATE ON summaries FOR EACH ROW EXECUTE FUNCTION summaries_frozen();
  `);

  await knex.schema.createTable('outbox', (t) => {
    // the id is also the message's Message-ID (<id@host>), so a re-send after a crash is recognisable
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('kind').notNullable().checkIn(['summary', 'invitation', 'password-reset']);
    t.uuid('project_id').references('projects.id').onDelete('CASCADE');
    t.uuid('revision_id').references('revisions.id').onDelete('CASCADE');
    t.uuid('recipient_user_id').references('users.id').onDelete('SET NULL');
    t.text('to_address').notNullable();
    t.text('to_name').notNullable().defaultTo('');
    t.text('subject').notNullable();
    // the body may hold {{secret_url}}: a one-time link kept apart and erased once the message is sent
    t.text('text_body').notNullable();
    t.text('secret_url');
    t.uuid('attachment_summary_id').references('summaries.id').onDelete('SET NULL');
    t.text('status').notNullable().defaultTo('queued').checkIn(['queued', 'sending', 'sent', 'failed']);
    t.integer('attempts').notNullable().defaultTo(0);
    t.integer('max_attempts').notNullable();
    t.timestamp('next_attempt_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text('lease_owner');
    t.timestamp('lease_until', { useTz: true });
    t.text('last_error');
    t.text('smtp_response');
    t.timestamp('sent_at', { useTz: true });
    t.uuid('created_by').references('users.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['revision_id']);
  });
  await knex.raw(`CREATE INDEX outbox_due ON outbox (next_attempt_at) WHERE status IN ('queued', 'sending')`);

  await knex.schema.createTable('dev_mail', (t) => {
    t.bigIncrements('id');
    t.text('envelope_from').notNullable().defaultTo('');
    t.jsonb('envelope_to').notNullable().defaultTo('[]');
    t.text('message_id');
    t.text('subject').notNullable().defaultTo('');
    t.binary('raw').notNullable();
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.createTable('reviews', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('project_id').notNullable().references('projects.id').onDelete('CASCADE');
    t.uuid('revision_id').notNullable().references('revisions.id').onDelete('CASCADE');
    t.uuid('reviewer_id').notNullable().references('users.id').onDelete('CASCADE');
    t.uuid('sent_by').references('users.id');
    t.text('status').notNullable().defaultTo('received').checkIn(['received', 'accepted', 'returned']);
    t.text('comment').notNullable().defaultTo('');
    t.integer('version').notNullable().defaultTo(1);
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('decided_at', { useTz: true });
    t.unique(['revision_id', 'reviewer_id']);
    t.index(['reviewer_id']);
  });

  await knex.schema.createTable('review_comments', (t) => {
    t.bigIncrements('id');
    t.uuid('review_id').notNullable().references('reviews.id').onDelete('CASCADE');
    t.text('item_type').notNullable().checkIn(['segment', 'fixture', 'device', 'node', 'input', 'general']);
    t.text('item_id');
    t.text('comment').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['review_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['review_comments', 'reviews', 'dev_mail', 'outbox']) await knex.schema.dropTableIfExists(table);
  await knex.raw('DROP TRIGGER IF EXISTS summaries_frozen ON summaries; DROP FUNCTION IF EXISTS summaries_frozen();');
  await knex.schema.dropTableIfExists('summaries');
}
