// One contract for both file stores (server/storage): bytes kept under their SHA-256, the same
// bytes kept once, and bytes altered or removed behind the store's back never handed out.
import { createHash } from 'node:crypto';
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { DeleteObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { afterAll, describe, expect, it } from 'vitest';
import { fileStore, type FileStore } from '../../../server/storage/files';
import { adoptDiskFiles, s3FileStore } from '../../../server/storage/s3-store';
import { createTestBucket } from '../../support/test-bucket';

/** A store under test and the ways to reach its bytes without it. */
interface Subject {
  store: FileStore;
  /** The names it holds, whatever they are. */
  names(): Promise<string[]>;
  overwrite(name: string, bytes: Buffer): Promise<void>;
  remove(name: string): Promise<void>;
  close(): Promise<void>;
}

async function disk(): Promise<Subject> {
  const dir = mkdtempSync(path.join(tmpdir(), 'bw-store-'));
  return {
    store: fileStore(dir),
    names: async () => readdirSync(dir),
    async overwrite(name, bytes) {
      rmSync(path.join(dir, name)); // stored read-only
      writeFileSync(path.join(dir, name), bytes);
    },
    remove: async (name) => rmSync(path.join(dir, name)),
    close: async () => rmSync(dir, { recursive: true, force: true }),
  };
}

async function s3(): Promise<Subject> {
  const bucket = await createTestBucket();
  const Bucket = bucket.settings.bucket;
  return {
    store: bucket.store,
    async names() {
      const out: string[] = [];
      for await (const key of bucket.store.keys()) out.push(key);
      return out;
    },
    // Straight through the S3 API, as someone with write access to the bucket could.
    overwrite: async (name, bytes) => {
      await bucket.client.send(new PutObjectCommand({ Bucket, Key: name, Body: bytes }));
    },
    remove: async (name) => {
      await bucket.client.send(new DeleteObjectCommand({ Bucket, Key: name }));
    },
    close: bucket.drop,
  };
}

// FIPS 180-2, appendix B.1: SHA-256("abc").
const ABC = Buffer.from('abc');
const ABC_SHA256 = 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad';
const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

const opened: Subject[] = [];
afterAll(async () => {
  for (const s of opened) await s.close();
});

describe.each([
  ['disk', disk],
  ['S3', s3],
])('the %s file store', (_kind, open) => {
  const subject = async () => {
    const s = await open();
    opened.push(s);
    return s;
  };

  it('keeps bytes under their SHA-256 and gives the same bytes back', async () => {
    const { store, names } = await subject();
    expect(await store.put(ABC)).toBe(ABC_SHA256);
    expect(await names()).toEqual([ABC_SHA256]);
    expect((await store.get(ABC_SHA256))?.toString()).toBe('abc');
    expect(await store.exists(ABC_SHA256)).toBe(true);
  });

  it('keeps the same bytes once, and other bytes beside them', async () => {
    const { store, names } = await subject();
    const other = Buffer.from('another file');
    await store.put(ABC);
    await store.put(Buffer.from(ABC));
    expect(await store.put(other)).toBe(sha256(other));
    expect((await names()).sort()).toEqual([ABC_SHA256, sha256(other)].sort());
  });

  it('refuses bytes altered behind its back, and takes the right bytes again', async () => {
    const { store, overwrite } = await subject();
    await store.put(ABC);
    await overwrite(ABC_SHA256, Buffer.from('abd'));
    expect(await store.get(ABC_SHA256)).toBeNull();
    expect(await store.exists(ABC_SHA256)).toBe(false);
    // Storing the original again repairs the object.
    expect(await store.put(ABC)).toBe(ABC_SHA256);
    expect((await store.get(ABC_SHA256))?.toString()).toBe('abc');
  });

  it('answers null for removed bytes, unknown hashes and names that are not a SHA-256', async () => {
    const { store, remove } = await subject();
    await store.put(ABC);
    await remove(ABC_SHA256);
    expect(await store.get(ABC_SHA256)).toBeNull();
    expect(await store.exists(ABC_SHA256)).toBe(false);
    expect(await store.get('0'.repeat(64))).toBeNull();
    for (const name of ['../secret', ABC_SHA256.toUpperCase(), ABC_SHA256.slice(1), ''])
      expect(await store.get(name), name).toBeNull();
  });
});

describe('the S3 file store', () => {
  it('fails loudly when its bucket is not there, rather than reading every file as missing', async () => {
    const { settings } = await createTestBucket().then(async (b) => {
      await b.drop();
      return b;
    });
    const store = s3FileStore(settings);
    await expect(store.get(ABC_SHA256)).rejects.toThrow(/bucket/i);
    await expect(store.put(ABC)).rejects.toThrow(/bucket/i);
  });
});

describe('a shop moving its files from disk to a bucket', () => {
  it('copies each intact file once, older random names by their hash, and leaves altered files out', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'bw-adopt-'));
    const bucket = await createTestBucket();
    try {
      const legacy = Buffer.from('kept under a random name');
      await fileStore(dir).put(ABC);
      writeFileSync(path.join(dir, 'b'.repeat(32)), legacy);
      writeFileSync(path.join(dir, sha256(Buffer.from('original'))), 'altered');
      expect(await adoptDiskFiles(dir, bucket.store)).toBe(2);
      const keys: string[] = [];
      for await (const key of bucket.store.keys()) keys.push(key);
      expect(keys.sort()).toEqual([ABC_SHA256, sha256(legacy)].sort());
      expect((await bucket.store.get(sha256(legacy)))?.toString()).toBe('kept under a random name');
      expect(await adoptDiskFiles(dir, bucket.store)).toBe(0);
    } finally {
      await bucket.drop();
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
