// The file store on an S3-compatible object store, with the disk store's guarantees (files.ts): an
// object's key is the SHA-256 of its bytes, the same bytes are stored once, and every read hashes
// the bytes again, so an object altered or replaced in the bucket is never handed out as the original.
import { createHash } from 'node:crypto';
import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import {
  CreateBucketCommand,
  GetObjectCommand,
  HeadBucketCommand,
  paginateListObjectsV2,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
  type S3ClientConfig,
} from '@aws-sdk/client-s3';
import type { Env } from '../config/env';
import { fileStore, LEGACY_NAME, SHA256, sha256Of, type FileStore } from './files';

// The SDK warns that its releases after January 2027 need Node 22; this project runs on Node 20 with
// the SDK pinned, so the notice says nothing an operator can act on.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';

export interface S3Settings {
  endpoint: string;
  bucket: string;
  region: string;
  /** Bucket in the path (http://host/bucket/key) rather than in the host name. */
  forcePathStyle: boolean;
  /** Unset: the SDK's own chain (environment, ~/.aws, an instance role). */
  credentials?: { accessKeyId: string; secretAccessKey: string };
}

/** The settings from the environment (server/config/env.ts); `endpoint` stands in when S3_ENDPOINT is unset. */
export function s3SettingsFromEnv(env: Env, fake?: Pick<S3Settings, 'endpoint' | 'credentials'>): S3Settings {
  const credentials =
    env.S3_ACCESS_KEY_ID && env.S3_SECRET_ACCESS_KEY
      ? { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY }
      : undefined;
  const endpoint = env.S3_ENDPOINT ?? fake?.endpoint;
  if (!endpoint) throw new Error('S3_ENDPOINT is not set and no local object store was started');
  return {
    endpoint,
    bucket: env.S3_BUCKET,
    region: env.S3_REGION,
    forcePathStyle: env.S3_ENDPOINT ? env.S3_FORCE_PATH_STYLE : true,
    credentials: env.S3_ENDPOINT ? credentials : fake?.credentials,
  };
}

export function s3Client(s: S3Settings, extra: S3ClientConfig = {}) {
  return new S3Client({
    endpoint: s.endpoint,
    region: s.region,
    forcePathStyle: s.forcePathStyle,
    credentials: s.credentials,
    // Checksums only where the API requires them: several S3-compatible stores refuse the newer
    // default checksum trailers, and each put carries Content-MD5 and each read is re-hashed anyway.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    ...extra,
  });
}

const isMissing = (err: unknown) =>
  err instanceof S3ServiceException && (err.name === 'NoSuchKey' || err.name === 'NotFound');

export interface S3FileStore extends FileStore {
  readonly bucket: string;
  /** Every key in the bucket that names a content (a SHA-256). */
  keys(): AsyncGenerator<string>;
}

/** A store in one bucket: one object per content, keyed by its SHA-256 (hex). */
export function s3FileStore(settings: S3Settings, client = s3Client(settings)): S3FileStore {
  const Bucket = settings.bucket;
  async function get(sha256: string) {
    if (!SHA256.test(sha256)) return null;
    let bytes: Buffer;
    try {
      const out = await client.send(new GetObjectCommand({ Bucket, Key: sha256 }));
      bytes = Buffer.from(await out.Body!.transformToByteArray());
    } catch (err) {
      if (isMissing(err)) return null;
      throw err;
    }
    return sha256Of(bytes) === sha256 ? bytes : null;
  }
  return {
    bucket: Bucket,
    async put(bytes) {
      const sha256 = sha256Of(bytes);
      // An intact object is left alone (one copy per content, also in a versioned bucket); a
      // missing or altered one is written, and the store checks the bytes arrived (Content-MD5).
      if (await get(sha256)) return sha256;
      await client.send(
        new PutObjectCommand({
          Bucket,
          Key: sha256,
          Body: bytes,
          ContentType: 'application/octet-stream',
          ContentMD5: createHash('md5').update(bytes).digest('base64'),
        }),
      );
      return sha256;
    },
    get,
    exists: async (sha256) => (await get(sha256)) !== null,
    async *keys() {
      for await (const page of paginateListObjectsV2({ client }, { Bucket }))
        for (const o of page.Contents ?? []) if (o.Key && SHA256.test(o.Key)) yield o.Key;
    },
  };
}

/** Makes the bucket when it does not exist yet; a store that refuses says why. */
export async function ensureBucket(settings: S3Settings, client = s3Client(settings)) {
  try {
    await client.send(new HeadBucketCommand({ Bucket: settings.bucket }));
    return;
  } catch (err) {
    if (!(err instanceof S3ServiceException && err.$metadata.httpStatusCode === 404)) throw err;
  }
  try {
    await client.send(new CreateBucketCommand({ Bucket: settings.bucket }));
  } catch (err) {
    throw new Error(
      `the bucket ${settings.bucket} does not exist at ${settings.endpoint} and could not be made: ${(err as Error).message}`,
      { cause: err },
    );
  }
}

/**
 * Copies the files a disk store left in `dir` (a shop moving to object storage) into the bucket, each
 * once: intact files under their SHA-256, older random names by their bytes' hash (as
 * upgradeLegacyFiles would). The folder is left as it was. Returns how many were copied.
 */
export async function adoptDiskFiles(dir: string, store: S3FileStore) {
  let names: string[];
  try {
    names = (await readdir(dir)).filter((n) => SHA256.test(n) || LEGACY_NAME.test(n));
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return 0;
    throw err;
  }
  if (!names.length) return 0;
  const held = new Set<string>();
  for await (const key of store.keys()) held.add(key);
  const disk = fileStore(dir);
  let copied = 0;
  for (const name of names.filter((n) => !held.has(n))) {
    const bytes = SHA256.test(name) ? await disk.get(name) : await readFile(path.join(dir, name));
    if (!bytes || held.has(sha256Of(bytes))) continue;
    held.add(await store.put(bytes));
    copied++;
  }
  return copied;
}
