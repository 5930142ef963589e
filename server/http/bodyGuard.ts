import type { RequestHandler } from 'express';
import { AppError } from './errors';

/** Deeper than any body Headroom accepts (a system document nests about 6 levels). */
const MAX_DEPTH = 32;
// PostgreSQL text and jsonb cannot hold NUL, and jsonb refuses unpaired UTF-16 surrogates:
// such strings are refused here with the field named, instead of failing in the database.
const UNSTORABLE = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

function problem(value: unknown, path: string[], depth: number): [string, string] | null {
  if (depth > MAX_DEPTH) return [path.join('.') || '(body)', `Nested more than ${MAX_DEPTH} levels deep`];
  if (typeof value === 'string') return UNSTORABLE.test(value) ? [path.join('.') || '(body)', 'Contains a NUL character or broken Unicode'] : null;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const p = problem(value[i], [...path, String(i)], depth + 1);
      if (p) return p;
    }
    return null;
  }
  if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      if (UNSTORABLE.test(k)) return [[...path, '(key)'].join('.'), 'A field name contains a NUL character or broken Unicode'];
      const p = problem(v, [...path, k], depth + 1);
      if (p) return p;
    }
  }
  return null;
}

/** Refuses JSON bodies that no route could store or that would exhaust the stack, before any route sees them. */
export const bodyGuard: RequestHandler = (req, _res, next) => {
  const found = problem(req.body, [], 0);
  if (found) throw new AppError(400, 'VALIDATION_FAILED', 'Some fields need attention.', { [found[0]]: found[1] });
  next();
};
