import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import { csrfSync } from 'csrf-sync';
import type { AppConfig } from '../deps';

/** Set once someone has shown their password and is asked for an authenticator code next. */
declare module 'express-session' {
  interface SessionData {
    pendingSecondFactor?: { personId: string; at: number };
  }
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** A session worth keeping: someone signed in, or half-way through signing in. */
const holdsSession = (req: Request) => !!req.user || !!req.session?.pendingSecondFactor;

/**
 * CSRF protection for every write, the public ones (sign-in, set-password) included.
 *
 * - With a session (signed in, or waiting for an authenticator code): a synchronizer token kept in
 *   the session and sent back in the X-CSRF-Token header (csrf-sync).
 * - Anonymous visitors get no session row at all: their token is an HMAC of a random value kept in
 *   an HttpOnly, SameSite=Strict cookie, so only a page that could read our answer (same origin)
 *   can send the matching header, and nothing is stored on the server.
 */
export function createCsrf(config: AppConfig) {
  const sync = csrfSync({ getTokenFromRequest: (req) => req.get('x-csrf-token') });
  const secure = config.publicUrl.startsWith('https:');
  const cookieName = secure ? '__Host-bw.csrf' : 'bw.csrf';
  const mac = (nonce: string) =>
    createHmac('sha256', config.sessionSecret).update(`anonymous-csrf:${nonce}`).digest('base64url');
  const nonceOf = (req: Request) => {
    const raw = /(?:^|;\s*)([^=;]+)=([A-Za-z0-9_-]{43})(?=;|$)/g;
    for (const m of (req.get('cookie') ?? '').matchAll(raw)) if (m[1] === cookieName) return m[2]!;
    return undefined;
  };
  const same = (a: string, b: string) =>
    a.length === b.length && timingSafeEqual(Buffer.from(a), Buffer.from(b));

  function token(req: Request, res: Response, overwrite = false): string {
    if (holdsSession(req)) return sync.generateToken(req, overwrite);
    let nonce = nonceOf(req);
    // A Secure cookie only goes out over https (behind the proxy): as for the session cookie.
    if (!nonce && (!secure || req.secure)) {
      nonce = randomBytes(32).toString('base64url');
      res.cookie(cookieName, nonce, { httpOnly: true, sameSite: 'strict', secure, path: '/' });
    }
    return nonce ? mac(nonce) : '';
  }

  const protection: RequestHandler = (req, res, next) => {
    if (SAFE_METHODS.has(req.method)) return next();
    if (holdsSession(req)) return sync.csrfSynchronisedProtection(req, res, next);
    const nonce = nonceOf(req);
    const sent = req.get('x-csrf-token') ?? '';
    if (nonce && sent && same(sent, mac(nonce))) return next();
    next(sync.invalidCsrfTokenError);
  };

  return { protection, token };
}
