import type { z } from 'zod';
import { ApiErrorBody } from '../shared/api/errors';
import type { ErrorCode } from '../shared/api/errors';

/** Codes the client adds to the server's own: no answer at all, or an answer of the wrong shape. */
export type ClientErrorCode = ErrorCode | 'NETWORK' | 'BAD_RESPONSE' | 'UNKNOWN';

/** Every failed API call ends as one of these, whatever went wrong. */
export class ApiError extends Error {
  override readonly name = 'ApiError';
  constructor(
    readonly status: number,
    readonly code: ClientErrorCode | (string & {}),
    message: string,
    /** field path → what is wrong with it (400 VALIDATION_FAILED) */
    readonly fields: Readonly<Record<string, string>> = {},
    /** the error object as the server sent it, for codes that carry more (e.g. the reasons of REVISION_INCOMPLETE) */
    readonly raw: Readonly<Record<string, unknown>> = {},
  ) {
    super(message);
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

/** Maps a non-2xx answer to an ApiError; a body outside the error format still gives a usable error. */
export function toApiError(status: number, body: unknown): ApiError {
  const parsed = ApiErrorBody.safeParse(body);
  if (parsed.success) {
    const { code, message, fields } = parsed.data.error;
    return new ApiError(status, code, message, fields ?? {}, (body as { error: Record<string, unknown> }).error);
  }
  return new ApiError(status, 'UNKNOWN', `The server answered ${status} without an explanation.`);
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export interface RequestOptions<S extends z.ZodType | undefined> {
  method?: Method;
  body?: unknown;
  /** the shared zod schema of the answer; the answer is checked against it */
  schema?: S;
  signal?: AbortSignal;
}

type Result<S> = S extends z.ZodType ? z.output<S> : void;

export interface ApiClient {
  request<S extends z.ZodType | undefined = undefined>(path: string, options?: RequestOptions<S>): Promise<Result<S>>;
  get<S extends z.ZodType>(path: string, schema: S, signal?: AbortSignal): Promise<z.output<S>>;
  post<S extends z.ZodType | undefined = undefined>(path: string, body?: unknown, schema?: S): Promise<Result<S>>;
  patch<S extends z.ZodType | undefined = undefined>(path: string, body: unknown, schema?: S): Promise<Result<S>>;
  delete(path: string): Promise<void>;
  /** Forget the CSRF token; call after sign-in, sign-out and accepting an invitation (the token is bound to the session). */
  resetCsrfToken(): void;
}

const SAFE_METHODS: ReadonlySet<Method> = new Set(['GET']);

export function createApiClient(fetchImpl: typeof fetch = (...args) => globalThis.fetch(...args)): ApiClient {
  let csrfToken: Promise<string> | null = null;

  async function send(path: string, init: RequestInit): Promise<Response> {
    try {
      return await fetchImpl(path, { credentials: 'same-origin', ...init });
    } catch (cause) {
      if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
      throw new ApiError(0, 'NETWORK', 'Headroom could not reach the server. Check the connection and try again.');
    }
  }

  async function readJson(response: Response): Promise<unknown> {
    if (response.status === 204) return undefined;
    const text = await response.text();
    if (text === '') return undefined;
    try {
      return JSON.parse(text);
    } catch {
      return undefined;
    }
  }

  function getCsrfToken(): Promise<string> {
    csrfToken ??= (async () => {
      const response = await send('/api/csrf-token', { headers: { accept: 'application/json' } });
      const body = await readJson(response);
      if (!response.ok) throw toApiError(response.status, body);
      const token = (body as { token?: unknown } | undefined)?.token;
      if (typeof token !== 'string') throw new ApiError(response.status, 'BAD_RESPONSE', 'The server sent no form token.');
      return token;
    })().catch((error: unknown) => {
      csrfToken = null;
      throw error;
    });
    return csrfToken;
  }

  async function request<S extends z.ZodType | undefined = undefined>(path: string, options: RequestOptions<S> = {}): Promise<Result<S>> {
    const method = options.method ?? 'GET';
    const needsCsrf = !SAFE_METHODS.has(method);

    const attempt = async (): Promise<Response> => {
      const headers: Record<string, string> = { accept: 'application/json' };
      // A FormData body (an upload) sets its own multipart content type with the boundary.
      const multipart = typeof FormData !== 'undefined' && options.body instanceof FormData;
      if (options.body !== undefined && !multipart) headers['content-type'] = 'application/json';
      if (needsCsrf) headers['x-csrf-token'] = await getCsrfToken();
      return send(path, {
        method,
        headers,
        body: options.body === undefined ? undefined : multipart ? (options.body as FormData) : JSON.stringify(options.body),
        signal: options.signal,
      });
    };

    let response = await attempt();
    let body = await readJson(response);

    // The token is bound to the session; a session that changed under us (expiry, another tab
    // signing in) makes it stale. Fetch a fresh one and try once more, never more.
    if (needsCsrf && response.status === 403 && toApiError(403, body).code === 'CSRF_FAILED') {
      csrfToken = null;
      response = await attempt();
      body = await readJson(response);
    }

    if (!response.ok) throw toApiError(response.status, body);
    if (!options.schema) return undefined as Result<S>;
    const parsed = options.schema.safeParse(body);
    if (!parsed.success) {
      throw new ApiError(response.status, 'BAD_RESPONSE', 'The server answered in a form this page does not understand. Reload the page.');
    }
    return parsed.data as Result<S>;
  }

  return {
    request,
    get: <S extends z.ZodType>(path: string, schema: S, signal?: AbortSignal) => request<S>(path, { schema, signal }) as Promise<z.output<S>>,
    post: (path, body, schema) => request(path, { method: 'POST', body, schema }),
    patch: (path, body, schema) => request(path, { method: 'PATCH', body, schema }),
    delete: (path) => request(path, { method: 'DELETE' }),
    resetCsrfToken: () => {
      csrfToken = null;
    },
  };
}

/** The one client the app uses. */
export const api = createApiClient();
