// `npm run backup`: archive npm start's database and files (the bucket, or .data/uploads with
// FILE_STORE=disk) into .data/backups/, and say whether every stored file and signature still verifies.
import path from 'node:path';
import { createBackup } from '../backup/archive';
import { reportRecords } from '../backup/report';
import { fileStore } from '../storage/files';
import { s3FileStore } from '../storage/s3-store';
import { openObjectStore } from './object-store';
import { clusterIsRunning, stopCluster } from './postgres';
import { dataDir, say, startMainCluster } from './prepare';

const cluster = startMainCluster();
const wasRunning = clusterIsRunning(cluster.dataDir);
const uploadDir = path.join(dataDir, 'uploads');
const store = await openObjectStore();
const file = await createBackup({
  databaseUrl: cluster.urlFor('benchwright'),
  uploadDir,
  s3: store.s3,
  outDir: path.join(dataDir, 'backups'),
});
say(`backup written: ${file} (files from ${store.where})`);
await reportRecords(
  cluster.urlFor('benchwright'),
  store.s3 ? s3FileStore(store.s3) : fileStore(uploadDir),
  say,
);
await store.close();
if (!wasRunning) stopCluster(cluster.dataDir);
