import type { z } from 'zod';
import { AppError, fieldsFromIssues, type Issue } from './errors';
import { assertStorable } from '../services/storable';

/**
 * Validation that stops early. zod reports every problem of a value; a body made of thousands of
 * empty elements then costs seconds of CPU and a response of many megabytes (issue 13 finding 1).
 * `firstIssues` walks the schema's objects and arrays itself and asks zod about one element at a
 * time, stopping once it has `max` problems; an array longer than its schema's `.max()` is refused
 * before any element is looked at. Only when it finds nothing does the full zod parse run (for the
 * output, defaults and any object-level rules the walk does not see), and its report is capped too.
 */
export const MAX_ISSUES = 20;

type AnySchema = z.ZodType & { _zod: { def: Record<string, unknown> & { type: string } } };
type Path = (string | number)[];

const isPlainObject = (v: unknown): v is Record<string, unknown> => {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) return false;
  const proto = Object.getPrototypeOf(v);
  return proto === Object.prototype || proto === null;
};

function lengthBounds(schema: AnySchema): { min?: number; max?: number } {
  const out: { min?: number; max?: number } = {};
  for (const c of (schema._zod.def.checks as { _zod: { def: { check: string; minimum?: number; maximum?: number } } }[] | undefined) ?? []) {
    if (c._zod.def.check === 'max_length') out.max = c._zod.def.maximum;
    if (c._zod.def.check === 'min_length') out.min = c._zod.def.minimum;
  }
  return out;
}

function pushZodIssues(schema: AnySchema, value: unknown, path: Path, out: Issue[], max: number): void {
  const r = schema.safeParse(value);
  if (!r.success)
    for (const issue of r.error.issues) {
      if (out.length >= max) return;
      out.push({ code: issue.code, path: [...path, ...(issue.path as Path)], message: issue.message });
    }
}

/** Checks other than an array's length bounds: refinements, which zod runs on the whole value. */
const hasRefinements = (schema: AnySchema) =>
  ((schema._zod.def.checks as { _zod: { def: { check: string } } }[] | undefined) ?? []).some(
    (c) => c._zod.def.check !== 'max_length' && c._zod.def.check !== 'min_length',
  );

function walk(schema: AnySchema, value: unknown, path: Path, out: Issue[], max: number): void {
  if (out.length >= max) return;
  const def = schema._zod.def;
  if ((def.type === 'optional' || def.type === 'default') && value !== undefined) return walk(def.innerType as AnySchema, value, path, out, max);
  const start = out.length;
  if (def.type === 'array' && Array.isArray(value)) {
    const { min, max: most } = lengthBounds(schema);
    if (most !== undefined && value.length > most) {
      out.push({ code: 'too_big', path, message: `Has ${value.length} items; at most ${most} are accepted` });
      return;
    }
    for (let i = 0; i < value.length && out.length < max; i++) walk(def.element as AnySchema, value[i], [...path, i], out, max);
    if (min !== undefined && value.length < min && out.length < max)
      out.push({ code: 'too_small', path, message: `Needs at least ${min} item${min === 1 ? '' : 's'}` });
  } else if (def.type === 'object' && isPlainObject(value)) {
    const shape = def.shape as Record<string, AnySchema>;
    for (const key of Object.keys(shape)) {
      walk(shape[key], value[key], [...path, key], out, max);
      if (out.length >= max) return;
    }
    if ((def.catchall as AnySchema | undefined)?._zod.def.type === 'never') {
      const unknown = Object.keys(value).filter((k) => !(k in shape));
      if (unknown.length) {
        const listed = unknown
          .slice(0, 5)
          .map((k) => JSON.stringify(k.slice(0, 40)))
          .join(', ');
        out.push({
          code: 'unrecognized_keys',
          path,
          message: `Unrecognized key${unknown.length === 1 ? '' : 's'}: ${listed}${unknown.length > 5 ? ` and ${unknown.length - 5} more` : ''}`,
        });
      }
    }
  } else {
    // anything else (a scalar, a union, a record, a value of the wrong type): zod, on this value only
    return pushZodIssues(schema, value, path, out, max);
  }
  // a refinement of this object or array sees the whole value: when the walk did not already stop,
  // zod's report of this value replaces what the walk found in it (the same problems, and the refinement's)
  if (out.length < max && out.length > start && hasRefinements(schema)) {
    out.length = start;
    pushZodIssues(schema, value, path, out, max);
  }
}

/** Up to `max` problems of `value` against `schema`, found without looking past them; [] when there are none the walk can see. */
export function firstIssues(schema: z.ZodType, value: unknown, max = MAX_ISSUES): { issues: Issue[]; stoppedEarly: boolean } {
  const issues: Issue[] = [];
  walk(schema as AnySchema, value, [], issues, max);
  return { issues, stoppedEarly: issues.length >= max };
}

export type Checked<T> = { success: true; data: T } | { success: false; fields: Record<string, string> };

/** Early-stopping validation with a capped report (what every route's `parse` uses). */
export function checkValue<S extends z.ZodType>(schema: S, value: unknown): Checked<z.infer<S>> {
  const first = firstIssues(schema, value);
  if (first.issues.length) return { success: false, fields: fieldsFromIssues(first.issues, first.stoppedEarly) };
  const result = schema.safeParse(value);
  if (result.success) return { success: true, data: result.data };
  return { success: false, fields: fieldsFromIssues(result.error.issues as Issue[], false) };
}

/**
 * Values that were already validated against a schema off the request thread (server/http/documentGate.ts):
 * `parse` returns them as they are instead of validating them again.
 */
const validated = new WeakMap<object, z.ZodType>();
/** Values whose text was seen to hold no string the database cannot store (server/http/documentGate.ts): `parse` does not walk them again. */
const storable = new WeakSet<object>();
export function markValidated(schema: z.ZodType, value: object, opts: { storable?: boolean } = {}): void {
  validated.set(value, schema);
  if (opts.storable) storable.add(value);
}

/** Parse with a shared zod schema; a failure is a 400 that names the bad fields (the first MAX_ISSUES). */
export function parse<S extends z.ZodType>(schema: S, value: unknown, opts: { storableCheck?: boolean } = {}): z.infer<S> {
  let data: z.infer<S>;
  if (value && typeof value === 'object' && validated.get(value) === schema) data = value as z.infer<S>;
  else {
    const result = checkValue(schema, value ?? {});
    if (!result.success) throw new AppError(400, 'VALIDATION_FAILED', 'Some fields need attention.', result.fields);
    data = result.data;
  }
  // a route whose service validates a nested document itself checks storability after that (storableCheck: false)
  if (opts.storableCheck !== false && !(data && typeof data === 'object' && storable.has(data))) assertStorable(data);
  return data;
}
