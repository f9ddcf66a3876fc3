import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { sql } from 'drizzle-orm';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBackup, restoreBackup } from '../../server/backup/archive';
import { PORTS, projectRoot, testClusterName } from '../../server/bootstrap/prepare';
import { dropDatabase, startCluster, stopCluster, type Cluster } from '../../server/bootstrap/postgres';
import { createDb, createPool } from '../../server/db/client';
import { signatures } from '../../server/db/schema';
import { verifySignature } from '../../server/modules/review/signatures';
import { verifyAuditChain } from '../../server/audit/chain';
import { tinyPng } from '../support/png';
import { createTestApp, type TestApp } from '../support/test-app';

let t: TestApp;
let fresh: Cluster;
const work = mkdtempSync(path.join(tmpdir(), 'bw-backup-test-'));

beforeAll(async () => {
  t = await createTestApp();
  fresh = startCluster({ name: testClusterName('restore'), port: PORTS.restoreDb, projectRoot });
  await dropDatabase(fresh.adminUrl, 'benchwright_restored'); // left from an earlier run
});
afterAll(async () => {
  await t.close();
  stopCluster(fresh.dataDir);
  rmSync(work, { recursive: true, force: true });
});

/** Row count and an MD5 over every row's text, per table of the public schema. */
async function fingerprint(url: string) {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    const tables = (await c.query(`select tablename from pg_tables where schemaname = 'public' order by 1`)).rows.map((r) => r.tablename as string);
    const out: Record<string, { rows: number; md5: string }> = {};
    for (const table of tables) {
      const r = await c.query(`select count(*)::int as rows, coalesce(md5(string_agg(t::text, '|' order by t::text)), '') as md5 from "${table}" t`);
      out[table] = r.rows[0];
    }
    return out;
  } finally {
    await c.end();
  }
}

describe('backup and restore', () => {
  it('restores into a fresh cluster with the same rows in every table, every signature verifying and every upload intact', async () => {
    const hal = await t.as('hal');
    const up = await hal.post('/api/attachments').attach('file', tinyPng(), { filename: 'reservoir.png', contentType: 'image/png' });
    expect(up.status).toBe(201);

    const file = createBackup({ databaseUrl: t.ownerUrl, uploadDir: t.uploadDir, outDir: work });
    expect(path.basename(file)).toMatch(/^benchwright-\d{4}-\d{2}-\d{2}T.*\.tar$/);

    const restoredUploads = path.join(work, 'restored-uploads');
    const restoredUrl = fresh.urlFor('benchwright_restored');
    await restoreBackup({ file, adminUrl: fresh.adminUrl, databaseUrl: restoredUrl, uploadDir: restoredUploads });

    const [before, after] = [await fingerprint(t.ownerUrl), await fingerprint(restoredUrl)];
    expect(Object.keys(after).length).toBeGreaterThan(5);
    expect(after).toEqual(before);

    // Every stored file is there with the hash recorded at upload.
    const c = new pg.Client({ connectionString: restoredUrl });
    await c.connect();
    const rows = (await c.query('select stored_name, sha256 from attachments')).rows as { stored_name: string; sha256: string }[];
    await c.end();
    expect(rows.length).toBeGreaterThan(0);
    for (const r of rows) {
      const bytes = readFileSync(path.join(restoredUploads, r.stored_name));
      expect(createHash('sha256').update(bytes).digest('hex')).toBe(r.sha256);
    }

    // Every reviewer signature recomputes to its content hash in the restored database.
    const restoredPool = createPool(restoredUrl);
    try {
      const restoredDb = createDb(restoredPool);
      const sigs = await restoredDb.select().from(signatures);
      expect(sigs.length).toBeGreaterThan(0);
      for (const sig of sigs) expect((await verifySignature(restoredDb, sig)).verified, `signature ${sig.id}`).toBe(true);
      // And the audit log's hash chain holds end to end.
      const chain = await verifyAuditChain(restoredDb);
      expect(chain.firstBroken).toBeNull();
      expect(chain.checked).toBeGreaterThan(0);
      // The functions keep their pinned search_path, and the new database refuses the app role
      // temporary tables (database privileges are not in a dump; the restore revokes them).
      const { rows: unpinned } = await restoredDb.execute(sql`
        select p.proname from pg_proc p join pg_namespace n on n.oid = p.pronamespace
        where n.nspname = 'public' and not coalesce('search_path=pg_catalog, public, pg_temp' = any(p.proconfig), false)`);
      expect(unpinned).toEqual([]);
      const { rows: temp } = await restoredDb.execute<{ app: boolean; everyone: boolean }>(sql`
        select has_database_privilege('benchwright_app', current_database(), 'TEMP') as app,
               has_database_privilege('public', current_database(), 'TEMP') as everyone`);
      expect(temp[0]).toEqual({ app: false, everyone: false });
    } finally {
      await restoredPool.end();
    }

    // Restoring over an existing database is refused.
    await expect(restoreBackup({ file, adminUrl: fresh.adminUrl, databaseUrl: restoredUrl, uploadDir: path.join(work, 'other') })).rejects.toThrow(/already exists/);
  });
});
