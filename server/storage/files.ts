// The file store: bytes are kept under their own SHA-256, so a stored name can only ever mean one
// content, and reading re-hashes them, so bytes altered on disk are never handed out as the original.
// Two stores keep this contract: a folder on the local disk (here) and an S3 bucket (s3-store.ts).
import { createHash, randomBytes } from 'node:crypto';
import { mkdir, readdir, readFile, rename, unlink, writeFile } from 'node:fs/promises';
import path from 'node:path';

export interface FileStore {
  /** Stores bytes and returns their SHA-256 (hex); the same bytes stored again are kept once. */
  put(bytes: Buffer): Promise<string>;
  /** The bytes stored under this SHA-256, or null when they are gone or no longer hash to it. */
  get(sha256: string): Promise<Buffer | null>;
  /** Whether intact bytes are stored under this SHA-256 (they are hashed again on every call). */
  exists(sha256: string): Promise<boolean>;
}

export const SHA256 = /^[0-9a-f]{64}$/;
/** Names the store gave files before it was content-addressed (random, 128 bits). */
export const LEGACY_NAME = /^[0-9a-f]{32}$/;

export const sha256Of = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

/** A store in a folder of the local disk: one file per content, named by its SHA-256. */
export function fileStore(dir: string): FileStore {
  async function get(sha256: string) {
    if (!SHA256.test(sha256)) return null;
    let bytes: Buffer;
    try {
      bytes = await readFile(path.join(dir, sha256));
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
      throw err;
    }
    return sha256Of(bytes) === sha256 ? bytes : null;
  }
  return {
    async put(bytes) {
      const sha256 = sha256Of(bytes);
      if (await get(sha256)) return sha256;
      await mkdir(dir, { recursive: true, mode: 0o700 });
      // Written aside, then renamed into place: a reader sees no file or the whole file, and a
      // damaged file under this name is replaced by the right bytes.
      const aside = path.join(dir, `.incoming-${randomBytes(12).toString('hex')}`);
      await writeFile(aside, bytes, { mode: 0o400, flag: 'wx' });
      await rename(aside, path.join(dir, sha256));
      return sha256;
    },
    get,
    exists: async (sha256) => (await get(sha256)) !== null,
  };
}

/** A store that holds nothing, for writers that attach no files (demo content): every file reads as missing. */
export const NO_FILES: FileStore = {
  put: () => Promise.reject(new Error('this store keeps no files')),
  get: async () => null,
  exists: async () => false,
};

/**
 * Moves files stored under the older random names to their SHA-256 names (at start-up and after a
 * restore). The rows always recorded each file's SHA-256, so they find the bytes by it from now on;
 * a file whose bytes were altered lands under another hash and its row reads as missing.
 */
export async function upgradeLegacyFiles(dir: string) {
  let names: string[];
  try {
    names = await readdir(dir);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return 0;
    throw err;
  }
  const store = fileStore(dir);
  let moved = 0;
  for (const name of names.filter((n) => LEGACY_NAME.test(n))) {
    await store.put(await readFile(path.join(dir, name)));
    await unlink(path.join(dir, name));
    moved++;
  }
  return moved;
}
