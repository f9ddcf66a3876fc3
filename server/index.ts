import type { Server } from 'node:http';
import type { Logger } from 'pino';
import { createApp } from './app';
import { createDb, createPool } from './db/client';
import { defaultConfig, type AppConfig } from './deps';
import { createLogger } from './logger';
import { MailSender } from './mail/sender';

export interface RunningServer {
  server: Server;
  url: string;
  close(): Promise<void>;
}

/** Listens on host:port and returns a handle whose close() drains requests, then the pool. */
export async function startServer(opts: {
  databaseUrl: string;
  host?: string;
  port: number;
  config: Partial<AppConfig> & Pick<AppConfig, 'sessionSecret'>;
  logger?: Logger;
}): Promise<RunningServer> {
  const logger = opts.logger ?? createLogger();
  const pool = createPool(opts.databaseUrl, logger);
  const db = createDb(pool);
  const host = opts.host ?? '127.0.0.1';
  const config = defaultConfig({ publicUrl: `http://${host}:${opts.port}`, ...opts.config });
  const mailer = config.smtp ? new MailSender(db, config.smtp, logger) : undefined;
  mailer?.start();
  const app = createApp({ db, pool, logger, config, mailer });

  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(opts.port, host, (err?: Error) => (err ? reject(err) : resolve(s)));
    s.once('error', reject);
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : opts.port;

  return {
    server,
    url: `http://${host}:${port}`,
    async close() {
      await new Promise<void>((resolve) => {
        const timer = setTimeout(() => server.closeAllConnections(), 8_000);
        server.close(() => {
          clearTimeout(timer);
          resolve();
        });
        server.closeIdleConnections();
      });
      (app.locals.sessionStore as { close(): void }).close();
      await mailer?.stop();
      await pool.end();
    },
  };
}
