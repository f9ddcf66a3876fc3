import { csrfSync } from 'csrf-sync';

/**
 * Synchronizer-token CSRF protection: the token lives in the session and every state-changing
 * request carries it in the X-CSRF-Token header (sign-in included).
 */
export const { csrfSynchronisedProtection: csrfProtection, generateToken: csrfToken } = csrfSync({
  getTokenFromRequest: (req) => req.get('x-csrf-token'),
});
