import type { Knex } from 'knex';

/**
 * Issue 13 finding 7: an issued (or superseded) revision and a decided (accepted or declined)
 * field change are frozen whole in the database, not only their document and analysis. Allowed
 * after issue: a revision's status from issued to superseded (with its updated_at), and a
 * reference cleared by ON DELETE SET NULL when what it points to is removed.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE OR REPLACE FUNCTION revisions_frozen() RETURNS trigger AS $$
    BEGIN
      IF OLD.status <> 'draft' THEN
        IF NEW.status IS DISTINCT FROM OLD.status AND NOT (OLD.status = 'issued' AND NEW.status = 'superseded') THEN
          RAISE EXCEPTION 'revision % is %, its status cannot become %', OLD.id, OLD.status, NEW.status;
        END IF;
        IF NEW.field_change_id IS NOT NULL AND NEW.field_change_id IS DISTINCT FROM OLD.field_change_id THEN
          RAISE EXCEPTION 'revision % is %, it cannot change', OLD.id, OLD.status;
        END IF;
        IF (to_jsonb(NEW) - 'status' - 'updated_at' - 'field_change_id') IS DISTINCT FROM (to_jsonb(OLD) - 'status' - 'updated_at' - 'field_change_id') THEN
          RAISE EXCEPTION 'revision % is %, it cannot change', OLD.id, OLD.status;
        END IF;
      END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql;

    CREATE OR REPLACE FUNCTION field_changes_frozen() RETURNS trigger AS $$
    BEGIN
      IF OLD.status <> 'draft' AND NEW.document IS DISTINCT FROM OLD.document THEN
        RAISE EXCEPTION 'field change % is %, its document cannot change', OLD.id, OLD.status;
      END IF;
      IF OLD.status IN ('accepted', 'declined') THEN
        IF NEW.accepted_revision_id IS NOT NULL AND NEW.accepted_revision_id IS DISTINCT FROM OLD.accepted_revision_id THEN
          RAISE EXCEPTION 'field change % is %, it cannot change', OLD.id, OLD.status;
        END IF;
        IF (to_jsonb(NEW) - 'accepted_revision_id') IS DISTINCT FROM (to_jsonb(OLD) - 'accepted_revision_id') THEN
          RAISE EXCEPTION 'field change % is %, it cannot change', OLD.id, OLD.status;
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

    CREATE OR REPLACE FUNCTION field_changes_frozen() RETURNS trigger AS $$
    BEGIN
      IF OLD.status <> 'draft' AND NEW.document IS DISTINCT FROM OLD.document THEN
        RAISE EXCEPTION 'field change % is %, its document cannot change', OLD.id, OLD.status;
      END IF;
      IF OLD.status IN ('accepted', 'declined') AND (NEW.status IS DISTINCT FROM OLD.status OR NEW.record IS DISTINCT FROM OLD.record) THEN
        RAISE EXCEPTION 'field change % is %, it cannot change', OLD.id, OLD.status;
      END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql;
  `);
}
