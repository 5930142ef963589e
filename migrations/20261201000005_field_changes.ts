import type { Knex } from 'knex';

/**
 * Field changes (a contractor's proposed substitution on an issued revision), their attachments
 * (product data sheets and photos, bytes in PostgreSQL), the link from a revision to the field
 * change it came from, and the outbox's new kind of message.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('field_changes', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('project_id').notNullable().references('projects.id').onDelete('CASCADE');
    t.uuid('system_id').notNullable().references('systems.id').onDelete('CASCADE');
    // the issued revision the change was started on
    t.uuid('base_revision_id').notNullable().references('revisions.id').onDelete('CASCADE');
    // numbered per system: "field change 3"
    t.integer('number').notNullable();
    t.text('title').notNullable();
    t.text('description').notNullable().defaultTo('');
    t.text('status').notNullable().defaultTo('draft').checkIn(['draft', 'proposed', 'accepted', 'declined']);
    // the contractor's copy of the issued system document (validated JSON) and the server's analysis of it
    t.jsonb('document').notNullable();
    t.jsonb('analysis').notNullable();
    t.text('engine_version').notNullable();
    t.integer('version').notNullable().defaultTo(1);
    t.uuid('created_by').notNullable().references('users.id');
    t.timestamp('proposed_at', { useTz: true });
    t.uuid('decided_by').references('users.id');
    t.timestamp('decided_at', { useTz: true });
    t.text('decline_reason');
    t.uuid('accepted_revision_id').references('revisions.id').onDelete('SET NULL');
    // what the issued summary prints about the change (who, what, when), frozen at acceptance
    t.jsonb('record');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['system_id', 'number']);
    t.index(['project_id', 'status']);
  });
  // a proposed, accepted or declined field change keeps its document; a decided one keeps its state
  await knex.raw(`
    CREATE FUNCTION field_changes_frozen() RETURNS trigger AS $$
    BEGIN
      IF OLD.status <> 'draft' AND NEW.document IS DISTINCT FROM OLD.document THEN
        RAISE EXCEPTION 'field change % is %, its document cannot change', OLD.id, OLD.status;
      END IF;
      IF OLD.status IN ('accepted', 'declined') AND (NEW.status IS DISTINCT FROM OLD.status OR NEW.record IS DISTINCT FROM OLD.record) THEN
        RAISE EXCEPTION 'field change % is %, it cannot change', OLD.id, OLD.status;
      END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql;
    CREATE TRIGGER field_changes_frozen BEFORE UPDATE ON field_changes FOR EACH ROW EXECUTE FUNCTION field_changes_frozen();
  `);

  await knex.schema.createTable('field_change_attachments', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('field_change_id').notNullable().references('field_changes.id').onDelete('CASCADE');
    t.uuid('project_id').notNullable().references('projects.id').onDelete('CASCADE');
    // sanitised (server/http/upload.ts); the extension matches the detected type
    t.text('file_name').notNullable();
    // detected from the content's first bytes, never taken from the name or the declared type
    t.text('content_type').notNullable().checkIn(['application/pdf', 'image/jpeg', 'image/png']);
    t.integer('byte_length').notNullable();
    t.text('sha256').notNullable();
    t.binary('content').notNullable();
    t.uuid('uploaded_by').notNullable().references('users.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['field_change_id']);
  });

  await knex.schema.alterTable('revisions', (t) => {
    // the accepted field change this revision was made from (its history)
    t.uuid('field_change_id').references('field_changes.id').onDelete('SET NULL');
  });

  await knex.schema.alterTable('outbox', (t) => {
    t.uuid('field_change_id').references('field_changes.id').onDelete('CASCADE');
  });
  await replaceOutboxKinds(knex, ['summary', 'invitation', 'password-reset', 'field-change']);
}

/** The kind check was made unnamed by knex's checkIn: find it by its column and replace it. */
async function replaceOutboxKinds(knex: Knex, kinds: string[]) {
  const { rows } = await knex.raw(
    `SELECT conname FROM pg_constraint WHERE conrelid = 'outbox'::regclass AND contype = 'c' AND pg_get_constraintdef(oid) LIKE '%kind%'`,
  );
  for (const r of rows as { conname: string }[]) await knex.raw('ALTER TABLE outbox DROP CONSTRAINT ??', [r.conname]);
  // DDL takes no bind parameters: the kinds are this file's own constants, checked to be plain words
  if (!kinds.every((k) => /^[a-z-]+$/.test(k))) throw new Error('outbox kinds must be plain words');
  await knex.raw(`ALTER TABLE outbox ADD CONSTRAINT outbox_kind_check CHECK (kind IN (${kinds.map((k) => `'${k}'`).join(', ')}))`);
}

export async function down(knex: Knex): Promise<void> {
  await knex('outbox').where({ kind: 'field-change' }).delete();
  await replaceOutboxKinds(knex, ['summary', 'invitation', 'password-reset']);
  await knex.schema.alterTable('outbox', (t) => t.dropColumn('field_change_id'));
  await knex.schema.alterTable('revisions', (t) => t.dropColumn('field_change_id'));
  await knex.schema.dropTableIfExists('field_change_attachments');
  await knex.raw('DROP TRIGGER IF EXISTS field_changes_frozen ON field_changes; DROP FUNCTION IF EXISTS field_changes_frozen();');
  await knex.schema.dropTableIfExists('field_changes');
}
