import { z } from 'zod';

/** The one error format every API response uses (see server/http/errors.ts). */
export const ApiErrorBody = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    /** field path (dot-joined) → what is wrong with it; present on 400 VALIDATION_FAILED */
    fields: z.record(z.string(), z.string()).optional(),
  }),
});
export type ApiErrorBody = z.infer<typeof ApiErrorBody>;

/** Stable error codes; the client may switch on them. */
export const ERROR_CODES = {
  VALIDATION_FAILED: 'VALIDATION_FAILED',
  NOT_SIGNED_IN: 'NOT_SIGNED_IN',
  FORBIDDEN: 'FORBIDDEN',
  NOT_FOUND: 'NOT_FOUND',
  STALE_VERSION: 'STALE_VERSION',
  CONFLICT: 'CONFLICT',
  CSRF_FAILED: 'CSRF_FAILED',
  RATE_LIMITED: 'RATE_LIMITED',
  BAD_CREDENTIALS: 'BAD_CREDENTIALS',
  INVITATION_INVALID: 'INVITATION_INVALID',
  RESET_LINK_INVALID: 'RESET_LINK_INVALID',
  USER_NOT_FOUND: 'USER_NOT_FOUND',
  LAST_DESIGNER: 'LAST_DESIGNER',
  DATABASE_UNAVAILABLE: 'DATABASE_UNAVAILABLE',
  INTERNAL: 'INTERNAL',
} as const;
export type ErrorCode = keyof typeof ERROR_CODES;
