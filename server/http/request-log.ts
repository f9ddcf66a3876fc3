import { randomUUID } from 'node:crypto';
import type { RequestHandler } from 'express';
import type { Logger } from 'pino';

declare module 'express-serve-static-core' {
  interface Request {
    /** This request's id: in its log lines and in the audit rows it writes. */
    id: string;
    /** The logger bound to this request's id. */
    log: Logger;
  }
}

/** Path segments that are secrets themselves (a one-time set-password link) are not logged. */
// Express matches paths in any case, so these do too.
const SECRET_PATHS = [/^(\/api\/auth\/invitations\/)[^/?]+/i, /^(\/set-password\/)[^/?]+/i];
const loggedUrl = (url: string) => SECRET_PATHS.reduce((u, re) => u.replace(re, '$1[redacted]'), url);

/** A read that took longer than this is logged at info even when it succeeded. */
const SLOW_MS = 1_000;

/**
 * One line per finished request: id, method, path, status and time taken; 4xx at warn, 5xx at
 * error, a write (or anything not a plain read) at info, a successful read at debug (an operator
 * reads the audit log for who saw what; a line per page view costs a tenth of the signed-in
 * floor's CPU) unless it was slow, and a warning for one whose answer was cut off. Headers and bodies are never logged, so
 * no cookie, token or password can reach the log; the per-request child logger is made only when
 * a handler logs something.
 */
export function requestLog(logger: Logger, opts: { skip?: (url: string) => boolean } = {}): RequestHandler {
  return (req, res, next) => {
    const started = performance.now();
    req.id = randomUUID();
    let child: Logger | undefined;
    Object.defineProperty(req, 'log', {
      configurable: true,
      get: () => (child ??= logger.child({ reqId: req.id })),
    });
    const line = (level: 'debug' | 'info' | 'warn' | 'error', msg: string) => {
      if (!logger.isLevelEnabled(level) || opts.skip?.(req.originalUrl)) return;
      logger[level](
        {
          req: { id: req.id, method: req.method, url: loggedUrl(req.originalUrl) },
          res: { statusCode: res.statusCode },
          responseTime: Math.round(performance.now() - started),
        },
        msg,
      );
    };
    const read = req.method === 'GET' || req.method === 'HEAD';
    res.on('finish', () =>
      line(
        res.statusCode >= 500
          ? 'error'
          : res.statusCode >= 400
            ? 'warn'
            : read && performance.now() - started < SLOW_MS
              ? 'debug'
              : 'info',
        'request completed',
      ),
    );
    // The client went away (or the socket broke) before the whole answer was sent.
    res.on('close', () => {
      if (!res.writableFinished) line('warn', 'request closed before its answer was complete');
    });
    next();
  };
}
