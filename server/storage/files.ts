import { createHash, randomBytes } from 'node:crypto';
import { mkdir, readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { fileTypeFromBuffer } from 'file-type';

/** What may be uploaded, decided from the bytes, never from the name or the client's claim. */
export const ALLOWED_TYPES = ['image/png', 'image/jpeg', 'image/webp', 'application/pdf'] as const;
export type AllowedType = (typeof ALLOWED_TYPES)[number];
export const MAX_UPLOAD_BYTES = 15 * 1024 * 1024;

export async function sniffType(bytes: Buffer): Promise<AllowedType | null> {
  const found = await fileTypeFromBuffer(bytes);
  return found && (ALLOWED_TYPES as readonly string[]).includes(found.mime) ? (found.mime as AllowedType) : null;
}

/** Stores bytes under a random name (no part of the upload's own name reaches the file system). */
export async function storeFile(dir: string, bytes: Buffer) {
  await mkdir(dir, { recursive: true, mode: 0o700 });
  const storedName = randomBytes(16).toString('hex');
  await writeFile(path.join(dir, storedName), bytes, { mode: 0o600, flag: 'wx' });
  return { storedName, sha256: createHash('sha256').update(bytes).digest('hex') };
}

export function readStoredFile(dir: string, storedName: string) {
  if (!/^[0-9a-f]{32}$/.test(storedName)) throw new Error('bad stored name');
  return readFile(path.join(dir, storedName));
}

/** A display name safe for headers and pages: no path, no control characters, bounded. */
export function cleanFileName(name: string) {
  const base = name.split(/[\\/]/).pop() ?? 'file';
  return base.replace(/[\u0000-\u001f\u007f"]/g, '').slice(0, 200) || 'file';
}
