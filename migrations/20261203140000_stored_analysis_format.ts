import type { Knex } from 'knex';

/**
 * The stored analysis gets a format number (server/services/storedAnalysis.ts): format 1 keeps the
 * engine's outcome under `result`; rows written before (format 0) keep it at the top and are never
 * rewritten (an issued revision's analysis never changes). The issue rules of the revisions trigger
 * read the outcome from where each format keeps it; the freeze rules are unchanged.
 */
const OUTCOME = `(CASE WHEN NEW.analysis->'analysisFormat' IS NOT NULL THEN NEW.analysis->'result' ELSE NEW.analysis END)`;
const issueRules = (outcome: string) => `
    -- issuing: never an incomplete or unanalysed revision, never a failing one without its acknowledgement
    IF OLD.status = 'draft' AND NEW.status <> 'draft' THEN
      IF (${outcome}->>'ok') IS DISTINCT FROM 'true' OR ${outcome}->'analysis'->'verdict'->>'status' = 'incomplete' THEN
        RAISE EXCEPTION 'revision % is incomplete; it cannot be issued', OLD.id;
      END IF;
      IF ${outcome}->'analysis'->'verdict'->>'status' = 'fail' AND NEW.failure_ack_statement IS NULL THEN
        RAISE EXCEPTION 'revision % fails; it is issued only with an acknowledgement', OLD.id;
      END IF;
    END IF;`;

const functionWith = (rules: string) => `
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
${rules}
    RETURN NEW;
  END $$ LANGUAGE plpgsql;
`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(functionWith(issueRules(OUTCOME)));
}

export async function down(knex: Knex): Promise<void> {
  // the rules as 20261202400000 wrote them: the outcome at the top of the stored analysis
  await knex.raw(functionWith(issueRules('NEW.analysis')));
}
