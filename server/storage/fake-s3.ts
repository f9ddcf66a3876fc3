// A local stand-in for the shop's object store: s3rver speaks the S3 API on loopback and keeps the
// objects in a folder, so npm start and the tests run the same code a shop with a real store runs.
import { mkdirSync } from 'node:fs';
import { createServer } from 'node:http';
import S3rver from 's3rver';
import type { S3Settings } from './s3-store';

/** s3rver's built-in account; the fake answers on loopback only. */
export const FAKE_S3_CREDENTIALS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' };

/**
 * Starts the fake on 127.0.0.1:port (0: any free port) with these buckets made. A port in use
 * rejects with EADDRINUSE (s3rver's own run() would throw it outside any promise).
 */
export async function startFakeS3(opts: { port: number; dir: string; buckets?: string[] }) {
  // s3rver answers ListBuckets with a 500 until its folder exists.
  mkdirSync(opts.dir, { recursive: true });
  const fake = new S3rver({
    directory: opts.dir,
    silent: true,
    configureBuckets: (opts.buckets ?? []).map((name) => ({ name })),
  });
  await fake.configureBuckets();
  const server = createServer(fake.callback());
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, '127.0.0.1', () => resolve());
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : opts.port;
  const endpoint = `http://127.0.0.1:${port}`;
  return {
    port,
    endpoint,
    settings: (bucket: string): S3Settings => ({
      endpoint,
      bucket,
      region: 'us-east-1',
      forcePathStyle: true,
      credentials: FAKE_S3_CREDENTIALS,
    }),
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}

export type FakeS3 = Awaited<ReturnType<typeof startFakeS3>>;
