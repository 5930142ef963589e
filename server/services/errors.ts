/**
 * The errors a service throws: a stable code (src/shared/api/errors.ts), a message for people and,
 * where a form can point at them, the fields. Services know nothing of HTTP: the one error handler
 * (server/http/errors.ts) turns each code into its status (HTTP_STATUS there), so a service reads as
 * what went wrong ("conflict", "not found"), not as a protocol's number.
 */
import type { ErrorCode } from '../../src/shared/api/errors';

export class ServiceError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly fields?: Record<string, string>,
    /** more members of the error body, e.g. `reasons` on REVISION_INCOMPLETE */
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const notFound = (what = 'That') => new ServiceError('NOT_FOUND', `${what} was not found.`);
export const forbidden = (message = 'Your role does not allow this.') => new ServiceError('FORBIDDEN', message);
export const staleVersion = () => new ServiceError('STALE_VERSION', 'Someone else changed this since you opened it. Reload to see their change.');
/** The thing is not in a state that allows this (an issued revision edited, a decided field change decided again …). */
export const conflict = (message: string, fields?: Record<string, string>) => new ServiceError('CONFLICT', message, fields);
/** The input is wrong in a way a schema could not see (an empty file, a value that contradicts another). */
export const invalid = (message: string, fields?: Record<string, string>) => new ServiceError('VALIDATION_FAILED', message, fields);
