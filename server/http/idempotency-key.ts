import type { RequestHandler } from 'express';
import { refuse } from './errors';

/**
 * Takes the `Idempotency-Key` request header (draft-ietf-httpapi-idempotency-key-header) as the
 * body's `key`, for routes whose body carries one: a client may send either, and when it sends
 * both they must agree. The route's schema then checks the key as usual.
 */
export const idempotencyKeyHeader = (): RequestHandler[] => [
  (req, _res, next) => {
    const header = req.get('idempotency-key')?.trim();
    if (header === undefined) return next();
    const body = (req.body ?? {}) as Record<string, unknown>;
    if (body.key !== undefined && body.key !== header)
      return next(
        refuse({
          field: 'headers.idempotency-key',
          label: 'Idempotency-Key',
          reason: 'differs from the key in the body',
        }),
      );
    req.body = { ...body, key: header };
    next();
  },
];
