// `npm start`: private PostgreSQL (or DATABASE_URL), migrations, demo content, client build, then one
// Express process, or WORKERS=N of them (node:cluster, sharing the port; see server/bootstrap/worker.ts).
import nodeCluster from 'node:cluster';
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { build } from 'vite';
import { env } from '../config/env';
import { readDemoPeople } from '../db/seed';
import { startServer } from '../index';
import { acquireStartLock } from './lock';
import {
  dataDir,
  migrateDatabase,
  PORTS,
  prepareDatabase,
  projectRoot,
  readOrCreateSecret,
  say,
  startMainCluster,
} from './prepare';
import { stopCluster } from './postgres';
import { startFakeSmtp } from '../mail/fake-smtp';
import { openObjectStore } from './object-store';

const port = PORTS.app;
const host = env.BW_HOST;
const url = env.BW_PUBLIC_URL?.replace(/\/$/, '') ?? `http://${host}:${port}`;

mkdirSync(dataDir, { recursive: true });
const releaseLock = acquireStartLock(url);

// A shared PostgreSQL (several machines): migrations only with the owner's URL, never demo content.
const cluster = env.DATABASE_URL ? null : startMainCluster();
if (env.DATABASE_URL && env.DATABASE_OWNER_URL) await migrateDatabase(env.DATABASE_OWNER_URL);
const databaseUrl = cluster ? await prepareDatabase(cluster, 'benchwright') : env.DATABASE_URL!;

say('building the client…');
await build({ logLevel: 'warn', configFile: path.join(projectRoot, 'vite.config.ts') });

// Mail: the shop's relay when SMTP_HOST is set, otherwise a local catcher that keeps every message.
const relay = env.SMTP_HOST ? { host: env.SMTP_HOST, port: env.SMTP_PORT } : null;
const mailCatcher = relay ? null : await startFakeSmtp(2525).catch(() => startFakeSmtp(0));
const smtp = relay ?? { host: '127.0.0.1', port: mailCatcher!.port };
// Files: S3_ENDPOINT's bucket, a local object-store fake, or the disk (FILE_STORE=disk).
const files = await openObjectStore();

const settings: Parameters<typeof startServer>[0] = {
  databaseUrl,
  host,
  port,
  config: {
    sessionSecret: env.BW_SESSION_SECRET ?? readOrCreateSecret('session'),
    auditCheckIntervalMs: env.AUDIT_CHECK_MINUTES * 60_000,
    reviewIntervalMonths: env.REVIEW_INTERVAL_MONTHS,
    clientDir: path.join(projectRoot, 'dist/client'),
    publicUrl: url,
    // Names a reverse proxy in front may pass on (comma-separated); others are answered 421.
    allowedHosts: env.BW_ALLOWED_HOSTS,
    trustProxy: env.BW_TRUST_PROXY,
    smtp: { ...smtp, from: env.SMTP_FROM },
    s3: files.s3,
  },
};
const portTaken = (err: NodeJS.ErrnoException) => {
  if (err.code === 'EADDRINUSE')
    console.error(`[benchwright] port ${port} is taken by another program; set PORT=… and try again.`);
  releaseLock();
  throw err;
};
const running =
  env.WORKERS > 1 ? await startWorkers(env.WORKERS) : await startServer(settings).catch(portTaken);

/**
 * Forks the workers and resolves once each listens; a worker that dies later is replaced, one that
 * dies before listening stops the start.
 */
async function startWorkers(count: number) {
  nodeCluster.setupPrimary({ exec: path.join(projectRoot, 'server/bootstrap/worker.ts') });
  let closing = false;
  const fork = () => nodeCluster.fork({ BW_WORKER: JSON.stringify(settings) });
  await new Promise<void>((resolve, reject) => {
    let listening = 0;
    nodeCluster.on('listening', () => ++listening === count && resolve());
    nodeCluster.on('exit', (worker, code, signal) => {
      if (closing) return;
      if (listening < count)
        return reject(new Error(`an app process stopped while starting (${code ?? signal})`));
      console.error(
        `[benchwright] app process ${worker.process.pid} stopped (${code ?? signal}); starting another`,
      );
      fork();
    });
    for (let i = 0; i < count; i++) fork();
  }).catch((err: Error) => {
    closing = true;
    for (const w of Object.values(nodeCluster.workers ?? {})) w?.process.kill('SIGTERM');
    releaseLock();
    throw err;
  });
  return {
    url,
    async close() {
      closing = true;
      const workers = Object.values(nodeCluster.workers ?? {}).filter((w) => !!w);
      await Promise.all(
        workers.map(
          (w) =>
            new Promise<void>((resolve) => {
              if (w.isDead()) return resolve();
              w.once('exit', () => resolve());
              w.process.kill('SIGTERM');
            }),
        ),
      );
    },
  };
}

console.log(`
  Benchwright is running at ${running.url}${env.WORKERS > 1 ? ` (${env.WORKERS} processes)` : ''}
  Database: ${cluster ? `PostgreSQL on 127.0.0.1:${PORTS.mainDb} (data in ${cluster.dataDir})` : `DATABASE_URL (${new URL(databaseUrl).host})`}
  Files:    ${files.where}
  Mail:     ${mailCatcher ? `local mail catcher (SMTP) on 127.0.0.1:${mailCatcher.port}` : `relay ${smtp.host}:${smtp.port}`}; admins see the outbox under Mail outbox

  Demo sign-ins (Tallow Creek Valve Works):
${readDemoPeople()
  .map((p) => `    ${p.roles.join(' + ').padEnd(18)} ${p.email.padEnd(28)} ${p.password}`)
  .join('\n')}

  Stop with Ctrl+C; everything stays in the database for next time.
`);

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  say(`${signal}: finishing requests and stopping…`);
  await running.close();
  await mailCatcher?.close();
  await files.close();
  if (cluster) stopCluster(cluster.dataDir);
  releaseLock();
  process.exit(0);
}
process.on('SIGINT', () => void stop('SIGINT'));
process.on('SIGTERM', () => void stop('SIGTERM'));
