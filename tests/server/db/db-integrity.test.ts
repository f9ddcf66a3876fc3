// The database guards its records whoever connects (issue 14): attacks made as the application
// role (`benchwright_app`, what the app itself connects as), and as the owner where the point is
// that even a role allowed more cannot get past the triggers.
import { Writable } from 'node:stream';
import { eq, sql } from 'drizzle-orm';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { verifyAuditChain } from '../../../server/audit/chain';
import { checkAuditChain } from '../../../server/audit/watch';
import { revisions } from '../../../server/db/schema';
import { startServer } from '../../../server/index';
import { createLogger } from '../../../server/logger';
import { revisionContentHash } from '../../../server/modules/review/signed-content';
import { createTestApp, type TestApp } from '../../support/test-app';
import { inReview } from '../modules/review/review-support';
import { benchProcedure, newUnit, startRun } from '../modules/runs/runs-fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/**
 * Runs the statements in one transaction on a session of its own (temporary tables live per
 * session); returns the database's message when any statement or the commit is refused.
 */
async function inOneTransaction(
  as: 'app' | 'owner',
  statements: [string, unknown[]?][],
): Promise<string | null> {
  const c = new pg.Client({ connectionString: as === 'app' ? t.databaseUrl : t.ownerUrl });
  await c.connect();
  try {
    await c.query('begin');
    for (const [text, values] of statements) await c.query(text, values);
    await c.query('commit');
    return null;
  } catch (err) {
    await c.query('rollback').catch(() => undefined);
    return (err as Error).message;
  } finally {
    await c.end();
  }
}

const one = async <T>(q: ReturnType<typeof sql>) => (await t.ownerDb.execute(q)).rows[0] as T;

describe('a temporary table cannot stand in for a real one (finding 1)', () => {
  it('every function in the public schema pins search_path, with pg_temp last', async () => {
    const { rows } = await t.db.execute<{ proname: string; proconfig: string[] | null }>(sql`
      select p.proname, p.proconfig from pg_proc p join pg_namespace n on n.oid = p.pronamespace
      where n.nspname = 'public' order by 1`);
    // Every trigger function of drizzle/0003–0012 at least; a new one must be pinned as well.
    expect(rows.length).toBeGreaterThanOrEqual(12);
    const unpinned = rows
      .filter((r) => !(r.proconfig ?? []).includes('search_path=pg_catalog, public, pg_temp'))
      .map((r) => r.proname);
    expect(unpinned).toEqual([]);
  });

  it('the application role may not create temporary tables, so a temp "runs" cannot unfreeze a signed run sheet', async () => {
    const run = await one<{ id: string; raw: string }>(sql`
      select r.id, e.raw from runs r join run_entries e on e.run_id = r.id where r.status = 'signed' and e.raw is not null limit 1`);
    const refused = await inOneTransaction('app', [
      ['create temp table runs (id uuid, status text)'],
      [`update run_entries set raw = '999 V', measured = 999 where run_id = $1`, [run.id]],
    ]);
    expect(refused).toMatch(/permission denied to create temporary tables/);
    const after = await one<{ n: number }>(
      sql`select count(*)::int as n from run_entries where run_id = ${run.id} and raw = '999 V'`,
    );
    expect(after.n).toBe(0);
  });

  it('even a role that may create temporary tables gets past no trigger with one', async () => {
    const run = await one<{ id: string }>(sql`select id from runs where status = 'signed' limit 1`);
    const refused = await inOneTransaction('owner', [
      ['create temp table runs (id uuid, status text)'],
      [`update run_entries set raw = '999 V', measured = 999 where run_id = $1`, [run.id]],
    ]);
    expect(refused).toMatch(/is signed and cannot be changed/);
  });

  it('a temp "revisions" with a fake approved row does not let a signature onto an in-review revision', async () => {
    const { revision } = await inReview(t);
    const row = await one<{ id: string; procedure_id: string; number: number; author_id: string }>(sql`
      select id, procedure_id, number, author_id from revisions where id = ${revision.id}`);
    const marek = await one<{ id: string }>(
      sql`select id from people where email = 'marek@tallowcreek.example'`,
    );
    const attack: [string, unknown[]?][] = [
      ['create temp table revisions (id uuid, procedure_id uuid, number int, state text)'],
      [`insert into revisions values ($1, $2, $3, 'approved')`, [row.id, row.procedure_id, row.number]],
      [
        `insert into public.signatures (revision_id, procedure_id, revision_number, signer_id, signer_name, signer_email, signer_role, meaning, content_hash)
         values ($1, $2, $3, $4, 'Marek Vos', 'marek@tallowcreek.example', 'reviewer', 'approved', $5)`,
        [row.id, row.procedure_id, row.number, marek.id, 'f'.repeat(64)],
      ],
    ];
    expect(await inOneTransaction('app', attack)).toMatch(/permission denied to create temporary tables/);
    expect(await inOneTransaction('owner', attack)).toMatch(
      /needs revision .* to be approved, but it is in_review/,
    );
    const sigs = await one<{ n: number }>(
      sql`select count(*)::int as n from signatures where revision_id = ${row.id}`,
    );
    expect(sigs.n).toBe(0);
  });
});

describe('approval and run sign-off need their signature, in the same transaction (finding 3)', () => {
  const personId = async (who: string) =>
    (await one<{ id: string }>(sql`select id from people where email = ${`${who}@tallowcreek.example`}`)).id;

  /** The statements that approve `revisionId` directly, with a signature by `signer` over `signedHash`. */
  async function approvalBy(
    revisionId: string,
    signer: string | null,
    signedHash?: string,
  ): Promise<[string, unknown[]?][]> {
    const [row] = await t.db.select().from(revisions).where(eq(revisions.id, revisionId));
    const hash = await revisionContentHash(t.db, t.files, row!);
    const statements: [string, unknown[]?][] = [
      [
        `update revisions set state = 'approved', content_hash = $2, decided_at = now() where id = $1`,
        [revisionId, hash],
      ],
    ];
    if (signer) {
      statements.push([
        `insert into signatures (revision_id, procedure_id, revision_number, signer_id, signer_name, signer_email, signer_role, meaning, content_hash)
         values ($1, $2, $3, $4, 'x', 'x@tallowcreek.example', 'reviewer', 'approved', $5)`,
        [revisionId, row!.procedureId, row!.number, await personId(signer), signedHash ?? hash],
      ]);
    }
    return statements;
  }

  it('an in-review revision does not become approved by UPDATE alone', async () => {
    const { revision } = await inReview(t);
    expect(
      await inOneTransaction('app', [
        [`update revisions set state = 'approved' where id = $1`, [revision.id]],
      ]),
    ).toMatch(/cannot be approved without a reviewer's approval signature written in the same transaction/);
    expect(await inOneTransaction('app', await approvalBy(revision.id, null))).toMatch(
      /cannot be approved without a reviewer's approval signature/,
    );
    const [row] = await t.db.select().from(revisions).where(eq(revisions.id, revision.id));
    expect(row!.state).toBe('in_review');
  });

  it('nor with a signature over another hash, by its own author, or by someone who is not a reviewer; a well-formed one passes', async () => {
    const { revision } = await inReview(t);
    expect(await inOneTransaction('app', await approvalBy(revision.id, 'marek', 'f'.repeat(64)))).toMatch(
      /cannot be approved: the signature is over content hash f{64}/,
    );
    expect(await inOneTransaction('app', await approvalBy(revision.id, 'tom'))).toMatch(
      /cannot be approved: .* is not an active reviewer/,
    );
    const byDee = await inReview(t, 'dee');
    expect(await inOneTransaction('app', await approvalBy(byDee.revision.id, 'dee'))).toMatch(
      /cannot be approved: .* wrote or edited it/,
    );
    // What the database cannot see is the password: checking that is the server's part.
    expect(await inOneTransaction('app', await approvalBy(revision.id, 'marek'))).toBeNull();
  });

  it('a revision is inserted only as a draft, without a content hash', async () => {
    const { revision } = await inReview(t);
    for (const state of ['approved', 'in_review', 'superseded']) {
      const refused = await inOneTransaction('app', [
        [
          `insert into revisions (procedure_id, number, state, title, equipment_family, equipment_model, tags, document, params, snapshot, html, plain_text, author_id, editor_ids)
           select procedure_id, number + 1, $2, title, equipment_family, equipment_model, tags, document, params, snapshot, html, plain_text, author_id, editor_ids
           from revisions where id = $1`,
          [revision.id, state],
        ],
      ]);
      expect(refused, state).toMatch(/a revision is created as a draft/);
    }
  });

  async function openRunAs(who: 'tom' | 'priya') {
    const c = await t.as(who);
    const res = await startRun(c, (await benchProcedure(t)).id, (await newUnit(c)).id);
    expect(res.status).toBe(201);
    return res.body.run.id as string;
  }
  const runSignature = (runId: string, signerId: string, hash: string): [string, unknown[]] => [
    `insert into run_signatures (run_id, signer_id, signer_name, signer_role, meaning, content_hash, revision_id, revision_hash)
     select id, $2, 'x', 'technician', 'performed', $3, revision_id, revision_hash from runs where id = $1`,
    [runId, signerId, hash],
  ];
  const markSigned = (runId: string, hash: string): [string, unknown[]] => [
    `update runs set status = 'signed', signed_at = now(), content_hash = $2 where id = $1`,
    [runId, hash],
  ];

  it('a run sheet does not become signed without its signature over the same hash, written in the same transaction', async () => {
    const tom = await personId('tom');
    const hash = 'a'.repeat(64);
    const runId = await openRunAs('tom');
    expect(await inOneTransaction('app', [markSigned(runId, hash)])).toMatch(
      /cannot be signed without its signature over content hash a{64}, written in the same transaction/,
    );
    expect(
      await inOneTransaction('app', [runSignature(runId, tom, 'b'.repeat(64)), markSigned(runId, hash)]),
    ).toMatch(/cannot be signed without its signature/);
    // A signature left from an earlier transaction does not count.
    expect(await inOneTransaction('app', [runSignature(runId, tom, hash)])).toBeNull();
    expect(await inOneTransaction('app', [markSigned(runId, hash)])).toMatch(
      /cannot be signed without its signature/,
    );
    expect((await one<{ status: string }>(sql`select status from runs where id = ${runId}`)).status).toBe(
      'in_progress',
    );
    // Signature and status together pass.
    const other = await openRunAs('priya');
    expect(
      await inOneTransaction('app', [
        runSignature(other, await personId('priya'), hash),
        markSigned(other, hash),
      ]),
    ).toBeNull();
  });

  it('a run is created in progress, never already signed', async () => {
    const runId = await openRunAs('tom');
    const refused = await inOneTransaction('app', [
      [
        `insert into runs (unit_id, procedure_id, revision_id, revision_number, revision_hash, title, params, snapshot, steps, status, started_by, signed_at, content_hash)
         select unit_id, procedure_id, revision_id, revision_number, revision_hash, title, params, snapshot, steps, 'signed', started_by, now(), $2 from runs where id = $1`,
        [runId, 'a'.repeat(64)],
      ],
    ]);
    expect(refused).toMatch(/a run sheet is created in progress/);
  });
});

describe('the audit log keeps its own time and is checked (must-exist 11)', () => {
  it('a supplied time is replaced by the database clock', async () => {
    const { rows } = await t.db.execute<{ at: Date; now: Date }>(sql`
      insert into audit_log (action, subject, at) values ('sign-out', 'clock-check', '2001-01-01T00:00:00Z') returning at, now() as now`);
    const { at, now } = rows[0]!;
    expect(new Date(at).getUTCFullYear()).not.toBe(2001);
    expect(Math.abs(new Date(at).getTime() - new Date(now).getTime())).toBeLessThan(60_000);
    expect((await verifyAuditChain(t.db)).firstBroken).toBeNull();
  });

  it('the server checks the chain at start-up and on its schedule, logging the head; a broken chain is an error', async () => {
    let output = '';
    const sink = new Writable({
      write(chunk, _encoding, done) {
        output += chunk.toString();
        done();
      },
    });
    const lines = () =>
      output
        .split('\n')
        .filter(Boolean)
        .map(
          (l) =>
            JSON.parse(l) as {
              level: number;
              msg: string;
              head?: { seq: number; rowHash: string };
              firstBroken?: { seq: number };
            },
        );
    const checks = () => lines().filter((l) => /^audit chain/.test(l.msg));
    const running = await startServer({
      databaseUrl: t.databaseUrl,
      port: 0,
      logger: createLogger('info', sink),
      config: {
        sessionSecret: 'chain-watch'.padEnd(40, 'x'),
        uploadDir: t.uploadDir,
        auditCheckIntervalMs: 60_000,
      },
    });
    try {
      await expect.poll(() => checks().length, { timeout: 10_000, interval: 50 }).toBeGreaterThanOrEqual(1);
      // …and on its schedule: a job queue schedule (one for every process), here every minute.
      const { rows } = await t.db.execute<{ cron: string }>(
        sql`select cron from pgboss.schedule where name = 'audit-chain'`,
      );
      expect(rows.map((r) => r.cron)).toEqual(['*/1 * * * *']);
    } finally {
      await running.close();
    }
    const head = await one<{ seq: number; row_hash: string }>(
      sql`select seq::int, row_hash from audit_log order by seq desc limit 1`,
    );
    const first = checks()[0]!;
    expect(first).toMatchObject({
      level: 30,
      msg: 'audit chain verified',
      head: { seq: head.seq, rowHash: head.row_hash },
    });

    // A row edited around the triggers (only the owner can): the next check is an error naming it.
    const victim = await one<{ id: number; seq: number }>(
      sql`select id, seq::int from audit_log order by seq limit 1 offset 2`,
    );
    await t.ownerDb.transaction(async (tx) => {
      await tx.execute(sql`alter table audit_log disable trigger audit_log_append_only`);
      await tx.execute(
        sql`update audit_log set subject = coalesce(subject, '') || '!' where id = ${victim.id}`,
      );
      await tx.execute(sql`alter table audit_log enable trigger audit_log_append_only`);
    });
    output = '';
    await checkAuditChain(t.db, createLogger('info', sink));
    expect(checks()).toEqual([
      expect.objectContaining({
        level: 50,
        msg: 'audit chain broken',
        firstBroken: expect.objectContaining({ seq: victim.seq }),
      }),
    ]);
  });
});
