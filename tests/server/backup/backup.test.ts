import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { sql } from 'drizzle-orm';
import { PutObjectCommand } from '@aws-sdk/client-s3';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBackup, restoreBackup } from '../../../server/backup/archive';
import { checkRecords, describeCheck } from '../../../server/backup/check';
import { PORTS, projectRoot, testClusterName } from '../../../server/bootstrap/prepare';
import { dropDatabase, startCluster, stopCluster, type Cluster } from '../../../server/bootstrap/postgres';
import { createDb, createPool } from '../../../server/db/client';
import { attachments, people, signatures } from '../../../server/db/schema';
import { verifySignature } from '../../../server/modules/review/signatures';
import { verifyAuditChain } from '../../../server/audit/chain';
import { fileStore } from '../../../server/storage/files';
import { pngOf } from '../../support/png';
import { createTestApp, type TestApp } from '../../support/test-app';
import { createTestBucket } from '../../support/test-bucket';
import { approve, doc, fuseBlock, inReview, paragraph, reading } from '../modules/review/review-support';

const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

let t: TestApp;
let fresh: Cluster;
const work = mkdtempSync(path.join(tmpdir(), 'bw-backup-test-'));

beforeAll(async () => {
  t = await createTestApp();
  fresh = startCluster({ name: testClusterName('restore'), port: PORTS.restoreDb, projectRoot });
  await dropDatabase(fresh.adminUrl, 'benchwright_restored'); // left from an earlier run
  await dropDatabase(fresh.adminUrl, 'benchwright_restored_s3');
  await dropDatabase(fresh.adminUrl, 'benchwright_restored_to_s3');
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
    const tables = (
      await c.query(`select tablename from pg_tables where schemaname = 'public' order by 1`)
    ).rows.map((r) => r.tablename as string);
    const out: Record<string, { rows: number; md5: string }> = {};
    for (const table of tables) {
      const r = await c.query(
        `select count(*)::int as rows, coalesce(md5(string_agg(t::text, '|' order by t::text)), '') as md5 from "${table}" t`,
      );
      out[table] = r.rows[0];
    }
    return out;
  } finally {
    await c.end();
  }
}

const imageDoc = (attachmentId: string) =>
  doc(paragraph('Photograph the reservoir before power-up.'), fuseBlock('0.1 A'), reading('±5 %'), {
    type: 'image',
    attrs: { id: 'img-reservoir', attachmentId, alt: 'Reservoir', caption: 'Reservoir' },
  });

describe('backup and restore', () => {
  it('restores into a fresh cluster with the same rows in every table, every signature verifying and every upload intact', async () => {
    const hal = await t.as('hal');
    const image = pngOf(7, 3, 42);
    const up = await hal
      .post('/api/attachments')
      .attach('file', image, { filename: 'reservoir.png', contentType: 'image/png' });
    expect(up.status).toBe(201);
    // An approved revision showing the image: its sign-off covers the file's bytes.
    const { revision } = await inReview(t, 'hal', imageDoc(up.body.attachment.id));
    expect((await approve(await t.as('marek'), revision.id, 'marek')).status).toBe(200);
    // A file kept under the older random name (as archives made before content addressing hold them).
    const legacy = pngOf(2, 9, 17);
    writeFileSync(path.join(t.uploadDir, 'a'.repeat(32)), legacy);
    const [person] = await t.db.select({ id: people.id }).from(people).limit(1);
    await t.db.insert(attachments).values({
      originalName: 'old.png',
      mediaType: 'image/png',
      size: legacy.length,
      sha256: sha256(legacy),
      uploadedBy: person!.id,
    });

    const file = await createBackup({ databaseUrl: t.ownerUrl, uploadDir: t.uploadDir, outDir: work });
    expect(path.basename(file)).toMatch(/^benchwright-\d{4}-\d{2}-\d{2}T.*\.tar$/);

    const restoredUploads = path.join(work, 'restored-uploads');
    const restoredUrl = fresh.urlFor('benchwright_restored');
    await restoreBackup({
      file,
      adminUrl: fresh.adminUrl,
      databaseUrl: restoredUrl,
      uploadDir: restoredUploads,
    });

    const [before, after] = [await fingerprint(t.ownerUrl), await fingerprint(restoredUrl)];
    expect(Object.keys(after).length).toBeGreaterThan(5);
    expect(after).toEqual(before);

    // Every stored file is there under the hash recorded at upload, the older one moved to its hash.
    const c = new pg.Client({ connectionString: restoredUrl });
    await c.connect();
    const rows = (await c.query('select sha256 from attachments')).rows as { sha256: string }[];
    await c.end();
    expect(rows.length).toBeGreaterThan(1);
    for (const r of rows) expect(sha256(readFileSync(path.join(restoredUploads, r.sha256)))).toBe(r.sha256);
    expect(readdirSync(restoredUploads).filter((n) => /^[0-9a-f]{32}$/.test(n))).toEqual([]);

    const restoredPool = createPool(restoredUrl);
    try {
      const restoredDb = createDb(restoredPool);
      const restoredFiles = fileStore(restoredUploads);
      // Every reviewer signature recomputes to its content hash in the restored database.
      const sigs = await restoredDb.select().from(signatures);
      expect(sigs.length).toBeGreaterThan(0);
      for (const sig of sigs)
        expect((await verifySignature(restoredDb, restoredFiles, sig)).verified, `signature ${sig.id}`).toBe(
          true,
        );
      // The records check says the same, for files, sign-offs and run sheets.
      const clean = await checkRecords(restoredDb, restoredFiles);
      expect(clean.files.damaged).toEqual([]);
      expect(clean.files.checked).toBe(rows.length);
      expect(clean.revisionSignatures).toEqual({ checked: sigs.length, unverified: [] });
      expect(clean.runSignatures.checked).toBeGreaterThan(0);
      expect(clean.runSignatures.unverified).toEqual([]);
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

      // A restored file altered afterwards: the check names it and the sign-off that covers it.
      writeFileSync(path.join(restoredUploads, sha256(image)), pngOf(7, 3, 43));
      const damaged = await checkRecords(restoredDb, restoredFiles);
      expect(damaged.files.damaged).toEqual([
        { attachmentId: up.body.attachment.id, fileName: 'reservoir.png' },
      ]);
      const approval = sigs.find((s) => s.revisionId === revision.id)!;
      expect(damaged.revisionSignatures.unverified).toEqual([approval.id]);
      expect(describeCheck(damaged)).toContain(`  NOT VERIFIED: signature ${approval.id}`);
    } finally {
      await restoredPool.end();
    }

    // Restoring over an existing database is refused.
    await expect(
      restoreBackup({
        file,
        adminUrl: fresh.adminUrl,
        databaseUrl: restoredUrl,
        uploadDir: path.join(work, 'other'),
      }),
    ).rejects.toThrow(/already exists/);

    // The same archive from a disk store restores into a bucket: every file under its SHA-256, the
    // one kept under an older random name too.
    const bucket = await createTestBucket();
    try {
      await restoreBackup({
        file,
        adminUrl: fresh.adminUrl,
        databaseUrl: fresh.urlFor('benchwright_restored_to_s3'),
        uploadDir: path.join(work, 'unused'),
        s3: bucket.settings,
      });
      const keys: string[] = [];
      for await (const key of bucket.store.keys()) keys.push(key);
      expect(keys.sort()).toEqual(rows.map((r) => r.sha256).sort());
      for (const r of rows) expect(await bucket.store.exists(r.sha256)).toBe(true);
    } finally {
      await bucket.drop();
    }
  });
});

describe('backup and restore with files in a bucket', () => {
  it('archives every file the records refer to from the bucket and puts them back into another, verifying', async () => {
    const s3 = await createTestApp({}, { files: 's3' });
    const target = await createTestBucket();
    try {
      const hal = await s3.as('hal');
      const image = pngOf(3, 7, 99);
      const up = await hal.post('/api/attachments').attach('file', image, { filename: 'rectifier.png' });
      expect(up.status).toBe(201);
      const { revision } = await inReview(s3, 'hal', imageDoc(up.body.attachment.id));
      expect((await approve(await s3.as('marek'), revision.id, 'marek')).status).toBe(200);
      // A demo run's signed sheet, issued into the bucket.
      const { rows: signed } = await s3.db.execute<{ id: string }>(
        sql`select id from runs where status = 'signed' limit 1`,
      );
      const tom = await s3.as('tom');
      expect((await tom.get(`/api/runs/${signed[0]!.id}/sheet.pdf`)).status).toBe(200);
      const { rows: referenced } = await s3.db.execute<{ sha256: string }>(
        sql`select sha256 from attachments union select sha256 from run_sheet_files order by 1`,
      );
      expect(referenced.length).toBe(2);

      const file = await createBackup({
        databaseUrl: s3.ownerUrl,
        uploadDir: s3.uploadDir,
        s3: s3.bucket!.settings,
        outDir: work,
      });
      const archived = execFileSync('tar', ['-tf', file], { encoding: 'utf8' })
        .split('\n')
        .filter((n) => /^uploads\/./.test(n))
        .sort();
      expect(archived).toEqual(referenced.map((r) => `uploads/${r.sha256}`));

      const restoredUrl = fresh.urlFor('benchwright_restored_s3');
      await restoreBackup({
        file,
        adminUrl: fresh.adminUrl,
        databaseUrl: restoredUrl,
        uploadDir: path.join(work, 'unused'),
        s3: target.settings,
      });
      const keys: string[] = [];
      for await (const key of target.store.keys()) keys.push(key);
      expect(keys.sort()).toEqual(referenced.map((r) => r.sha256));
      expect(Buffer.compare((await target.store.get(sha256(image)))!, image)).toBe(0);

      const restoredPool = createPool(restoredUrl);
      try {
        const restoredDb = createDb(restoredPool);
        const clean = await checkRecords(restoredDb, target.store);
        expect(clean.files).toEqual({ checked: 1, damaged: [] });
        expect(clean.revisionSignatures.checked).toBeGreaterThan(0);
        expect(clean.revisionSignatures.unverified).toEqual([]);
        expect(clean.runSignatures.unverified).toEqual([]);
        // An object replaced in the restored bucket: the check names the file and the sign-off over it.
        await target.client.send(
          new PutObjectCommand({ Bucket: target.settings.bucket, Key: sha256(image), Body: pngOf(3, 7, 98) }),
        );
        const damaged = await checkRecords(restoredDb, target.store);
        expect(damaged.files.damaged).toEqual([
          { attachmentId: up.body.attachment.id, fileName: 'rectifier.png' },
        ]);
        expect(damaged.revisionSignatures.unverified).toHaveLength(1);
      } finally {
        await restoredPool.end();
      }
    } finally {
      await target.drop();
      await s3.close();
    }
  });
});
