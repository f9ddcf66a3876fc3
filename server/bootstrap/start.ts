// `npm start`: private PostgreSQL, migrations, demo content, client build, one Express process.
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { build } from 'vite';
import { env } from '../config/env';
import { readDemoPeople } from '../db/seed';
import { startServer } from '../index';
import { acquireStartLock } from './lock';
import {
  dataDir,
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
const host = '127.0.0.1';
const url = `http://${host}:${port}`;

mkdirSync(dataDir, { recursive: true });
const releaseLock = acquireStartLock(url);

const cluster = startMainCluster();
const databaseUrl = await prepareDatabase(cluster, 'benchwright');

say('building the client…');
await build({ logLevel: 'warn', configFile: path.join(projectRoot, 'vite.config.ts') });

// Mail: the shop's relay when SMTP_HOST is set, otherwise a local catcher that keeps every message.
const relay = env.SMTP_HOST ? { host: env.SMTP_HOST, port: env.SMTP_PORT } : null;
const mailCatcher = relay ? null : await startFakeSmtp(2525).catch(() => startFakeSmtp(0));
const smtp = relay ?? { host: '127.0.0.1', port: mailCatcher!.port };
// Files: S3_ENDPOINT's bucket, a local object-store fake, or the disk (FILE_STORE=disk).
const files = await openObjectStore();

const running = await startServer({
  databaseUrl,
  host,
  port,
  config: {
    sessionSecret: readOrCreateSecret('session'),
    auditCheckIntervalMs: env.AUDIT_CHECK_MINUTES * 60_000,
    reviewIntervalMonths: env.REVIEW_INTERVAL_MONTHS,
    clientDir: path.join(projectRoot, 'dist/client'),
    publicUrl: url,
    // Names a reverse proxy in front may pass on (comma-separated); others are answered 421.
    allowedHosts: env.BW_ALLOWED_HOSTS,
    smtp: { ...smtp, from: env.SMTP_FROM },
    s3: files.s3,
  },
}).catch((err: NodeJS.ErrnoException) => {
  if (err.code === 'EADDRINUSE')
    console.error(`[benchwright] port ${port} is taken by another program; set PORT=… and try again.`);
  releaseLock();
  throw err;
});

console.log(`
  Benchwright is running at ${running.url}
  Database: PostgreSQL on 127.0.0.1:${PORTS.mainDb} (data in ${cluster.dataDir})
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
  stopCluster(cluster.dataDir);
  releaseLock();
  process.exit(0);
}
process.on('SIGINT', () => void stop('SIGINT'));
process.on('SIGTERM', () => void stop('SIGTERM'));
