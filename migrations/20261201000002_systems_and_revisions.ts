import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('systems', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('project_id').notNullable().references('projects.id').onDelete('CASCADE');
    t.text('name').notNullable();
    t.text('service').notNullable().checkIn(['cold', 'hot']);
    t.uuid('created_by').references('users.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['project_id']);
  });

  await knex.schema.createTable('revisions', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('system_id').notNullable().references('systems.id').onDelete('CASCADE');
    t.integer('number').notNullable();
    t.text('status').notNullable().defaultTo('draft').checkIn(['draft', 'issued', 'superseded']);
    // the system document as validated JSON, and the server's analysis of it (same engine as the client)
    t.jsonb('document').notNullable();
    t.jsonb('analysis').notNullable();
    t.text('engine_version').notNullable();
    t.integer('version').notNullable().defaultTo(1);
    t.text('input_hash');
    t.text('note');
    t.uuid('created_by').references('users.id');
    t.uuid('issued_by').references('users.id');
    t.timestamp('issued_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['system_id', 'number']);
  });
  // at most one draft per system
  await knex.raw(`CREATE UNIQUE INDEX revisions_one_draft ON revisions (system_id) WHERE status = 'draft'`);
  // issued and superseded revisions never change their document (belt and braces under the service's checks)
  await knex.raw(`
    CREATE FUNCTION revisions_frozen() RETURNS trigger AS $$
    BEGIN
      IF OLD.status <> 'draft' AND (NEW.document IS DISTINCT FROM OLD.document OR NEW.analysis IS DISTINCT FROM OLD.analysis OR NEW.input_hash IS DISTINCT FROM OLD.input_hash) THEN
        RAISE EXCEPTION 'revision % is %, its inputs cannot change', OLD.id, OLD.status;
      END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql;
    CREATE TRIGGER revisions_frozen BEFORE UPDATE ON revisions FOR EACH ROW EXECUTE FUNCTION revisions_frozen();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS revisions_frozen ON revisions; DROP FUNCTION IF EXISTS revisions_frozen();');
  await knex.schema.dropTableIfExists('revisions');
  await knex.schema.dropTableIfExists('systems');
}
