// Backup and restore: one timestamped archive holding a pg_dump (custom format, a consistent
// snapshot) and every stored file, so a restore brings back records and files together. Files come
// from an upload folder (FILE_STORE=disk) or a bucket (S3); the archive holds them the same way
// (uploads/<sha256>), so an archive from either store restores into either.
import { execFileSync } from 'node:child_process';
import {
  cpSync,
  existsSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  readFileSync,
  rmSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { ensureAppRole, pgBinDir, revokeTemporary, withAdminClient } from '../bootstrap/postgres';
import { upgradeLegacyFiles } from '../storage/files';
import { s3FileStore, type S3Settings } from '../storage/s3-store';

function connectionEnv(url: string) {
  const u = new URL(url);
  return {
    ...process.env,
    PGHOST: u.hostname,
    PGPORT: u.port,
    PGUSER: decodeURIComponent(u.username),
    PGPASSWORD: decodeURIComponent(u.password),
    PGDATABASE: u.pathname.slice(1),
  };
}

/** Every file the records refer to: attachments (uploads, photos, certificates) and issued run sheets. */
async function referencedFiles(databaseUrl: string) {
  const c = new pg.Client({ connectionString: databaseUrl });
  await c.connect();
  try {
    const { rows } = await c.query<{ sha256: string }>(
      'SELECT sha256 FROM attachments UNION SELECT sha256 FROM run_sheet_files ORDER BY 1',
    );
    return rows.map((r) => r.sha256);
  } finally {
    await c.end();
  }
}

/**
 * Writes <outDir>/benchwright-<UTC timestamp>.tar and returns its path. Files come from `s3`'s bucket
 * when given (each one the database refers to, read after the dump, so every row in it finds its
 * file; one missing or altered is left out, and the records check names it), else from `uploadDir`.
 */
export async function createBackup(opts: {
  databaseUrl: string;
  uploadDir: string;
  s3?: S3Settings;
  outDir: string;
  now?: Date;
}) {
  const stamp = (opts.now ?? new Date()).toISOString().replace(/[:.]/g, '-');
  const work = mkdtempSync(path.join(tmpdir(), 'bw-backup-'));
  try {
    execFileSync(
      path.join(pgBinDir(), 'pg_dump'),
      ['-Fc', '--no-owner', '-f', path.join(work, 'database.dump')],
      { env: connectionEnv(opts.databaseUrl) },
    );
    mkdirSync(path.join(work, 'uploads'));
    if (opts.s3) {
      const store = s3FileStore(opts.s3);
      for (const sha256 of await referencedFiles(opts.databaseUrl)) {
        const bytes = await store.get(sha256);
        if (bytes) writeFileSync(path.join(work, 'uploads', sha256), bytes);
      }
    } else if (existsSync(opts.uploadDir))
      // Files still being written (server/storage) are left out; they have no row yet.
      cpSync(opts.uploadDir, path.join(work, 'uploads'), {
        recursive: true,
        filter: (src) => !path.basename(src).startsWith('.incoming-'),
      });
    mkdirSync(opts.outDir, { recursive: true });
    const file = path.join(opts.outDir, `benchwright-${stamp}.tar`);
    execFileSync('tar', ['-cf', file, '-C', work, 'database.dump', 'uploads']);
    return file;
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}

/**
 * Restores an archive into a database that must not exist yet (it is created), and its files into
 * `s3`'s bucket when given, else into an upload folder that must be empty. Refuses to overwrite
 * anything: a bucket keeps each content under its own SHA-256, so a file already there is left as it is.
 */
export async function restoreBackup(opts: {
  file: string;
  adminUrl: string;
  databaseUrl: string;
  uploadDir: string;
  s3?: S3Settings;
}) {
  const database = new URL(opts.databaseUrl).pathname.slice(1);
  if (!/^[a-z_][a-z0-9_]*$/.test(database)) throw new Error(`bad database name ${database}`);
  if (!opts.s3 && existsSync(opts.uploadDir) && readdirSync(opts.uploadDir).length > 0)
    throw new Error(`${opts.uploadDir} is not empty; restore into an empty upload folder`);
  await withAdminClient(opts.adminUrl, async (c) => {
    const { rowCount } = await c.query('SELECT 1 FROM pg_database WHERE datname = $1', [database]);
    if (rowCount) throw new Error(`database ${database} already exists; restore into a new, empty database`);
    await c.query(`CREATE DATABASE "${database}"`);
  });
  // The dump grants to the application role: it must exist on the target cluster first. A dump
  // keeps no database privileges, so temporary tables are refused again here.
  await ensureAppRole(opts.adminUrl);
  await revokeTemporary(opts.adminUrl, database);
  const work = mkdtempSync(path.join(tmpdir(), 'bw-restore-'));
  try {
    execFileSync('tar', ['-xf', opts.file, '-C', work]);
    execFileSync(
      path.join(pgBinDir(), 'pg_restore'),
      ['--no-owner', '--exit-on-error', '-d', database, path.join(work, 'database.dump')],
      { env: connectionEnv(opts.databaseUrl) },
    );
    if (opts.s3) {
      // Stored by their bytes' hash, so files of an archive from before content addressing land
      // under their SHA-256 too.
      const store = s3FileStore(opts.s3);
      const dir = path.join(work, 'uploads');
      for (const name of readdirSync(dir)) await store.put(readFileSync(path.join(dir, name)));
    } else {
      mkdirSync(opts.uploadDir, { recursive: true });
      cpSync(path.join(work, 'uploads'), opts.uploadDir, { recursive: true });
      // An archive from before content addressing: its files move to their SHA-256 names.
      await upgradeLegacyFiles(opts.uploadDir);
    }
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}
