/**
 * Four eyes follows provenance: the authors and editors of every revision a draft was started from
 * count as its authors, so nobody approves their own words by way of a returned revision.
 */
import { eq, sql } from 'drizzle-orm';
import { revisions } from '../../../../server/db/schema';
import { revisionContentHash } from '../../../../server/modules/review/signed-content';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import { approve, inReview } from './review-support';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('four eyes across a returned revision', () => {
  it('Dee writes r1, it is returned, Hal starts r2 from it unchanged: Dee may not approve r2, Marek may', async () => {
    const { c: dee, revision: r1 } = await inReview(t, 'dee');
    const marek = await t.as('marek');
    const returned = await marek
      .post(`/api/revisions/${r1.id}/return`)
      .send({ password: demo.marek.password, comment: 'Say which meter range to use.' });
    expect(returned.status).toBe(200);

    const hal = await t.as('hal');
    const started = await hal.post(`/api/procedures/${r1.procedureId}/drafts`).send({});
    expect(started.status).toBe(201);
    const r2 = started.body.revision as { id: string; number: number };
    expect(
      (await hal.post(`/api/revisions/${r2.id}/submit`).send({ changeReason: 'Test change.' })).status,
    ).toBe(200);

    // Dee's own words, unchanged: she is one of r2's authors by provenance.
    const byDee = await approve(dee, r2.id, 'dee');
    expect(byDee.status).toBe(403);
    expect(byDee.body.error).toMatch(/started from a revision you wrote or edited/);
    // The queue marks it as her own work, and the review page does not offer her the decision.
    const queue = await dee.get('/api/review/queue');
    const item = (queue.body.items as { revisionId: string; ownWork: boolean }[]).find(
      (i) => i.revisionId === r2.id,
    );
    expect(item?.ownWork).toBe(true);

    expect((await approve(marek, r2.id, 'marek')).status).toBe(200);
  });
});

describe('four eyes in the database', () => {
  it('a direct approval signed by the author of a revision it was started from is refused at commit', async () => {
    const { revision } = await inReview(t, 'hal');
    const dee = (await t.db.execute(sql`select id from people where email = ${demo.dee.email}`)).rows[0]!
      .id as string;
    await t.ownerDb.execute(
      sql`update revisions set provenance_ids = array[${dee}::uuid] where id = ${revision.id}`,
    );
    const [row] = await t.db.select().from(revisions).where(eq(revisions.id, revision.id));
    const hash = await revisionContentHash(t.db, t.files, row!);
    const attempt = t.db.transaction(async (tx) => {
      await tx.execute(
        sql`update revisions set state = 'approved', content_hash = ${hash}, decided_at = now() where id = ${revision.id}`,
      );
      await tx.execute(sql`insert into signatures (revision_id, procedure_id, revision_number, signer_id, signer_name, signer_email, signer_role, meaning, content_hash)
        values (${revision.id}, ${row!.procedureId}, ${row!.number}, ${dee}::uuid, 'Dee', ${demo.dee.email}, 'reviewer', 'approved', ${hash})`);
    });
    await expect(attempt).rejects.toThrow();
    const [after] = await t.db.select().from(revisions).where(eq(revisions.id, revision.id));
    expect(after!.state).toBe('in_review');
    // The same statements signed by Marek pass: the refusal was about provenance.
    const marek = (await t.db.execute(sql`select id from people where email = ${demo.marek.email}`)).rows[0]!
      .id as string;
    await t.db.transaction(async (tx) => {
      await tx.execute(
        sql`update revisions set state = 'approved', content_hash = ${hash}, decided_at = now() where id = ${revision.id}`,
      );
      await tx.execute(sql`insert into signatures (revision_id, procedure_id, revision_number, signer_id, signer_name, signer_email, signer_role, meaning, content_hash)
        values (${revision.id}, ${row!.procedureId}, ${row!.number}, ${marek}::uuid, 'Marek', ${demo.marek.email}, 'reviewer', 'approved', ${hash})`);
    });
  });
});
