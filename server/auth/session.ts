import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import pg from 'pg';
import type { RequestHandler } from 'express';
import type { Config } from '../config';

export const SESSION_COOKIE = 'headroom.sid';

/** Sessions live in PostgreSQL (the `session` table made by the first migration). */
export function createSessionMiddleware(config: Config): { middleware: RequestHandler; pool: pg.Pool } {
  const PgStore = connectPgSimple(session);
  const pool = new pg.Pool({ connectionString: config.DATABASE_URL, max: 5, connectionTimeoutMillis: 2000 });
  // an idle client that loses its server must not crash the process
  pool.on('error', () => {});
  const middleware = session({
    name: SESSION_COOKIE,
    store: new PgStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 15 * 60 }),
    secret: config.SESSION_SECRET,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: config.COOKIE_SECURE === '1',
      maxAge: config.SESSION_IDLE_MINUTES * 60 * 1000,
    },
  });
  return { middleware, pool };
}
