import type { Knex } from 'knex';

/**
 * A failing revision may be issued only with the designer's acknowledgement of the failure, in
 * their own words: who, when and the statement are kept on the revision (all three or none).
 * The freeze on issued and superseded revisions now covers the acknowledgement and the rest of
 * what an issued summary prints (who issued it, when, its note, the engine version), and, under
 * the service's own checks, the database refuses to issue an incomplete revision or a failing one
 * without its acknowledgement.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('revisions', (t) => {
    t.uuid('failure_ack_by').references('users.id');
    t.timestamp('failure_ack_at', { useTz: true });
    t.text('failure_ack_statement');
  });
  await knex.raw(`
    ALTER TABLE revisions ADD CONSTRAINT revisions_failure_ack_whole CHECK (
      (failure_ack_by IS NULL AND failure_ack_at IS NULL AND failure_ack_statement IS NULL)
      OR (failure_ack_by IS NOT NULL AND failure_ack_at IS NOT NULL AND failure_ack_statement IS NOT NULL)
    );
    ALTER TABLE revisions ADD CONSTRAINT revisions_failure_ack_issued CHECK (failure_ack_by IS NULL OR status <> 'draft');
  `);
  await knex.raw(`
    CREATE OR REPLACE FUNCTION revisions_frozen() RETURNS trigger AS $$
    BEGIN
      IF OLD.status <> 'draft' AND (
        NEW.document IS DISTINCT FROM OLD.document
        OR NEW.analysis IS DISTINCT FROM OLD.analysis
        OR NEW.input_hash IS DISTINCT FROM OLD.input_hash
        OR NEW.engine_version IS DISTINCT FROM OLD.engine_version
        OR NEW.issued_by IS DISTINCT FROM OLD.issued_by
        OR NEW.issued_at IS DISTINCT FROM OLD.issued_at
        OR NEW.note IS DISTINCT FROM OLD.note
        OR NEW.failure_ack_by IS DISTINCT FROM OLD.failure_ack_by
        OR NEW.failure_ack_at IS DISTINCT FROM OLD.failure_ack_at
        OR NEW.failure_ack_statement IS DISTINCT FROM OLD.failure_ack_statement
        OR (NEW.status = 'draft')
      ) THEN
        RAISE EXCEPTION 'revision % is %, its inputs cannot change', OLD.id, OLD.status;
      END IF;
      -- issuing: never an incomplete or unanalysed revision, never a failing one without its acknowledgement
      IF OLD.status = 'draft' AND NEW.status <> 'draft' THEN
        IF (NEW.analysis->>'ok') IS DISTINCT FROM 'true' OR NEW.analysis->'analysis'->'verdict'->>'status' = 'incomplete' THEN
          RAISE EXCEPTION 'revision % is incomplete; it cannot be issued', OLD.id;
        END IF;
        IF NEW.analysis->'analysis'->'verdict'->>'status' = 'fail' AND NEW.failure_ack_statement IS NULL THEN
          RAISE EXCEPTION 'revision % fails; it is issued only with an acknowledgement', OLD.id;
        END IF;
      END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE OR REPLACE FUNCTION revisions_frozen() RETURNS trigger AS $$
    BEGIN
      IF OLD.status <> 'draft' AND (NEW.document IS DISTINCT FROM OLD.document OR NEW.analysis IS DISTINCT FROM OLD.analysis OR NEW.input_hash IS DISTINCT FROM OLD.input_hash) THEN
        RAISE EXCEPTION 'revision % is %, its inputs cannot change', OLD.id, OLD.status;
      END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql;
  `);
  await knex.raw(
    'ALTER TABLE revisions DROP CONSTRAINT IF EXISTS revisions_failure_ack_issued; ALTER TABLE revisions DROP CONSTRAINT IF EXISTS revisions_failure_ack_whole;',
  );
  await knex.schema.alterTable('revisions', (t) => {
    t.dropColumn('failure_ack_statement');
    t.dropColumn('failure_ack_at');
    t.dropColumn('failure_ack_by');
  });
}
