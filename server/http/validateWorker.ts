/**
 * Runs in a worker thread (server/http/documentGate.ts): validation of a system document, the one
 * body large enough to hold the event loop (a maximum-size document takes 50–120 ms to validate on
 * a busy 2-core machine), so other users' requests are answered meanwhile.
 */
import { checkValue } from './validate';
import { SaveDocumentBody } from '../../src/shared/api/systems';
import { UpdateFieldChangeBody } from '../../src/shared/api/fieldChanges';
import { SystemDocumentSchema } from '../../src/engine/model/schema';

export const GATED_SCHEMAS = { SaveDocumentBody, UpdateFieldChangeBody, SystemDocument: SystemDocumentSchema } as const;
export type GatedSchema = keyof typeof GATED_SCHEMAS;

/**
 * Text in, text out: the request's JSON text as it came (and the field to check, if not all of
 * it), and the JSON of the answer. Strings cross
 * between threads as one copy, where a structured clone of a large object graph would cost the
 * event loop about as much as the validation it avoids.
 */
export default function validate({ schema, json, field }: { schema: GatedSchema; json: string; field?: string }): string {
  const body = JSON.parse(json);
  return JSON.stringify(checkValue(GATED_SCHEMAS[schema], field ? body[field] : body));
}
