import express, { Router, type Express } from 'express';
import helmet from 'helmet';
import cookieParser from 'cookie-parser';
import path from 'node:path';
import fs from 'node:fs';
import type { Config } from './config';
import type { Db } from './db/knex';
import { createSessionMiddleware } from './auth/session';
import { createPassport } from './auth/passport';
import { createCsrf } from './auth/csrf';
import { AppError, errorHandler } from './http/errors';
import { healthRoutes } from './routes/health';
import { authRoutes } from './routes/auth';
import { usersRoutes } from './routes/users';
import { projectsRoutes } from './routes/projects';
import { systemsRoutes } from './routes/systems';
import { catalogRoutes } from './routes/catalog';
import type { ServiceContext } from './services/context';

export interface HeadroomApp {
  app: Express;
  /** every API route, for the access matrix and the contributor guide */
  apiRoutes: { method: string; path: string }[];
  close: () => Promise<void>;
}

/** The app factory: everything it needs is passed in (no module state), so tests build their own. */
export function createApp({ config, db }: { config: Config; db: Db }): HeadroomApp {
  const ctx: ServiceContext = { config, db };
  const app = express();
  app.disable('x-powered-by');
  if (config.COOKIE_SECURE === '1') app.set('trust proxy', 1);

  // helmet's default CSP (self only) suits Vite's build output; the client loads nothing from elsewhere.
  app.use(helmet({ referrerPolicy: { policy: 'same-origin' } }));
  app.use(express.json({ limit: '2mb' }));
  app.use(cookieParser());
  const { middleware: sessionMiddleware, pool: sessionPool } = createSessionMiddleware(config);
  const passport = createPassport(ctx);
  const { doubleCsrfProtection, generateCsrfToken } = createCsrf(config);

  const api = Router();
  api.use(sessionMiddleware);
  api.use(passport.session());
  api.use(doubleCsrfProtection);
  api.use(healthRoutes(ctx));
  api.use(authRoutes(ctx, passport as never, generateCsrfToken as never));
  api.use(usersRoutes(ctx));
  api.use(projectsRoutes(ctx));
  api.use(systemsRoutes(ctx));
  api.use(catalogRoutes(ctx));
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
    close: async () => {
      await sessionPool.end();
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
