// The audit log's hash chain (21 CFR 11.10(e) audit trail; ASVS 5.0 16.4.2 tamper-proof logs;
// 21 CFR 11.10(a) validation able to discern altered records: a one-byte superuser edit is flagged
// and the checker names the first broken link). Hashes are recomputed with Node's SHA-256, not by the database that wrote them.
import { createHash } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditRowHash, GENESIS_HASH, verifyAuditChain } from '../../../server/audit/chain';
import { recordAudit } from '../../../server/audit/record';
import { auditLog } from '../../../server/db/schema';
import { createTestApp, type TestApp } from '../../support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/** What only the owner (a superuser) can do: switch the append-only trigger off around a statement. */
async function aroundTheTriggers(statement: ReturnType<typeof sql>) {
  await t.ownerDb.transaction(async (tx) => {
    await tx.execute(sql`alter table audit_log disable trigger audit_log_append_only`);
    await tx.execute(statement);
    await tx.execute(sql`alter table audit_log enable trigger audit_log_append_only`);
  });
}

describe('the audit hash chain', () => {
  it('links every entry to the one before, from a genesis of zeros; concurrent writers never fork it', async () => {
    await Promise.all(
      Array.from({ length: 30 }, (_, i) =>
        recordAudit(t.db, {
          action: 'sign-in.failed',
          subject: `chain-${i}@tallowcreek.example`,
          details: { n: i, note: 'ünïcode ✓' },
        }),
      ),
    );
    const rows = await t.db.select().from(auditLog).orderBy(auditLog.seq);
    expect(rows.length).toBeGreaterThan(30);
    expect(rows[0]!.seq).toBe(1);
    expect(rows[0]!.prevHash).toBe(GENESIS_HASH);
    rows.forEach((r, i) => {
      expect(r.seq).toBe(i + 1);
      if (i > 0) expect(r.prevHash).toBe(rows[i - 1]!.rowHash);
      expect(r.rowHash).toMatch(/^[0-9a-f]{64}$/);
    });
    const report = await verifyAuditChain(t.db);
    expect(report).toEqual({
      checked: rows.length,
      head: { seq: rows.length, rowHash: rows.at(-1)!.rowHash },
      firstBroken: null,
    });
  });

  it('the row hash is SHA-256 of the documented text (FIPS 180-4 via node:crypto)', () => {
    const row = {
      seq: 7,
      id: 42,
      at: '2026-12-02T08:00:00.000000Z',
      actorId: null,
      action: 'sign-out',
      subject: 'a@b',
      details: '{"k": 1}',
      ip: '127.0.0.1',
      prevHash: GENESIS_HASH,
    };
    const text = [
      '7',
      '42',
      '2026-12-02T08:00:00.000000Z',
      '\\N',
      'sign-out',
      'a@b',
      '{"k": 1}',
      '127.0.0.1',
      GENESIS_HASH,
    ].join('\u001f');
    expect(auditRowHash(row)).toBe(createHash('sha256').update(text).digest('hex'));
    // A known vector, so the helper is not merely compared with itself: SHA-256("abc"), FIPS 180-2 appendix B.1.
    expect(createHash('sha256').update('abc').digest('hex')).toBe(
      'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad',
    );
  });

  it('a one-byte edit made around the triggers is named as the first broken link', async () => {
    const target = (
      await t.db
        .select()
        .from(auditLog)
        .where(sql`subject like 'chain-%'`)
        .orderBy(auditLog.seq)
        .limit(1)
        .offset(5)
    )[0]!;
    const edited = target.subject!.replace(/.$/, (c) => (c === 'x' ? 'y' : 'x'));
    await aroundTheTriggers(sql`update audit_log set subject = ${edited} where id = ${target.id}`);
    const report = await verifyAuditChain(t.db);
    expect(report.firstBroken).toMatchObject({
      seq: target.seq,
      id: target.id,
      reason: 'its content no longer matches its hash',
    });
    // Put it back: the chain holds again.
    await aroundTheTriggers(sql`update audit_log set subject = ${target.subject} where id = ${target.id}`);
    expect((await verifyAuditChain(t.db)).firstBroken).toBeNull();
  });

  it('a deleted entry, or one re-hashed to hide an edit, breaks the link after it', async () => {
    const rows = await t.db.select().from(auditLog).orderBy(auditLog.seq);
    const victim = rows[10]!;
    // Re-hash the edited row itself: its own hash matches, the next row's link no longer does.
    await aroundTheTriggers(sql`update audit_log set subject = 'rewritten' where id = ${victim.id}`);
    await aroundTheTriggers(
      sql`update audit_log set row_hash = encode(sha256(convert_to(benchwright_audit_text(audit_log), 'UTF8')), 'hex') where id = ${victim.id}`,
    );
    let report = await verifyAuditChain(t.db);
    expect(report.firstBroken).toMatchObject({
      seq: victim.seq! + 1,
      reason: 'does not link to the entry before it',
    });
    await aroundTheTriggers(sql`delete from audit_log where id = ${victim.id}`);
    report = await verifyAuditChain(t.db);
    expect(report.firstBroken).toMatchObject({
      seq: victim.seq! + 1,
      reason: `entry ${victim.seq!} is missing`,
    });
  });

  it('an admin sees the check; nobody else may run it', async () => {
    const admin = await t.as('admin');
    const res = await admin.get('/api/audit/chain');
    expect(res.status).toBe(200);
    // The log was broken above: the check stops at the first broken entry and says which.
    expect(res.body.chain.firstBroken).toMatchObject({
      reason: expect.stringMatching(/^entry \d+ is missing$/),
    });
    expect(res.body.chain.checked).toBeGreaterThan(0);
    expect((await (await t.as('marek')).get('/api/audit/chain')).status).toBe(403);
  });
});
