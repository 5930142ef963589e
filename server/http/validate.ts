import type { z } from 'zod';
import { AppError, fieldsFromZod } from './errors';

/** Parse with a shared zod schema; a failure is a 400 that names every bad field. */
export function parse<S extends z.ZodType>(schema: S, value: unknown): z.infer<S> {
  const result = schema.safeParse(value ?? {});
  if (!result.success) throw new AppError(400, 'VALIDATION_FAILED', 'Some fields need attention.', fieldsFromZod(result.error));
  return result.data;
}
