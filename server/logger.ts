import pino from 'pino';
import { env } from './config/env';

/** Structured logs; credentials, cookies and tokens are never written. `destination` defaults to stdout, written asynchronously. */
export function createLogger(level: string = env.LOG_LEVEL, destination?: pino.DestinationStream) {
  const options: pino.LoggerOptions = {
    level,
    redact: {
      paths: [
        'req.headers.cookie',
        'req.headers.authorization',
        'req.headers["x-csrf-token"]',
        'res.headers["set-cookie"]',
        'password',
        '*.password',
        'token',
        '*.token',
      ],
      censor: '[redacted]',
    },
  };
  // To stdout without waiting on each write: lines that arrive while one write is under way leave
  // together, so a busy server makes a write per batch, not per request (flushed at exit).
  return pino(options, destination ?? pino.destination({ dest: 1, sync: false }));
}
