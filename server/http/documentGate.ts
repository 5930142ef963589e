/**
 * The routes that carry a whole system document have it validated in a worker thread before the
 * route runs (issue 13 finding 1): the event loop stays free for everyone else while a large
 * document is checked, and a document that fails is answered here with the capped report. A valid
 * body replaces `req.body` with the schema's output and is marked, so the route's own `parse`
 * takes it as it is (server/http/validate.ts). Only signed-in callers get this work done; anyone
 * else reaches the route, whose guard answers 401.
 */
import os from 'node:os';
import { Piscina } from 'piscina';
import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { CreateSystemBody, SaveDocumentBody } from '../../src/shared/api/systems';
import { fastParseSystemDocument } from '../../src/engine/model/fastParse';
import type { SystemDocument } from '../../src/engine';
import { AppError } from './errors';
import { firstOverBoundInJson } from './jsonPrescan';
import { markValidated } from './validate';
import { GATED_SCHEMAS, type GatedSchema } from './validateWorker';
import type { Checked } from './validate';

const ROUTES: { method: string; path: RegExp; schema: GatedSchema; field?: 'document'; outer?: z.ZodType }[] = [
  { method: 'PUT', path: /^\/projects\/[^/]+\/systems\/[^/]+\/revisions\/[^/]+\/document$/, schema: 'SaveDocumentBody' },
  { method: 'PATCH', path: /^\/projects\/[^/]+\/systems\/[^/]+\/field-changes\/[^/]+$/, schema: 'UpdateFieldChangeBody' },
  // an imported document: its own schema (the body's other fields are the route's to check)
  // (only once the rest of the body is right: the route reports a wrong outer body first)
  { method: 'POST', path: /^\/projects\/[^/]+\/systems$/, schema: 'SystemDocument', field: 'document', outer: CreateSystemBody },
];

/** documents waiting for the worker before the server answers 429 (a choice: 32 × 2 MB at most held) */
const MAX_QUEUE = 32;

export interface DocumentGate {
  middleware: RequestHandler;
  close: () => Promise<void>;
}

/** The JSON text of each request as received (express.json's `verify` puts it here; server/app.ts). */
const rawBodies = new WeakMap<object, Buffer>();
/** True when the request's JSON text went through the bounds scan (its parsed body needs no walk: the two agree, tests/unit/jsonPrescan.test.ts). */
export const prescanned = (req: object) => rawBodies.has(req);
export const keepRawBody = (req: object, _res: unknown, buf: Buffer) => {
  // lists and objects over the bounds are refused on the text, before JSON.parse builds them (jsonPrescan.ts)
  const found = firstOverBoundInJson(buf);
  if (found) throw new AppError(400, 'VALIDATION_FAILED', 'The request is larger than any real one; nothing was read further.', { [found[0]]: found[1] });
  rawBodies.set(req, buf);
};

/**
 * A draft save's body read by the schema's generated reader (src/engine/model/fastParse.ts, the
 * schema's exact output, property-tested against it) on the request's own thread: the body
 * SaveDocumentBody accepts, or undefined when the reader declines it (invalid, or a rarity it
 * leaves to the schema) and the worker's zod check reports why. The reader costs less than the
 * engine's analysis of the same document, which the save runs on this thread anyway; handing
 * the text to the worker and its answer back cost the event loop more than this read.
 */
function readSaveBody(body: unknown): { document: SystemDocument; version: number } | undefined {
  if (!body || typeof body !== 'object' || Array.isArray(body)) return undefined;
  const keys = Object.keys(body);
  if (keys.length !== 2 || !('document' in body) || !('version' in body)) return undefined;
  const { document, version } = body as { document: unknown; version: unknown };
  if (typeof version !== 'number' || !Number.isSafeInteger(version) || version < 1) return undefined;
  try {
    const read = fastParseSystemDocument(document);
    return read === undefined ? undefined : { document: read, version };
  } catch {
    return undefined;
  }
}

/**
 * True when the JSON text can hold no string PostgreSQL refuses (server/services/storable.ts): NUL
 * and lone UTF-16 surrogates reach a parsed string only through a \u escape (JSON forbids raw
 * control characters, and invalid UTF-8 decodes to U+FFFD). A text with such an escape (or a
 * quoted backslash before one) is walked after parsing, as before.
 */
const UNSTORABLE_ESCAPE = /\\u(?:0000|d[89a-f][0-9a-f]{2})/i;
export const storableText = (text: string) => !UNSTORABLE_ESCAPE.test(text);

export function createDocumentGate(): DocumentGate & { validate: (schema: GatedSchema, value: unknown) => Promise<Checked<unknown>> } {
  const pool = new Piscina({
    filename: new URL('./validateWorker.boot.mjs', import.meta.url).href,
    // one thread on a 2-core machine (the other core serves requests), at most two anywhere
    minThreads: 1,
    maxThreads: Math.max(1, Math.min(2, os.availableParallelism() - 1)),
    // beyond this many waiting documents the server says it is busy instead of holding them all in memory (a choice)
    maxQueue: MAX_QUEUE,
    idleTimeout: 60_000,
  });

  /** `value` as JSON text (the request's own, when there is one: re-serialising a deeply nested body would overflow the stack) */
  const validate = async (schema: GatedSchema, value: unknown, opts: { json?: string; field?: string } = {}): Promise<Checked<unknown>> =>
    JSON.parse(await pool.run({ schema, json: opts.json ?? JSON.stringify(value), field: opts.field })) as Checked<unknown>;

  const middleware: RequestHandler = async (req, _res, next) => {
    const route = ROUTES.find((r) => r.method === req.method && r.path.test(req.path));
    if (!route || !req.user || !req.body || typeof req.body !== 'object') return next();
    const target = route.field ? (req.body as Record<string, unknown>)[route.field] : req.body;
    if (target === undefined || target === null || typeof target !== 'object') return next();
    if (route.outer && !route.outer.safeParse(req.body).success) return next();
    const raw = rawBodies.get(req);
    const utf8 = !/charset=(?!"?utf-?8)/i.test(req.headers['content-type'] ?? '');
    // a draft save the generated reader accepts never waits for the worker
    if (route.schema === 'SaveDocumentBody') {
      const read = readSaveBody(req.body);
      if (read) {
        req.body = read;
        markValidated(SaveDocumentBody, read, { storable: raw !== undefined && utf8 && storableText(raw.toString('utf8')) });
        return next();
      }
    }
    if (pool.queueSize >= MAX_QUEUE)
      throw new AppError(429, 'RATE_LIMITED', 'The server is busy checking other documents. Try again in a moment; nothing was saved.');
    let result: Checked<unknown>;
    try {
      result = raw && utf8 ? await validate(route.schema, undefined, { json: raw.toString('utf8'), field: route.field }) : await validate(route.schema, target);
    } catch {
      // the worker could not read it (another encoding, say): the route validates it as it always did
      return next();
    }
    if (!result.success) {
      const fields = route.field
        ? Object.fromEntries(Object.entries(result.fields).map(([k, v]) => [k === '(more)' ? k : `${route.field}.${k}`, v]))
        : result.fields;
      const message = route.field ? 'The system document does not match the format.' : 'Some fields need attention.';
      throw new AppError(400, 'VALIDATION_FAILED', message, fields);
    }
    if (route.field) (req.body as Record<string, unknown>)[route.field] = result.data;
    else {
      req.body = result.data;
      markValidated(GATED_SCHEMAS[route.schema], req.body as object);
    }
    next();
  };
  return { middleware, close: () => pool.destroy(), validate };
}
