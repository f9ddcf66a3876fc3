// `npm run dev`: the API on :5480 behind Vite's dev server with hot reload.
import path from 'node:path';
import { createServer } from 'vite';
import { startServer } from '../index';
import { acquireStartLock } from './lock';
import { PORTS, prepareDatabase, projectRoot, readOrCreateSecret, say, startMainCluster } from './prepare';
import { stopCluster } from './postgres';
import { startFakeSmtp } from '../mail/fake-smtp';
import { openObjectStore } from './object-store';

const releaseLock = acquireStartLock('http://127.0.0.1:5173 (dev)');
const cluster = startMainCluster();
const databaseUrl = await prepareDatabase(cluster, 'benchwright');
const mailCatcher = await startFakeSmtp(0);
const files = await openObjectStore();
const api = await startServer({
  databaseUrl,
  port: PORTS.app,
  config: {
    sessionSecret: readOrCreateSecret('session'),
    publicUrl: 'http://127.0.0.1:5173',
    smtp: {
      host: '127.0.0.1',
      port: mailCatcher.port,
      from: 'Benchwright <benchwright@tallowcreek.example>',
    },
    s3: files.s3,
  },
});
const vite = await createServer({ configFile: path.join(projectRoot, 'vite.config.ts') });
await vite.listen(5173);
say(`API at ${api.url}; open http://127.0.0.1:5173 (hot reload)`);

process.on('SIGINT', async () => {
  await vite.close();
  await api.close();
  await mailCatcher.close();
  await files.close();
  stopCluster(cluster.dataDir);
  releaseLock();
  process.exit(0);
});
