// `npm start`: private PostgreSQL, migrations, demo content, client build, one Express process.
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { build } from 'vite';
import { readDemoPeople } from '../db/seed';
import { startServer } from '../index';
import { acquireStartLock } from './lock';
import {
  dataDir,
  portFrom,
  PORTS,
  prepareDatabase,
  projectRoot,
  readOrCreateSecret,
  say,
  startMainCluster,
} from './prepare';
import { stopCluster } from './postgres';
import { startFakeSmtp } from '../mail/fake-smtp';

const port = portFrom(process.env.PORT, PORTS.app);
const host = '127.0.0.1';
const url = `http://${host}:${port}`;

mkdirSync(dataDir, { recursive: true });
const releaseLock = acquireStartLock(url);

const cluster = startMainCluster();
const databaseUrl = await prepareDatabase(cluster, 'benchwright');

say('building the client…');
await build({ logLevel: 'warn', configFile: path.join(projectRoot, 'vite.config.ts') });

// Mail: the shop's relay when SMTP_HOST is set, otherwise a local catcher that keeps every message.
const relay = process.env.SMTP_HOST
  ? { host: process.env.SMTP_HOST, port: Number(process.env.SMTP_PORT ?? 25) }
  : null;
const mailCatcher = relay ? null : await startFakeSmtp(2525).catch(() => startFakeSmtp(0));
const smtp = relay ?? { host: '127.0.0.1', port: mailCatcher!.port };

// AUDIT_CHECK_MINUTES: how often the audit chain is re-checked (default hourly; 0: at start only).
const auditCheckMinutes = Number(process.env.AUDIT_CHECK_MINUTES ?? 60);
if (!Number.isFinite(auditCheckMinutes) || auditCheckMinutes < 0)
  throw new Error(
    `AUDIT_CHECK_MINUTES must be a number of minutes, not "${process.env.AUDIT_CHECK_MINUTES}"`,
  );

const running = await startServer({
  databaseUrl,
  host,
  port,
  config: {
    sessionSecret: readOrCreateSecret('session'),
    auditCheckIntervalMs: auditCheckMinutes * 60_000,
    clientDir: path.join(projectRoot, 'dist/client'),
    publicUrl: url,
    // Names a reverse proxy in front may pass on (comma-separated); others are answered 421.
    allowedHosts: (process.env.BW_ALLOWED_HOSTS ?? '')
      .split(',')
      .map((h) => h.trim())
      .filter(Boolean),
    smtp: { ...smtp, from: process.env.SMTP_FROM ?? 'Benchwright <benchwright@tallowcreek.example>' },
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
  stopCluster(cluster.dataDir);
  releaseLock();
  process.exit(0);
}
process.on('SIGINT', () => void stop('SIGINT'));
process.on('SIGTERM', () => void stop('SIGTERM'));
