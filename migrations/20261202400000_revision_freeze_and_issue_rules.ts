import type { Knex } from 'knex';

/**
 * One trigger function for revisions, holding both rules that two earlier migrations each wrote
 * into it (the later one replaced the earlier): an issued or superseded revision is frozen whole
 * (only issued → superseded may change), and, under the service's own checks, a revision is never
 * issued while incomplete or unanalysed, nor failing without the designer's acknowledgement.
 */
const ISSUE_RULES = `
    -- issuing: never an incomplete or unanalysed revision, never a failing one without its acknowledgement
    IF OLD.status = 'draft' AND NEW.status <> 'draft' THEN
      IF (NEW.analysis->>'ok') IS DISTINCT FROM 'true' OR NEW.analysis->'analysis'->'verdict'->>'status' = 'incomplete' THEN
        RAISE EXCEPTION 'revision % is incomplete; it cannot be issued', OLD.id;
      END IF;
      IF NEW.analysis->'analysis'->'verdict'->>'status' = 'fail' AND NEW.failure_ack_statement IS NULL THEN
        RAISE EXCEPTION 'revision % fails; it is issued only with an acknowledgement', OLD.id;
      END IF;
    END IF;`;

const functionWith = (issueRules: string) => `
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
${issueRules}
    RETURN NEW;
  END $$ LANGUAGE plpgsql;
`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(functionWith(ISSUE_RULES));
}

export async function down(knex: Knex): Promise<void> {
  // The function as the freeze migration (20261202200000) left it: the issue rules go.
  await knex.raw(functionWith(''));
}
