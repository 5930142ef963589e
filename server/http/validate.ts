import type { z } from 'zod';
import { AppError, fieldsFromZod } from './errors';
import { assertStorable } from './storable';

/** Parse with a shared zod schema; a failure is a 400 that names every bad field. */
export function parse<S extends z.ZodType>(schema: S, value: unknown, opts: { storableCheck?: boolean } = {}): z.infer<S> {
  const result = schema.safeParse(value ?? {});
  if (!result.success) throw new AppError(400, 'VALIDATION_FAILED', 'Some fields need attention.', fieldsFromZod(result.error));
  // a route whose service validates a nested document itself checks storability after that (storableCheck: false)
  if (opts.storableCheck !== false) assertStorable(result.data);
  return result.data;
}
