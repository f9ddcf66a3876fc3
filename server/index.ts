import type { Server } from 'node:http';
import type { Logger } from 'pino';
import { createApp } from './app';
import { DEFAULT_CHECK_INTERVAL_MS } from './audit/watch';
import {
  DEFAULT_REVIEW_DUE_CHECK_MS,
  DEFAULT_REVIEW_INTERVAL_MONTHS,
} from './modules/review-due/review-due.service';
import { createDb, createPool } from './db/client';
import { defaultConfig, type AppConfig } from './deps';
import { startJobs } from './jobs/worker';
import { createLogger } from './logger';
import { MailSender } from './mail/sender';
import { SearchService } from './search/search-service';
import { upgradeLegacyFiles } from './storage/files';
import { adoptDiskFiles, s3FileStore } from './storage/s3-store';

export interface RunningServer {
  server: Server;
  search: SearchService;
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
  if (config.s3) {
    const copied = await adoptDiskFiles(config.uploadDir, s3FileStore(config.s3));
    if (copied)
      logger.info({ copied, bucket: config.s3.bucket }, 'files kept on disk copied into the bucket');
  } else {
    const moved = await upgradeLegacyFiles(config.uploadDir);
    if (moved) logger.info({ moved }, 'uploaded files moved to their SHA-256 names');
  }
  const mailer = config.smtp ? new MailSender(db, config.smtp, logger) : undefined;
  const search = new SearchService(db, opts.databaseUrl, logger);
  await search
    .start()
    .catch((err: Error) =>
      logger.warn({ msg: err.message }, 'search index not built yet; retrying in the background'),
    );
  const app = createApp({ db, pool, logger, config, mailer, search });
  // Mail delivery and the periodic checks (audit chain, reviews due) are jobs in PostgreSQL: each
  // runs at start and then on its schedule, once for all processes (server/jobs/worker.ts).
  const minutes = (ms: number) => (ms > 0 ? Math.max(1, ms / 60_000) : 0);
  const jobs = await startJobs(pool, db, logger, mailer, {
    publicUrl: config.publicUrl,
    reviewIntervalMonths: config.reviewIntervalMonths ?? DEFAULT_REVIEW_INTERVAL_MONTHS,
    auditCheckMinutes: minutes(config.auditCheckIntervalMs ?? DEFAULT_CHECK_INTERVAL_MS),
    reviewDueCheckMinutes: minutes(config.reviewDueCheckIntervalMs ?? DEFAULT_REVIEW_DUE_CHECK_MS),
  });

  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(opts.port, host, (err?: Error) => (err ? reject(err) : resolve(s)));
    s.once('error', reject);
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : opts.port;

  return {
    server,
    search,
    url: `http://${host}:${port}`,
    async close() {
      // Stop accepting, let requests in flight finish, close each keep-alive connection as soon
      // as it falls idle, and cut whatever is left after 8 s.
      await new Promise<void>((resolve) => {
        const sweep = setInterval(() => server.closeIdleConnections(), 100);
        const timer = setTimeout(() => server.closeAllConnections(), 8_000);
        server.close(() => {
          clearInterval(sweep);
          clearTimeout(timer);
          resolve();
        });
        server.closeIdleConnections();
      });
      app.deps.auth.sessions.store.close();
      // Each step is bounded: a connection left broken by a database restart must not hold up exit.
      await settleWithin(6_000, jobs.stop(), 'job queue', logger);
      await settleWithin(3_000, mailer?.stop(), 'mail sender', logger);
      await settleWithin(3_000, search.stop(), 'search listener', logger);
      await settleWithin(3_000, pool.end(), 'database pool', logger);
    },
  };
}

/** Waits for a shutdown step, but no longer than `ms`; a step that overruns is logged and left. */
async function settleWithin(ms: number, step: Promise<unknown> | undefined, what: string, logger: Logger) {
  if (!step) return;
  let timer: NodeJS.Timeout | undefined;
  const overrun = new Promise<'overrun'>((resolve) => (timer = setTimeout(() => resolve('overrun'), ms)));
  const outcome = await Promise.race([
    step.then(
      () => 'done' as const,
      () => 'done' as const,
    ),
    overrun,
  ]);
  clearTimeout(timer);
  if (outcome === 'overrun')
    logger.warn({ step: what, ms }, 'shutdown step did not finish in time; going on');
}
