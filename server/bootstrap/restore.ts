// `npm run restore FILE [DATABASE]`: restore an archive into a new database of npm start's cluster
// (default name benchwright_restored_<time>), and its uploads next to it. Nothing is overwritten.
import path from 'node:path';
import { restoreBackup } from '../backup/archive';
import { reportRecords } from '../backup/report';
import { dataDir, say, startMainCluster } from './prepare';

const [file, name] = process.argv.slice(2);
if (!file) {
  console.error('usage: npm run restore -- FILE [DATABASE]');
  process.exit(2);
}
const database = name ?? `benchwright_restored_${Date.now()}`;
const cluster = startMainCluster();
const uploadDir = path.join(dataDir, `uploads-${database}`);
await restoreBackup({
  file: path.resolve(file),
  adminUrl: cluster.adminUrl,
  databaseUrl: cluster.urlFor(database),
  uploadDir,
});
say(`restored into database ${database} with uploads in ${uploadDir}.`);
await reportRecords(cluster.urlFor(database), uploadDir, say);
say('To use it, rename it to benchwright (with npm start stopped) or point DATABASE_URL at it.');
