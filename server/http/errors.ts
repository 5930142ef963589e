import type { ErrorRequestHandler } from 'express';
import { ZodError } from 'zod';
import type { ErrorCode } from '../../src/shared/api/errors';
import { ServiceError } from '../services/errors';
import { log } from '../log';
import { fieldsFromZod } from '../services/validationFields';

export { notFound, forbidden } from '../services/errors';

/** The HTTP status of each error code: the one place where a service's error becomes a protocol's number. */
export const HTTP_STATUS: Record<ErrorCode, number> = {
  VALIDATION_FAILED: 400,
  NOT_SIGNED_IN: 401,
  FORBIDDEN: 403,
  NOT_FOUND: 404,
  STALE_VERSION: 409,
  CONFLICT: 409,
  REVISION_INCOMPLETE: 409,
  FAILURE_NOT_ACKNOWLEDGED: 409,
  NOTHING_TO_ACKNOWLEDGE: 409,
  CSRF_FAILED: 403,
  RATE_LIMITED: 429,
  BAD_CREDENTIALS: 401,
  // an invitation or reset link that does not exist (or no longer does) is a missing thing
  INVITATION_INVALID: 404,
  RESET_LINK_INVALID: 400,
  USER_NOT_FOUND: 404,
  LAST_DESIGNER: 409,
  DATABASE_UNAVAILABLE: 503,
  INTERNAL: 500,
};

/**
 * An error raised by the HTTP layer itself (guards, body checks, uploads), where the status is the
 * point; services throw ServiceError (server/services/errors.ts) and get their status from HTTP_STATUS.
 */
export class AppError extends ServiceError {
  constructor(
    readonly status: number,
    code: ErrorCode,
    message: string,
    fields?: Record<string, string>,
    extra?: Record<string, unknown>,
  ) {
    super(code, message, fields, extra);
  }
}

const statusOf = (err: ServiceError) => (err instanceof AppError ? err.status : HTTP_STATUS[err.code]);

export { fieldsFromIssues, fieldsFromZod, MAX_REPORTED_FIELDS, type Issue } from '../services/validationFields';

function isDatabaseDown(err: unknown): boolean {
  const e = err as { code?: string; name?: string; message?: string };
  return (
    ['ECONNREFUSED', 'ECONNRESET', '57P01', '57P03', 'ETIMEDOUT'].includes(e?.code ?? '') ||
    e?.name === 'KnexTimeoutError' ||
    /Connection terminated|timeout exceeded when trying to connect|Client has encountered a connection error/i.test(e?.message ?? '')
  );
}

/** Central handler: one format, never a stack trace or SQL in the response. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (res.headersSent) return;
  if (err instanceof ServiceError) {
    res.status(statusOf(err)).json({ error: { ...(err.extra ?? {}), code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}) } });
    return;
  }
  if (err instanceof ZodError) {
    res.status(400).json({ error: { code: 'VALIDATION_FAILED', message: 'Some fields need attention.', fields: fieldsFromZod(err) } });
    return;
  }
  const status = (err as { status?: number; statusCode?: number }).status ?? (err as { statusCode?: number }).statusCode;
  if ((err as { code?: string }).code === 'CSRF_FAILED') {
    res.status(403).json({ error: { code: 'CSRF_FAILED', message: 'The form expired. Reload the page and try again.' } });
    return;
  }
  if (status === 413) {
    res.status(413).json({ error: { code: 'VALIDATION_FAILED', message: 'The request is too large.' } });
    return;
  }
  if (status === 400 && (err as { type?: string }).type === 'entity.parse.failed') {
    res.status(400).json({ error: { code: 'VALIDATION_FAILED', message: 'The request body is not valid JSON.', fields: { '(body)': 'Not valid JSON' } } });
    return;
  }
  if (err instanceof URIError || (status === 400 && /decode|URI/i.test((err as Error).message ?? ''))) {
    // a path with a broken percent-encoding (Express could not decode a parameter)
    res.status(400).json({ error: { code: 'VALIDATION_FAILED', message: 'The address is not valid (a broken %-encoding).' } });
    return;
  }
  if (typeof status === 'number' && status >= 400 && status < 500) {
    // the body reader's refusals: an unsupported charset or content encoding (415), an aborted or
    // mis-sized body (400): the client's mistake, answered without a stack trace in the log
    const type = (err as { type?: string }).type;
    const message =
      type === 'charset.unsupported'
        ? 'Send the body as UTF-8.'
        : type === 'encoding.unsupported'
          ? 'The body’s content encoding is not supported.'
          : 'The request could not be read.';
    res.status(status).json({ error: { code: 'VALIDATION_FAILED', message } });
    return;
  }
  const pgCode = (err as { code?: string }).code;
  if (pgCode === '23505') {
    // a unique constraint caught a race the service's own check could not see
    res.status(409).json({ error: { code: 'CONFLICT', message: 'That already exists; reload and try again.' } });
    return;
  }
  if (pgCode === '22P02' || pgCode === '22021' || pgCode === '22P05' || pgCode === '54001' || pgCode === '22003') {
    res.status(400).json({
      error: { code: 'VALIDATION_FAILED', message: 'The request holds a value the database cannot store.', fields: { '(body)': 'Value cannot be stored' } },
    });
    return;
  }
  if (isDatabaseDown(err)) {
    res.status(503).json({ error: { code: 'DATABASE_UNAVAILABLE', message: 'The database is not answering. Try again in a moment; nothing was saved.' } });
    return;
  }
  req.log?.error?.(err);
  log.error({ err, method: req.method, url: req.originalUrl }, `${req.method} ${req.originalUrl} failed`);
  res.status(500).json({ error: { code: 'INTERNAL', message: 'Something went wrong on the server. Nothing was saved.' } });
};

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      log?: { error?: (e: unknown) => void };
    }
  }
}
