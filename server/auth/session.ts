import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import pg from 'pg';
import type { RequestHandler } from 'express';
import type { Config } from '../config';

export const SESSION_COOKIE = 'headroom.sid';

/** The longest a stored session's expiry may lag behind its cookie's (a choice: a minute of an idle period of hours). */
const TOUCH_EVERY_MAX_MS = 60_000;

/**
 * `rolling` renews the session on every answer, and the store's `touch` writes the new expiry
 * with an UPDATE: one more database round trip on every request (a designer's autosave makes
 * several a minute). Here a session's expiry is written at most once per `everyMs` by this
 * process (and always when the session itself is written), so the stored expiry lags the
 * cookie's by at most `everyMs`: 1 % of the idle period, at most a minute (SESSION_IDLE_MINUTES).
 * The idle sign-out then comes up to that much early, never late.
 */
function throttleTouches(store: session.Store, everyMs: number): void {
  const written = new Map<string, number>();
  const remember = (sid: string) => {
    const now = Date.now();
    // entries older than the window are no use: dropped when the map grows (a sweep per 10,000 sessions, a choice)
    if (written.size >= 10_000) for (const [k, t] of written) if (now - t >= everyMs) written.delete(k);
    written.set(sid, now);
  };
  const touch = store.touch!.bind(store);
  const set = store.set.bind(store);
  const destroy = store.destroy.bind(store);
  store.touch = (sid, sess, callback) => {
    const last = written.get(sid);
    if (last !== undefined && Date.now() - last < everyMs) return callback?.();
    remember(sid);
    touch(sid, sess, callback);
  };
  store.set = (sid, sess, callback) => {
    remember(sid);
    set(sid, sess, callback);
  };
  store.destroy = (sid, callback) => {
    written.delete(sid);
    destroy(sid, callback);
  };
}

/** Sessions live in PostgreSQL (the `session` table made by the first migration). */
export function createSessionMiddleware(config: Config): { middleware: RequestHandler; pool: pg.Pool } {
  const PgStore = connectPgSimple(session);
  const pool = new pg.Pool({ connectionString: config.DATABASE_URL, max: 5, connectionTimeoutMillis: 2000 });
  // an idle client that loses its server must not crash the process
  pool.on('error', () => {});
  const store = new PgStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 15 * 60 });
  throttleTouches(store, Math.min(TOUCH_EVERY_MAX_MS, (config.SESSION_IDLE_MINUTES * 60 * 1000) / 100));
  const middleware = session({
    name: SESSION_COOKIE,
    store,
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
