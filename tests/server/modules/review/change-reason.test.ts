import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditLog, revisions } from '../../../../server/db/schema';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import { approve, goodDoc, inReview, newDraft, params } from './review-support';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const stateOf = async (id: string) =>
  (await t.db.select({ state: revisions.state }).from(revisions).where(eq(revisions.id, id)))[0]!.state;

describe('a revision carries its change reason', () => {
  it('submitting without a reason is a 400 naming the field in words; the draft stays a draft', async () => {
    const { c, revision } = await newDraft(t);
    for (const body of [{}, { changeReason: '   ' }]) {
      const res = await c.post(`/api/revisions/${revision.id}/submit`).send(body);
      expect(res.status).toBe(400);
      expect(res.body.fields).toContainEqual({
        field: 'body.changeReason',
        label: 'Change reason',
        reason: 'Change reason is required',
      });
    }
    const long = await c.post(`/api/revisions/${revision.id}/submit`).send({ changeReason: 'x'.repeat(501) });
    expect(long.status).toBe(400);
    expect(long.body.fields[0].reason).toMatch(/at most 500 characters/);
    expect(await stateOf(revision.id)).toBe('draft');
  });

  it('the reason given at submission is shown on the revision, its review, the history and the audit entry', async () => {
    const { c, revision } = await newDraft(t);
    const reason = 'Bleeder raised to 220k after the cap-discharge timing check';
    const res = await c.post(`/api/revisions/${revision.id}/submit`).send({ changeReason: `  ${reason} ` });
    expect(res.status).toBe(200);
    expect(res.body.revision.changeReason).toBe(reason);
    expect((await c.get(`/api/revisions/${revision.id}`)).body.revision.changeReason).toBe(reason);
    const marek = await t.as('marek');
    expect((await marek.get(`/api/revisions/${revision.id}/review`)).body.review.revision.changeReason).toBe(
      reason,
    );
    const history = await c.get(`/api/procedures/${revision.procedureId}`);
    expect(history.body.revisions[0]).toMatchObject({ number: 1, changeReason: reason });
    const [audit] = await t.db
      .select()
      .from(auditLog)
      .where(
        sql`${auditLog.action} = 'revision.submitted' and ${auditLog.details}->>'revisionId' = ${revision.id}`,
      );
    expect(audit!.details).toMatchObject({ changeReason: reason });
  });

  it('the database keeps the reason as submitted, and refuses a submission without one', async () => {
    const { revision } = await inReview(t);
    const refused = await t.ownerDb
      .execute(sql`update revisions set change_reason = 'rewritten later' where id = ${revision.id}`)
      .then(
        () => null,
        (e: Error & { cause?: Error }) => e.cause?.message ?? e.message,
      );
    expect(refused).toMatch(/change reason was given at submission and cannot change/);
    const draft = await newDraft(t);
    const bare = await t.ownerDb
      .execute(sql`update revisions set state = 'in_review' where id = ${draft.revision.id}`)
      .then(
        () => null,
        (e: Error & { cause?: Error }) => e.cause?.message ?? e.message,
      );
    expect(bare).toMatch(/cannot go to review without a change reason/);
  });
});

describe('a returned revision is carried on by its author', () => {
  it('a new draft from the returned revision copies it, not the approved one before it', async () => {
    const first = await inReview(t);
    const marek = await t.as('marek');
    expect((await approve(marek, first.revision.id, 'marek')).status).toBe(200);
    const r2 = await first.c.post(`/api/procedures/${first.revision.procedureId}/drafts`).send({});
    expect(r2.status).toBe(201);
    const returnedText = 'Check the standby switch before the HT comes up.';
    const saved = await first.c.put(`/api/revisions/${r2.body.revision.id}`).send({
      ...first.meta,
      params,
      lockVersion: r2.body.revision.lockVersion,
      document: goodDoc('0.1 A', '±5 %', returnedText),
    });
    expect(saved.status).toBe(200);
    expect(
      (
        await first.c
          .post(`/api/revisions/${r2.body.revision.id}/submit`)
          .send({ changeReason: 'Standby step' })
      ).status,
    ).toBe(200);
    const returned = await marek
      .post(`/api/revisions/${r2.body.revision.id}/return`)
      .send({ password: demo.marek.password, comment: 'Say which way the switch goes.' });
    expect(returned.status).toBe(200);

    const tom = await t.as('tom');
    const refusedForTechnician = await tom
      .post(`/api/procedures/${first.revision.procedureId}/drafts`)
      .send({ fromRevisionId: r2.body.revision.id });
    expect(refusedForTechnician.status).toBe(403);
    // A revision of another procedure is not this procedure's to start from.
    const elsewhere = await inReview(t);
    expect((await approve(marek, elsewhere.revision.id, 'marek')).status).toBe(200);
    const wrongProcedure = await first.c
      .post(`/api/procedures/${elsewhere.revision.procedureId}/drafts`)
      .send({ fromRevisionId: r2.body.revision.id });
    expect(wrongProcedure.status).toBe(404);

    const r3 = await first.c
      .post(`/api/procedures/${first.revision.procedureId}/drafts`)
      .send({ fromRevisionId: r2.body.revision.id });
    expect(r3.status).toBe(201);
    expect(r3.body.revision).toMatchObject({ number: 3, state: 'draft', changeReason: '' });
    expect(JSON.stringify(r3.body.revision.document)).toContain(returnedText);
    // Only a draft at a time: a second start names the open one.
    const again = await first.c
      .post(`/api/procedures/${first.revision.procedureId}/drafts`)
      .send({ fromRevisionId: r2.body.revision.id });
    expect(again.status).toBe(409);
    expect(again.body.revisionId).toBe(r3.body.revision.id);
  });

  it('a draft cannot start from a revision in review', async () => {
    const { c, revision } = await inReview(t);
    const res = await c
      .post(`/api/procedures/${revision.procedureId}/drafts`)
      .send({ fromRevisionId: revision.id });
    expect(res.status).toBe(409);
  });
});
