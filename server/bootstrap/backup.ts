// `npm run backup`: archive npm start's database and uploads into .data/backups/.
import path from 'node:path';
import { createBackup } from '../backup/archive';
import { clusterIsRunning, stopCluster } from './postgres';
import { dataDir, say, startMainCluster } from './prepare';

const cluster = startMainCluster();
const wasRunning = clusterIsRunning(cluster.dataDir);
const file = createBackup({ databaseUrl: cluster.urlFor('benchwright'), uploadDir: path.join(dataDir, 'uploads'), outDir: path.join(dataDir, 'backups') });
say(`backup written: ${file}`);
if (!wasRunning) stopCluster(cluster.dataDir);
