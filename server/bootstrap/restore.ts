// `npm run restore FILE [DATABASE]`: restore an archive into a new database of npm start's cluster
// (default name benchwright_restored_<time>), and its files into the bucket (each under its own
// SHA-256, so nothing there is overwritten) or, with FILE_STORE=disk, into an upload folder next to
// the others. Nothing is overwritten.
import path from 'node:path';
import { restoreBackup } from '../backup/archive';
import { reportRecords } from '../backup/report';
import { fileStore } from '../storage/files';
import { s3FileStore } from '../storage/s3-store';
import { openObjectStore } from './object-store';
import { dataDir, say, startMainCluster } from './prepare';

const [file, name] = process.argv.slice(2);
if (!file) {
  console.error('usage: npm run restore -- FILE [DATABASE]');
  process.exit(2);
}
const database = name ?? `benchwright_restored_${Date.now()}`;
const cluster = startMainCluster();
const store = await openObjectStore();
const uploadDir = path.join(dataDir, `uploads-${database}`);
await restoreBackup({
  file: path.resolve(file),
  adminUrl: cluster.adminUrl,
  databaseUrl: cluster.urlFor(database),
  uploadDir,
  s3: store.s3,
});
say(`restored into database ${database} with files in ${store.s3 ? store.where : uploadDir}.`);
await reportRecords(cluster.urlFor(database), store.s3 ? s3FileStore(store.s3) : fileStore(uploadDir), say);
await store.close();
say(
  store.s3
    ? 'To use it, rename it to benchwright (with npm start stopped) or point DATABASE_URL at it.'
    : `To use it, rename it to benchwright and ${uploadDir} to ${path.join(dataDir, 'uploads')} (with npm start stopped).`,
);
