import pino from 'pino';

/** Structured logs; credentials, cookies and tokens are never written. `destination` defaults to stdout. */
export function createLogger(level = process.env.LOG_LEVEL ?? 'info', destination?: pino.DestinationStream) {
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
  return destination ? pino(options, destination) : pino(options);
}
