import type { ErrorRequestHandler } from 'express';
import { ZodError } from 'zod';
import type { ErrorCode } from '../../src/shared/api/errors';

/** The one error type of the server: a stable code, an HTTP status and a message for people. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode,
    message: string,
    readonly fields?: Record<string, string>,
    /** more members of the error body, e.g. `reasons` on REVISION_INCOMPLETE */
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const notFound = (what = 'That') => new AppError(404, 'NOT_FOUND', `${what} was not found.`);
export const forbidden = (message = 'Your role does not allow this.') => new AppError(403, 'FORBIDDEN', message);
export const staleVersion = () =>
  new AppError(409, 'STALE_VERSION', 'Someone else changed this since you opened it. Reload to see their change.');

export function fieldsFromZod(error: ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '(body)';
    fields[key] ??= issue.message;
  }
  return fields;
}

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
  if (err instanceof AppError) {
    res.status(err.status).json({ error: { ...(err.extra ?? {}), code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}) } });
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
  const pgCode = (err as { code?: string }).code;
  if (pgCode === '23505') {
    // a unique constraint caught a race the service's own check could not see
    res.status(409).json({ error: { code: 'CONFLICT', message: 'That already exists; reload and try again.' } });
    return;
  }
  if (pgCode === '22P02' || pgCode === '22021' || pgCode === '22P05' || pgCode === '54001' || pgCode === '22003') {
    res.status(400).json({ error: { code: 'VALIDATION_FAILED', message: 'The request holds a value the database cannot store.', fields: { '(body)': 'Value cannot be stored' } } });
    return;
  }
  if (isDatabaseDown(err)) {
    res.status(503).json({ error: { code: 'DATABASE_UNAVAILABLE', message: 'The database is not answering. Try again in a moment; nothing was saved.' } });
    return;
  }
  req.log?.error?.(err);
  console.error(`[headroom] ${req.method} ${req.originalUrl} failed:`, err);
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
