import { randomBytes } from 'node:crypto';
import { DeleteBucketCommand, DeleteObjectsCommand, paginateListObjectsV2 } from '@aws-sdk/client-s3';
import { inject } from 'vitest';
import { ensureBucket, s3Client, s3FileStore } from '../../server/storage/s3-store';

/**
 * A bucket of its own for one test file on the test object store (the fake, or S3_ENDPOINT's), so a
 * test that alters an object never touches another file's; `drop` empties and removes it.
 */
export async function createTestBucket() {
  const settings = { ...inject('testS3'), bucket: `bw-t-${randomBytes(6).toString('hex')}` };
  const client = s3Client(settings);
  await ensureBucket(settings, client);
  return {
    settings,
    client,
    store: s3FileStore(settings, client),
    async drop() {
      for await (const page of paginateListObjectsV2({ client }, { Bucket: settings.bucket })) {
        const keys = (page.Contents ?? []).map((o) => ({ Key: o.Key! }));
        if (keys.length)
          await client.send(new DeleteObjectsCommand({ Bucket: settings.bucket, Delete: { Objects: keys } }));
      }
      await client.send(new DeleteBucketCommand({ Bucket: settings.bucket }));
      client.destroy();
    },
  };
}

export type TestBucket = Awaited<ReturnType<typeof createTestBucket>>;
