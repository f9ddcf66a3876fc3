import connectPgSimple from 'connect-pg-simple';
import type { RequestHandler } from 'express';
import session from 'express-session';
import type pg from 'pg';
import type { AppConfig } from '../deps';
import { HttpError } from '../http/errors';

declare module 'express-session' {
  interface SessionData {
    startedAt?: number;
    /** When the idle limit was last pushed back (ms since the epoch). */
    renewedAt?: number;
  }
}

/** How long a session read from PostgreSQL is served from memory. */
const SESSION_READ_CACHE_MS = 2_000;

const PgStore = connectPgSimple(session);

/**
 * Sessions in PostgreSQL; httpOnly, SameSite=Lax, Secure (and the __Host- prefix) behind TLS.
 * The idle limit is pushed back at most once per renewal interval (see renewIdleLimit), and reads
 * are served from memory briefly (see cacheReads), so a plain read costs no database round trip.
 */
export function createSessionMiddleware(pool: pg.Pool, config: AppConfig) {
  const store = new PgStore({
    pool,
    tableName: 'session',
    createTableIfMissing: false,
    pruneSessionInterval: 15 * 60,
  });
  const cache = cacheReads(store, pool, SESSION_READ_CACHE_MS);
  // Renewal re-saves the session with its new expiry; a separate touch would only repeat that.
  store.touch = (_sid, _sess, callback) => callback?.();
  const secure = config.publicUrl.startsWith('https:');
  const cookieName = secure ? '__Host-bw.sid' : 'bw.sid';
  const middleware = session({
    name: cookieName,
    secret: config.sessionSecret,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: false,
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
  const renew = renewIdleLimit(Math.min(60_000, config.sessionIdleMs / 10));
  const withRenewal: RequestHandler = (req, res, next) =>
    guarded(req, res, (err?: unknown) => (err ? next(err) : renew(req, res, next)));
  return { middleware: withRenewal, store, cookieName, forgetSessionsOf: cache.forgetSessionsOf };
}

/**
 * Pushes a signed-in session's idle limit back when the last push is older than the interval: the
 * change makes express-session save the session with its new expiry and send the cookie again
 * with the new Expires. Other requests write nothing, to the database or to the response; the
 * idle limit then ends a session up to one interval early, never late.
 */
function renewIdleLimit(intervalMs: number): RequestHandler {
  return (req, _res, next) => {
    const s = req.session;
    if (s && s.startedAt && Date.now() - (s.renewedAt ?? 0) >= intervalMs) s.renewedAt = Date.now();
    next();
  };
}

/**
 * Serves a session read from memory for up to ttlMs after PostgreSQL gave it, and never past its
 * expiry; every write and destroy made here goes to PostgreSQL first and then to memory. A sign-out
 * or deactivation made by another server process reaches this one within ttlMs (deactivation also
 * drops the person from the person cache, which refuses the session at once here).
 *
 * A session that was read from the store is saved back with an UPDATE only, never the store's
 * upsert: a request still in flight when the session is signed out (here or in another process)
 * must not bring the deleted row back. Only a session made in this request (a new visitor, or the
 * new id given at sign-in) is inserted.
 */
function cacheReads(store: session.Store, pool: pg.Pool, ttlMs: number) {
  type Entry = { json: string; userId: string | undefined; readAt: number; expires: number };
  const entries = new Map<string, Entry>();
  // When each session id was last destroyed here, so a read that began before it is not cached.
  const destroyedAt = new Map<string, number>();
  const loaded = new WeakSet<object>();
  const entryOf = (sess: session.SessionData): Entry => ({
    json: JSON.stringify(sess),
    userId: (sess as { passport?: { user?: string } }).passport?.user,
    readAt: Date.now(),
    expires: sess.cookie?.expires ? new Date(sess.cookie.expires).getTime() : Infinity,
  });
  const prune = (map: Map<string, { readAt: number } | number>, olderThan: number) => {
    for (const [key, v] of map) if ((typeof v === 'number' ? v : v.readAt) < olderThan) map.delete(key);
  };
  const remember = (sid: string, sess: session.SessionData) => {
    if (entries.size >= 10_000) prune(entries, Date.now() - ttlMs);
    entries.set(sid, entryOf(sess));
  };
  const get = store.get.bind(store);
  const set = store.set.bind(store);
  const destroy = store.destroy.bind(store);
  const createSession = store.createSession.bind(store);
  store.createSession = (req, data) => {
    const made = createSession(req, data);
    loaded.add(made);
    return made;
  };
  store.get = (sid, callback) => {
    const hit = entries.get(sid);
    const started = Date.now();
    if (hit && started - hit.readAt < ttlMs && started < hit.expires)
      return callback(null, JSON.parse(hit.json) as session.SessionData);
    entries.delete(sid);
    get(sid, (err, sess) => {
      if (!err && sess && !((destroyedAt.get(sid) ?? -1) >= started)) remember(sid, sess);
      callback(err, sess);
    });
  };
  store.set = (sid, sess, callback) => {
    entries.delete(sid);
    const done = (err?: unknown) => {
      if (!err) remember(sid, sess);
      callback?.(err);
    };
    if (!loaded.has(sess)) return set(sid, sess, done);
    const expire = sess.cookie?.expires ? new Date(sess.cookie.expires) : new Date(Date.now() + 86_400_000);
    pool.query('UPDATE "session" SET sess = $1, expire = $2 WHERE sid = $3', [sess, expire, sid]).then(
      (r) => (r.rowCount ? done() : callback?.()), // gone meanwhile: stays gone, and is not cached
      (err: unknown) => callback?.(err),
    );
  };
  store.destroy = (sid, callback) => {
    entries.delete(sid);
    if (destroyedAt.size >= 10_000) prune(destroyedAt, Date.now() - 60_000);
    destroyedAt.set(sid, Date.now());
    destroy(sid, callback);
  };
  return {
    forgetSessionsOf(userId: string) {
      for (const [sid, e] of entries) if (e.userId === userId) entries.delete(sid);
    },
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
