import connectPgSimple from 'connect-pg-simple';
import type { RequestHandler } from 'express';
import session from 'express-session';
import type pg from 'pg';
import type { AppConfig } from '../deps';
import { HttpError } from '../http/errors';

declare module 'express-session' {
  interface SessionData {
    startedAt?: number;
  }
}

const PgStore = connectPgSimple(session);

/** Sessions in PostgreSQL; httpOnly, SameSite=Lax, Secure (and the __Host- prefix) behind TLS. */
export function createSessionMiddleware(pool: pg.Pool, config: AppConfig) {
  const store = new PgStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 15 * 60 });
  throttleTouches(store, Math.min(60_000, config.sessionIdleMs / 10));
  const secure = config.publicUrl.startsWith('https:');
  const middleware = session({
    name: secure ? '__Host-bw.sid' : 'bw.sid',
    secret: config.sessionSecret,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    proxy: config.trustProxy !== false,
    cookie: { httpOnly: true, sameSite: 'lax', secure, path: '/', maxAge: config.sessionIdleMs },
  });
  // express-session reports a failed save or touch (database away) through next(err) after the
  // response is already written; that second error would reach Express's final handler, which
  // destroys the socket mid-response. Log it instead: the response itself stands.
  const guarded: RequestHandler = (req, res, next) =>
    middleware(req, res, (err?: unknown) => {
      if (err && res.headersSent) {
        const e = err as { code?: string; message?: string };
        req.log?.warn({ code: e.code, msg: e.message }, 'session not saved after the response');
        return;
      }
      next(err);
    });
  return { middleware: guarded, store };
}

/**
 * A rolling session would otherwise write its new expiry to PostgreSQL on every request. Writing
 * it at most once per interval keeps reads read-only; the idle limit then ends a session up to one
 * interval early, never late.
 */
function throttleTouches(store: session.Store, intervalMs: number) {
  const touch = store.touch?.bind(store);
  if (!touch) return;
  const lastTouched = new Map<string, number>();
  store.touch = (sid, sess, callback) => {
    const now = Date.now();
    if (now - (lastTouched.get(sid) ?? 0) < intervalMs) return callback?.();
    if (lastTouched.size > 10_000) {
      for (const [key, at] of lastTouched) if (now - at >= intervalMs) lastTouched.delete(key);
    }
    lastTouched.set(sid, now);
    touch(sid, sess, callback);
  };
}

/** Ends sessions older than the absolute limit, whatever their activity. */
export function absoluteSessionLimit(config: AppConfig): RequestHandler {
  return (req, _res, next) => {
    const s = req.session;
    if (!s) return next();
    if (s.startedAt && Date.now() - s.startedAt > config.sessionAbsoluteMs) {
      return s.destroy(() => next(new HttpError(401, 'Your session has ended; sign in again.')));
    }
    next();
  };
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Refuses state-changing requests a browser sent from another site: the Origin must be our own,
 * and Sec-Fetch-Site, when sent, must be same-origin. Non-browser clients send neither.
 */
export function sameOriginGuard(config: AppConfig): RequestHandler {
  const allowed = new Set([new URL(config.publicUrl).origin]);
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method)) return next();
    const origin = req.get('origin');
    const own = `${req.protocol}://${req.get('host')}`;
    if (origin && origin !== own && !allowed.has(origin)) {
      req.log?.warn({ origin, path: req.path }, 'refused: cross-origin write');
      return next(new HttpError(403, 'Requests from other sites are refused.'));
    }
    const site = req.get('sec-fetch-site');
    if (site && site !== 'same-origin' && site !== 'none') {
      return next(new HttpError(403, 'Requests from other sites are refused.'));
    }
    next();
  };
}
