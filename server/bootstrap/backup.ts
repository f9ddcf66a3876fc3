// `npm run backup`: archive npm start's database and uploads into .data/backups/, and say whether
// every stored file and signature still verifies.
import path from 'node:path';
import { createBackup } from '../backup/archive';
import { reportRecords } from '../backup/report';
import { clusterIsRunning, stopCluster } from './postgres';
import { dataDir, say, startMainCluster } from './prepare';

const cluster = startMainCluster();
const wasRunning = clusterIsRunning(cluster.dataDir);
const uploadDir = path.join(dataDir, 'uploads');
const file = createBackup({
  databaseUrl: cluster.urlFor('benchwright'),
  uploadDir,
  outDir: path.join(dataDir, 'backups'),
});
say(`backup written: ${file}`);
await reportRecords(cluster.urlFor('benchwright'), uploadDir, say);
if (!wasRunning) stopCluster(cluster.dataDir);
