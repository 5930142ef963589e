import type { Knex } from 'knex';

/**
 * A draft's stored analysis may now be its verdict only (format 2, server/services/storedAnalysis.ts);
 * issuing writes the whole analysis (format 1). The issue rules of the revisions trigger read the
 * verdict of a format 2 value too (an incomplete or failing draft is refused with the same words
 * as before), and refuse to issue a row whose stored analysis is a verdict only: an issued revision
 * always keeps the whole analysis it was issued on. The freeze rules are unchanged.
 */
const OUTCOME = `(CASE WHEN NEW.analysis->'analysisFormat' IS NOT NULL THEN NEW.analysis->'result' ELSE NEW.analysis END)`;
const VERDICT_ONLY = `(NEW.analysis->>'analysisFormat' = '2')`;
const OK = `(CASE WHEN ${VERDICT_ONLY} THEN NEW.analysis->'verdict'->>'ok' ELSE ${OUTCOME}->>'ok' END)`;
const STATUS = `(CASE WHEN ${VERDICT_ONLY} THEN NEW.analysis->'verdict'->>'status' ELSE ${OUTCOME}->'analysis'->'verdict'->>'status' END)`;

const issueRules = (ok: string, status: string, verdictOnly: string | null) => `
    -- issuing: never an incomplete or unanalysed revision, never a failing one without its acknowledgement
    IF OLD.status = 'draft' AND NEW.status <> 'draft' THEN
      IF ${ok} IS DISTINCT FROM 'true' OR ${status} = 'incomplete' THEN
        RAISE EXCEPTION 'revision % is incomplete; it cannot be issued', OLD.id;
      END IF;
      IF ${status} = 'fail' AND NEW.failure_ack_statement IS NULL THEN
        RAISE EXCEPTION 'revision % fails; it is issued only with an acknowledgement', OLD.id;
      END IF;${
        verdictOnly
          ? `
      IF ${verdictOnly} THEN
        RAISE EXCEPTION 'revision % holds its verdict only; it is issued with its whole analysis', OLD.id;
      END IF;`
          : ''
      }
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
  await knex.raw(functionWith(issueRules(OK, STATUS, VERDICT_ONLY)));
}

export async function down(knex: Knex): Promise<void> {
  // the rules as 20261203140000 wrote them
  await knex.raw(functionWith(issueRules(`${OUTCOME}->>'ok'`, `${OUTCOME}->'analysis'->'verdict'->>'status'`, null)));
}
