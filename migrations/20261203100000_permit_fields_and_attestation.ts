import type { Knex } from 'knex';

/**
 * The submission's identity on the project (permit or plan-check number, the code adopted and its
 * local amendments, the preparer's licence and its jurisdiction) as one JSON object, and the
 * preparer's attestation at issue on the revision: who confirmed it, the name and licence number
 * as they were confirmed, the statement, and when (all or none). Like the rest of what an issued
 * summary prints, an attestation never changes once its revision is issued.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('projects', (t) => {
    t.jsonb('permit').notNullable().defaultTo(knex.raw(`'{}'::jsonb`));
  });
  await knex.schema.alterTable('revisions', (t) => {
    t.uuid('attestation_by').references('users.id');
    t.text('attestation_name');
    t.text('attestation_licence');
    t.text('attestation_statement');
    t.timestamp('attestation_at', { useTz: true });
  });
  await knex.raw(`
    ALTER TABLE revisions ADD CONSTRAINT revisions_attestation_whole CHECK (
      (attestation_by IS NULL AND attestation_name IS NULL AND attestation_licence IS NULL AND attestation_statement IS NULL AND attestation_at IS NULL)
      OR (attestation_by IS NOT NULL AND attestation_name IS NOT NULL AND attestation_licence IS NOT NULL AND attestation_statement IS NOT NULL AND attestation_at IS NOT NULL)
    );
    ALTER TABLE revisions ADD CONSTRAINT revisions_attestation_issued CHECK (attestation_by IS NULL OR status <> 'draft');
  `);
  await knex.raw(`
    CREATE OR REPLACE FUNCTION revisions_attestation_frozen() RETURNS trigger AS $$
    BEGIN
      IF OLD.status <> 'draft' AND (
        NEW.attestation_by IS DISTINCT FROM OLD.attestation_by
        OR NEW.attestation_name IS DISTINCT FROM OLD.attestation_name
        OR NEW.attestation_licence IS DISTINCT FROM OLD.attestation_licence
        OR NEW.attestation_statement IS DISTINCT FROM OLD.attestation_statement
        OR NEW.attestation_at IS DISTINCT FROM OLD.attestation_at
      ) THEN
        RAISE EXCEPTION 'revision % is %, its attestation cannot change', OLD.id, OLD.status;
      END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql;
    CREATE TRIGGER revisions_attestation_frozen BEFORE UPDATE ON revisions FOR EACH ROW EXECUTE FUNCTION revisions_attestation_frozen();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS revisions_attestation_frozen ON revisions; DROP FUNCTION IF EXISTS revisions_attestation_frozen();');
  await knex.raw(
    'ALTER TABLE revisions DROP CONSTRAINT IF EXISTS revisions_attestation_issued; ALTER TABLE revisions DROP CONSTRAINT IF EXISTS revisions_attestation_whole;',
  );
  await knex.schema.alterTable('revisions', (t) => {
    t.dropColumn('attestation_at');
    t.dropColumn('attestation_statement');
    t.dropColumn('attestation_licence');
    t.dropColumn('attestation_name');
    t.dropColumn('attestation_by');
  });
  await knex.schema.alterTable('projects', (t) => t.dropColumn('permit'));
}
