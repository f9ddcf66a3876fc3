// Shared steps of the start, dev and test commands: cluster, database, migrations, demo content.
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { env } from '../config/env';
import { createDb, createPool } from '../db/client';
import { applyMigrations } from '../db/migrate';
import { seedDemoContent } from '../db/seed';
import { installJobQueue } from '../jobs/queue';
import { ensureAppRole, ensureDatabase, startCluster, type Cluster } from './postgres';

export const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
export const dataDir = path.join(projectRoot, '.data');

/**
 * Ports: 5480 for the app (PORT), 54329 for npm start's cluster (BW_DB_PORT), 54339 for the test cluster.
 * BW_TEST_SLOT=n gives a parallel test run clusters of its own (54339+20n, and 54349+20n for
 * the restart test) and a client build of its own, so two people can run the tests in one checkout at once.
 * The object-store fake: 54330 for npm start (BW_S3_PORT), the slot's last port (54358+20n) for tests.
 */
export const TEST_SLOT = env.BW_TEST_SLOT;
export const PORTS = {
  app: env.PORT,
  mainDb: env.BW_DB_PORT,
  testDb: 54339 + TEST_SLOT * 20,
  healthDb: 54349 + TEST_SLOT * 20,
  restoreDb: 54350 + TEST_SLOT * 20,
  mainS3: env.BW_S3_PORT,
  /** The multi-node test's three app processes (54351…54353) and nginx in front (54357). */
  multiNodeApps: 54351 + TEST_SLOT * 20,
  multiNodeProxy: 54357 + TEST_SLOT * 20,
  testS3: 54358 + TEST_SLOT * 20,
} as const;
export const testClientDir = path.join(projectRoot, 'dist', `client-test-${TEST_SLOT}`);
export const testClusterName = (base: string) => (TEST_SLOT ? `${base}-${TEST_SLOT}` : base);

export const say = (line: string) => console.log(`[benchwright] ${line}`);

export function readOrCreateSecret(name: string): string {
  mkdirSync(dataDir, { recursive: true });
  const file = path.join(dataDir, `${name}.secret`);
  if (existsSync(file)) return readFileSync(file, 'utf8').trim();
  const secret = randomBytes(32).toString('base64url');
  writeFileSync(file, secret + '\n', { mode: 0o600 });
  return secret;
}

/**
 * Creates the database if needed, applies migrations and loads demo content as the owner; returns
 * the URL the app connects with, as the application role.
 */
export async function prepareDatabase(
  cluster: Pick<Cluster, 'adminUrl' | 'urlFor' | 'appUrlFor' | 'appPassword'>,
  database: string,
  { seed = true } = {},
) {
  await ensureAppRole(cluster.adminUrl, cluster.appPassword);
  await ensureDatabase(cluster.adminUrl, database);
  await migrateDatabase(cluster.urlFor(database), { seed });
  return cluster.appUrlFor(database);
}

/** Applies the migrations and installs the job queue as the owner (then the demo content, when asked). */
export async function migrateDatabase(ownerUrl: string, { seed = false } = {}) {
  const pool = createPool(ownerUrl);
  try {
    const db = createDb(pool);
    say(`applying migrations to ${new URL(ownerUrl).pathname.slice(1)}`);
    await applyMigrations(db);
    await installJobQueue(ownerUrl);
    if (seed) await seedDemoContent(db, say);
  } finally {
    await pool.end();
  }
}

export function startMainCluster() {
  say(`starting PostgreSQL on 127.0.0.1:${PORTS.mainDb}`);
  return startCluster({ name: 'main', port: PORTS.mainDb, projectRoot });
}
