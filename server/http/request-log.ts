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

/**
 * One line per finished request: id, method, path, status and time taken; 4xx at warn, 5xx at
 * error, and a warning for one whose answer was cut off. Headers and bodies are never logged, so
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
    const line = (level: 'info' | 'warn' | 'error', msg: string) => {
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
    res.on('finish', () =>
      line(res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info', 'request completed'),
    );
    // The client went away (or the socket broke) before the whole answer was sent.
    res.on('close', () => {
      if (!res.writableFinished) line('warn', 'request closed before its answer was complete');
    });
    next();
  };
}
