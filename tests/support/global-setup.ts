import { rmSync } from 'node:fs';
import path from 'node:path';
import { ListBucketsCommand } from '@aws-sdk/client-s3';
import type { TestProject } from 'vitest/node';
import { env } from '../../server/config/env';
import { dataDir, PORTS, TEST_SLOT } from '../../server/bootstrap/prepare';
import { FAKE_S3_CREDENTIALS, startFakeS3 } from '../../server/storage/fake-s3';
import { s3Client, s3SettingsFromEnv, type S3Settings } from '../../server/storage/s3-store';
import { prepareTestTemplate, startTestCluster, TEMPLATE_DB } from './test-cluster';

declare module 'vitest' {
  export interface ProvidedContext {
    testDb: {
      adminUrl: string;
      template: string;
      urlPrefix: string;
      appUrlPrefix: string;
      appPassword: string;
      dataDir: string;
      port: number;
    };
    /** The object store the tests make their buckets in (the bucket field is unused). */
    testS3: S3Settings;
  }
}

/**
 * The object store: S3_ENDPOINT's when set, otherwise the fake on the slot's port. A fake already
 * answering there (the other project's setup in the same run) is used as it is; only its starter stops it.
 */
async function objectStore() {
  if (env.S3_ENDPOINT) return { settings: s3SettingsFromEnv(env), close: async () => {} };
  const running = s3SettingsFromEnv(env, {
    endpoint: `http://127.0.0.1:${PORTS.testS3}`,
    credentials: FAKE_S3_CREDENTIALS,
  });
  const answers = await s3Client(running, { maxAttempts: 1 })
    .send(new ListBucketsCommand({}))
    .then(
      () => true,
      () => false,
    );
  if (answers) return { settings: running, close: async () => {} };
  // Buckets left by an interrupted run go with the folder.
  const dir = path.join(dataDir, `s3-test-${TEST_SLOT}`);
  rmSync(dir, { recursive: true, force: true });
  const fake = await startFakeS3({ port: PORTS.testS3, dir }).catch((err: NodeJS.ErrnoException) => {
    if (err.code === 'EADDRINUSE')
      throw new Error(`port ${PORTS.testS3} (BW_TEST_SLOT=${TEST_SLOT}) is taken by another program`);
    throw err;
  });
  return { settings: fake.settings('unused'), close: fake.close };
}

/** Provides the test cluster and object store to the API and browser tests; prepares them when vitest runs alone. */
export default async function setup(project: TestProject) {
  const cluster = process.env.BW_TEST_PREPARED ? startTestCluster() : (await prepareTestTemplate()).cluster;
  project.provide('testDb', {
    adminUrl: cluster.adminUrl,
    template: TEMPLATE_DB,
    urlPrefix: cluster.urlFor(''),
    appUrlPrefix: cluster.appUrlFor(''),
    appPassword: cluster.appPassword,
    dataDir: cluster.dataDir,
    port: cluster.port,
  });
  const store = await objectStore();
  project.provide('testS3', store.settings);
  return store.close;
}
