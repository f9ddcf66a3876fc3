// Backup and restore: one timestamped archive holding a pg_dump (custom format, a consistent
// snapshot) and every uploaded file, so a restore brings back records and attachments together.
import { execFileSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { ensureAppRole, pgBinDir, revokeTemporary, withAdminClient } from '../bootstrap/postgres';
import { upgradeLegacyFiles } from '../storage/files';

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

/** Writes <outDir>/benchwright-<UTC timestamp>.tar and returns its path. */
export function createBackup(opts: { databaseUrl: string; uploadDir: string; outDir: string; now?: Date }) {
  const stamp = (opts.now ?? new Date()).toISOString().replace(/[:.]/g, '-');
  const work = mkdtempSync(path.join(tmpdir(), 'bw-backup-'));
  try {
    execFileSync(
      path.join(pgBinDir(), 'pg_dump'),
      ['-Fc', '--no-owner', '-f', path.join(work, 'database.dump')],
      { env: connectionEnv(opts.databaseUrl) },
    );
    mkdirSync(path.join(work, 'uploads'));
    // Files still being written (server/storage) are left out; they have no row yet.
    if (existsSync(opts.uploadDir))
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
 * Restores an archive into a database that must not exist yet (it is created), and its uploads
 * into an upload folder that must be empty. Refuses to overwrite anything.
 */
export async function restoreBackup(opts: {
  file: string;
  adminUrl: string;
  databaseUrl: string;
  uploadDir: string;
}) {
  const database = new URL(opts.databaseUrl).pathname.slice(1);
  if (!/^[a-z_][a-z0-9_]*$/.test(database)) throw new Error(`bad database name ${database}`);
  if (existsSync(opts.uploadDir) && readdirSync(opts.uploadDir).length > 0)
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
    mkdirSync(opts.uploadDir, { recursive: true });
    cpSync(path.join(work, 'uploads'), opts.uploadDir, { recursive: true });
    // An archive from before content addressing: its files move to their SHA-256 names.
    await upgradeLegacyFiles(opts.uploadDir);
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}
