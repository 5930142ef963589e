import { z } from 'zod';

/** The one error format every API response uses (see server/http/errors.ts). */
export const ApiErrorBody = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    /** field path (dot-joined) → what is wrong with it; present on 400 VALIDATION_FAILED */
    fields: z.record(z.string(), z.string()).optional(),
    /** why a revision cannot be issued: present on 409 REVISION_INCOMPLETE (the analysis' IncompleteReason[]) */
    reasons: z.array(z.object({ code: z.string(), elementType: z.string(), elementId: z.string().nullable(), message: z.string() })).optional(),
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
  /** issuing a revision whose analysis is incomplete or failed to run; the body carries `reasons` */
  REVISION_INCOMPLETE: 'REVISION_INCOMPLETE',
  /** issuing a failing revision without the designer's acknowledgement of the failure */
  FAILURE_NOT_ACKNOWLEDGED: 'FAILURE_NOT_ACKNOWLEDGED',
  /** an acknowledgement of failure sent with a revision that does not fail */
  NOTHING_TO_ACKNOWLEDGE: 'NOTHING_TO_ACKNOWLEDGE',
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
