import express, { Router, type Express } from 'express';
import helmet from 'helmet';
import cookieParser from 'cookie-parser';
import path from 'node:path';
import fs from 'node:fs';
import { upgradesInsecureRequests, type Config } from './config';
import type { Db } from './db/knex';
import { createSessionMiddleware } from './auth/session';
import { createPassport } from './auth/passport';
import { createCsrf } from './auth/csrf';
import { AppError, errorHandler } from './http/errors';
import { healthRoutes } from './routes/health';
import { authRoutes } from './routes/auth';
import { PostgresRateLimitStore } from './auth/rateLimitStore';
import { usersRoutes } from './routes/users';
import { projectsRoutes } from './routes/projects';
import { systemsRoutes } from './routes/systems';
import { catalogRoutes } from './routes/catalog';
import type { ServiceContext } from './services/context';
import { summariesRoutes } from './routes/summaries';
import { reviewsRoutes } from './routes/reviews';
import { auditRoutes } from './routes/audit';
import { devMailRoutes } from './routes/devMail';
import { fieldChangesRoutes } from './routes/fieldChanges';
import { createMailer } from './mail/transport';
import { OutboxWorker } from './mail/worker';
import { startDevSink, type DevSink } from './mail/devSink';
import { assertWithinBounds } from './http/bounds';
import { createDocumentGate, keepRawBody, prescanned } from './http/documentGate';

export interface HeadroomApp {
  app: Express;
  /** every API route, for the access matrix and the contributor guide */
  apiRoutes: { method: string; path: string }[];
  /** the e-mail outbox worker (started by `startOutbox`, or by the caller with .start()) */
  outbox: OutboxWorker;
  /** the local SMTP sink when HEADROOM_DEV_MAIL=1 */
  devMail: DevSink | null;
  close: () => Promise<void>;
}

/** The app factory: everything it needs is passed in (no module state), so tests build their own. */
export function createApp({
  config,
  db,
  startOutbox = false,
  oneOfSeveralProcesses = false,
}: {
  config: Config;
  db: Db;
  startOutbox?: boolean;
  /** true in each app process of a cluster (server/index.ts): the rate limits then count in PostgreSQL (RATE_LIMIT_STORE=auto) */
  oneOfSeveralProcesses?: boolean;
}): HeadroomApp {
  const ctx: ServiceContext = { config, db };
  const sharedLimits = config.RATE_LIMIT_STORE === 'postgres' || (config.RATE_LIMIT_STORE === 'auto' && oneOfSeveralProcesses);
  const rateLimitStore = sharedLimits ? (prefix: string) => new PostgresRateLimitStore(db, prefix) : undefined;
  const devMail = config.HEADROOM_DEV_MAIL === '1' ? startDevSink(db, config.DEV_MAIL_PORT) : null;
  const mailer = createMailer(config, devMail?.ready);
  const outbox = new OutboxWorker(ctx, mailer, {
    pollMs: config.OUTBOX_POLL_MS,
    retryBaseMs: config.OUTBOX_RETRY_BASE_MS,
    retryMaxMs: config.OUTBOX_RETRY_MAX_MS,
    leaseSeconds: config.OUTBOX_LEASE_SECONDS,
  });
  if (startOutbox) outbox.start();
  const app = express();
  app.disable('x-powered-by');
  if (config.COOKIE_SECURE === '1') app.set('trust proxy', 1);

  // helmet's default CSP (self only) suits Vite's build output; the client loads nothing from elsewhere.
  // Its upgrade-insecure-requests only where the app is reached over TLS (config.ts CSP_UPGRADE_INSECURE).
  app.use(
    helmet({
      referrerPolicy: { policy: 'same-origin' },
      contentSecurityPolicy: { directives: { upgradeInsecureRequests: upgradesInsecureRequests(config) ? [] : null } },
    }),
  );
  app.use(express.json({ limit: '2mb', verify: keepRawBody }));
  // before any schema: arrays and objects no real request has (server/http/bounds.ts); a JSON body's text was scanned for them already
  app.use((req, _res, next) => {
    if (req.body && typeof req.body === 'object' && !prescanned(req)) assertWithinBounds(req.body);
    next();
  });
  app.use(cookieParser());
  const { middleware: sessionMiddleware, pool: sessionPool } = createSessionMiddleware(config);
  const passport = createPassport(ctx);
  const { doubleCsrfProtection, generateCsrfToken } = createCsrf(config);

  const api = Router();
  api.use(sessionMiddleware);
  api.use(passport.session());
  api.use(doubleCsrfProtection);
  // system documents are validated in a worker thread, off the event loop (server/http/documentGate.ts)
  const documentGate = createDocumentGate();
  api.use(documentGate.middleware);
  api.use(healthRoutes(ctx));
  api.use(authRoutes(ctx, passport as never, generateCsrfToken as never, rateLimitStore));
  api.use(usersRoutes(ctx));
  api.use(projectsRoutes(ctx));
  api.use(systemsRoutes(ctx));
  api.use(catalogRoutes(ctx));
  api.use(summariesRoutes(ctx));
  api.use(reviewsRoutes(ctx));
  api.use(auditRoutes(ctx));
  api.use(devMailRoutes(ctx));
  api.use(fieldChangesRoutes(ctx, { maxUploadBytes: config.UPLOAD_MAX_BYTES }));
  api.use((req) => {
    throw new AppError(404, 'NOT_FOUND', `No API route ${req.method} ${req.path}.`);
  });
  app.use('/api', api);

  if (config.HEADROOM_SERVE_CLIENT === '1') {
    const dist = path.resolve(new URL('..', import.meta.url).pathname, 'dist');
    if (!fs.existsSync(path.join(dist, 'index.html'))) throw new Error(`The client is not built: ${dist}/index.html is missing (run npx vite build).`);
    app.use(express.static(dist, { index: false, maxAge: '1h' }));
    // client-side routes: every other GET gets the app shell
    app.get('/{*splat}', (_req, res) => res.sendFile(path.join(dist, 'index.html')));
  }
  app.use(errorHandler);

  return {
    app,
    apiRoutes: listRoutes(api),
    outbox,
    devMail,
    close: async () => {
      await outbox.stop();
      mailer.close();
      await devMail?.close();
      await sessionPool.end();
      await documentGate.close();
    },
  };
}

interface Layer {
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
}

function listRoutes(router: Router): { method: string; path: string }[] {
  const out: { method: string; path: string }[] = [];
  const walk = (stack: Layer[]) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const method of Object.keys(layer.route.methods)) out.push({ method: method.toUpperCase(), path: `/api${layer.route.path}` });
      } else if (layer.handle?.stack) walk(layer.handle.stack);
    }
  };
  walk((router as unknown as { stack: Layer[] }).stack);
  return out;
}
