// Where the start, dev, backup and restore commands keep files (FILE_STORE, S3_*: server/config/env.ts):
// a real object store at S3_ENDPOINT, else a local fake on loopback with its objects in .data/s3,
// or, with FILE_STORE=disk, plain files in .data/uploads and no object store at all.
import path from 'node:path';
import { env } from '../config/env';
import { startFakeS3 } from '../storage/fake-s3';
import { ensureBucket, s3SettingsFromEnv, type S3Settings } from '../storage/s3-store';
import { dataDir, PORTS } from './prepare';

export interface ObjectStore {
  /** The bucket, or undefined for files on disk. */
  s3?: S3Settings;
  /** One line for people: where the files are. */
  where: string;
  close(): Promise<void>;
}

export async function openObjectStore(): Promise<ObjectStore> {
  if (env.FILE_STORE === 'disk')
    return { where: `files on disk in ${path.join(dataDir, 'uploads')}`, close: async () => {} };
  if (env.S3_ENDPOINT) {
    const s3 = s3SettingsFromEnv(env);
    await ensureBucket(s3);
    return { s3, where: `bucket ${s3.bucket} at ${s3.endpoint}`, close: async () => {} };
  }
  // The fake's port taken (npm start running while a backup is made, or another program): any free port,
  // the same folder.
  const dir = path.join(dataDir, 's3');
  const options = { dir, buckets: [env.S3_BUCKET] };
  const fake = await startFakeS3({ ...options, port: PORTS.mainS3 }).catch((err: NodeJS.ErrnoException) => {
    if (err.code !== 'EADDRINUSE') throw err;
    return startFakeS3({ ...options, port: 0 });
  });
  return {
    s3: s3SettingsFromEnv(env, fake.settings(env.S3_BUCKET)),
    where: `bucket ${env.S3_BUCKET} in the local object-store fake on ${fake.endpoint} (objects in ${dir})`,
    close: fake.close,
  };
}
