import { invalid } from './errors';

// PostgreSQL text and jsonb cannot hold NUL, and jsonb refuses unpaired UTF-16 surrogates:
// such strings are refused here with the field named, instead of failing in the database.
const UNSTORABLE = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** The first unstorable string in a parsed JSON body, walked without recursion (bodies may nest deeply). */
function firstUnstorable(body: unknown): [string, string] | null {
  const stack: [unknown, string][] = [[body, '']];
  while (stack.length) {
    const [value, path] = stack.pop()!;
    const at = (k: string) => (path ? `${path}.${k}` : k);
    if (typeof value === 'string') {
      if (UNSTORABLE.test(value)) return [path || '(body)', 'Contains a NUL character or broken Unicode'];
    } else if (Array.isArray(value)) {
      for (let i = value.length - 1; i >= 0; i--) stack.push([value[i], at(String(i))]);
    } else if (value && typeof value === 'object') {
      const entries = Object.entries(value);
      for (let i = entries.length - 1; i >= 0; i--) {
        const [k, v] = entries[i];
        if (UNSTORABLE.test(k)) return [at('(key)'), 'A field name contains a NUL character or broken Unicode'];
        stack.push([v, at(k)]);
      }
    }
  }
  return null;
}

/**
 * Refuses a validated value holding text the database cannot store. It runs after the zod
 * schema (server/http/validate.ts, or a service's own parse), so a body that breaks the schema is reported by the schema.
 */
export function assertStorable(value: unknown): void {
  const found = firstUnstorable(value);
  if (found) throw invalid('Some fields need attention.', { [found[0]]: found[1] });
}
