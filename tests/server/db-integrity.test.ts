// The database guards its records whoever connects (issue 14): attacks made as the application
// role (`benchwright_app`, what the app itself connects as), and as the owner where the point is
// that even a role allowed more cannot get past the triggers.
import { sql } from 'drizzle-orm';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../support/test-app';
import { inReview } from './review-support';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/**
 * Runs the statements in one transaction on a session of its own (temporary tables live per
 * session); returns the database's message when any statement or the commit is refused.
 */
async function inOneTransaction(as: 'app' | 'owner', statements: [string, unknown[]?][]): Promise<string | null> {
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
    const unpinned = rows.filter((r) => !(r.proconfig ?? []).includes('search_path=pg_catalog, public, pg_temp')).map((r) => r.proname);
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
    const after = await one<{ n: number }>(sql`select count(*)::int as n from run_entries where run_id = ${run.id} and raw = '999 V'`);
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
    const marek = await one<{ id: string }>(sql`select id from people where email = 'marek@tallowcreek.example'`);
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
    expect(await inOneTransaction('owner', attack)).toMatch(/needs revision .* to be approved, but it is in_review/);
    const sigs = await one<{ n: number }>(sql`select count(*)::int as n from signatures where revision_id = ${row.id}`);
    expect(sigs.n).toBe(0);
  });
});
