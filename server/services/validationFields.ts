/**
 * A validation failure as the API reports it: field path → message, a bounded number of fields,
 * and a note of how many more there were. Used by the HTTP layer's body checks and by services that
 * validate a stored or sent document themselves.
 */
import type { ZodError } from 'zod';

/** One validation problem: where (a path) and what, as zod words it. */
export interface Issue {
  code: string;
  path: readonly PropertyKey[];
  message: string;
}

/** At most this many fields are named in one answer (a choice: a form shows a handful; the rest follow once those are fixed). */
export const MAX_REPORTED_FIELDS = 20;
/** A field's message is cut to this many characters (zod's unknown-key message lists every key). */
const MAX_MESSAGE_LENGTH = 200;
/** The key under which an answer says how many more problems there were. */
export const MORE_FIELDS_KEY = '(more)';

/**
 * Field path (dot-joined) → the first message for it, for at most MAX_REPORTED_FIELDS fields; when
 * there were more (or validation stopped before looking further), `(more)` says so.
 */
export function fieldsFromIssues(issues: readonly Issue[], stoppedEarly: boolean): Record<string, string> {
  const fields: Record<string, string> = {};
  let named = 0;
  const unnamed = new Set<string>();
  for (const issue of issues) {
    const key = issue.path.length ? issue.path.map(String).join('.') : '(body)';
    if (key in fields) continue;
    if (named < MAX_REPORTED_FIELDS) {
      fields[key] = issue.message.length > MAX_MESSAGE_LENGTH ? `${issue.message.slice(0, MAX_MESSAGE_LENGTH - 1)}…` : issue.message;
      named++;
    } else unnamed.add(key);
  }
  if (stoppedEarly) fields[MORE_FIELDS_KEY] = `Checking stopped after the first ${issues.length} problems; fix these and send again to see any others.`;
  else if (unnamed.size) fields[MORE_FIELDS_KEY] = `${unnamed.size} more field${unnamed.size === 1 ? '' : 's'} need${unnamed.size === 1 ? 's' : ''} attention.`;
  return fields;
}

export function fieldsFromZod(error: ZodError): Record<string, string> {
  return fieldsFromIssues(error.issues as Issue[], false);
}
