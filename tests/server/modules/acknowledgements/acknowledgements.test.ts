import { and, eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditLog, revisionAcknowledgements, revisions } from '../../../../server/db/schema';
import { pdfBody, pdfText } from '../../../support/pdf-text';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import { benchDoc, benchProcedure, newUnit, startRun } from '../runs/runs-fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const REASON = 'Heater band tightened to ±5 % after two marginal transformers';

/** Revision 1 approved and run by tom; then revision 2 (heater tolerance changed) approved. */
async function revisedAfterARun() {
  const r1 = await benchProcedure(t, 'approved', `TC-18 heater check ${Math.random()}`);
  const tom = await t.as('tom');
  const unit = await newUnit(tom);
  expect((await startRun(tom, r1.id, unit.id)).status).toBe(201);
  const hal = await t.as('hal');
  const draft = await hal.post(`/api/procedures/${r1.procedureId}/drafts`).send({});
  expect(draft.status).toBe(201);
  const doc = structuredClone(benchDoc);
  const heater = doc.content!.find((n) => n.attrs?.id === 'rd-heater')!;
  heater.attrs = { ...heater.attrs, tolerance: '±5 %' };
  const d = draft.body.revision;
  const saved = await hal.put(`/api/revisions/${d.id}`).send({
    title: d.title,
    equipmentFamily: d.equipmentFamily,
    equipmentModel: d.equipmentModel,
    tags: d.tags,
    params: d.params,
    lockVersion: d.lockVersion,
    document: doc,
  });
  expect(saved.status).toBe(200);
  expect((await hal.post(`/api/revisions/${d.id}/submit`).send({ changeReason: REASON })).status).toBe(200);
  const marek = await t.as('marek');
  const approved = await marek
    .post(`/api/revisions/${d.id}/approve`)
    .send({ password: demo.marek.password, comment: 'Tighter band agreed.' });
  expect(approved.status).toBe(200);
  return { r1, r2: approved.body.revision as { id: string; number: number }, unit, tom, marek };
}

const hashOf = async (revisionId: string) =>
  (await t.db.select({ h: revisions.contentHash }).from(revisions).where(eq(revisions.id, revisionId)))[0]!
    .h!;

describe('read before you run', () => {
  it('a technician who ran the previous revision is refused a run on the new one until they acknowledge it', async () => {
    const { r2, unit, tom, marek } = await revisedAfterARun();

    const refused = await startRun(tom, r2.id, unit.id);
    expect(refused.status).toBe(409);
    expect(refused.body.code).toBe('acknowledgement-required');
    expect(refused.body.error).toMatch(/read what changed and acknowledge it before your first run/);
    expect(refused.body.acknowledgeUrl).toBe(`/revisions/${r2.id}/acknowledge`);

    // Someone who never ran the procedure is not held up.
    const sam = await t.as('sam');
    expect((await startRun(sam, r2.id, (await newUnit(sam)).id)).status).toBe(201);

    // The screen shows what changed, in words and numbers, and the hash to be acknowledged.
    const view = await tom.get(`/api/revisions/${r2.id}/acknowledgement`);
    expect(view.status).toBe(200);
    const a = view.body.acknowledgement;
    expect(a).toMatchObject({ required: true, acknowledgement: null });
    expect(a.revision).toMatchObject({ number: 2, changeReason: REASON, contentHash: await hashOf(r2.id) });
    expect(a.base.number).toBe(1);
    expect(a.valueChanges).toContainEqual(
      expect.objectContaining({ kind: 'reading', subject: 'Heater winding', label: 'tolerance' }),
    );

    // Reviewers see who still has to read it.
    const before = await marek.get(`/api/revisions/${r2.id}/acknowledgements`);
    expect(before.status).toBe(200);
    expect(before.body.status.people).toEqual([
      expect.objectContaining({ displayName: 'Tom Achterberg', acknowledgedAt: null, contentHash: null }),
    ]);

    const made = await tom
      .post(`/api/revisions/${r2.id}/acknowledge`)
      .send({ contentHash: await hashOf(r2.id) });
    expect(made.status).toBe(201);
    expect(made.body.acknowledgement.contentHash).toBe(await hashOf(r2.id));
    const again = await tom
      .post(`/api/revisions/${r2.id}/acknowledge`)
      .send({ contentHash: await hashOf(r2.id) });
    expect(again.status).toBe(200);
    expect(again.body.acknowledgement.acknowledgedAt).toBe(made.body.acknowledgement.acknowledgedAt);

    const [row] = await t.db
      .select()
      .from(revisionAcknowledgements)
      .where(eq(revisionAcknowledgements.revisionId, r2.id));
    expect(row).toMatchObject({
      personName: 'Tom Achterberg',
      revisionNumber: 2,
      contentHash: await hashOf(r2.id),
    });
    const [audit] = await t.db
      .select()
      .from(auditLog)
      .where(
        and(eq(auditLog.action, 'revision.acknowledged'), sql`${auditLog.details}->>'revisionId' = ${r2.id}`),
      );
    expect(audit).toBeDefined();

    const after = await marek.get(`/api/revisions/${r2.id}/acknowledgements`);
    expect(after.body.status.people[0].acknowledgedAt).toBe(made.body.acknowledgement.acknowledgedAt);

    // Now the run starts, and its sheet names why the revision was made.
    const run = await startRun(tom, r2.id, unit.id);
    expect(run.status).toBe(201);
    expect(run.body.run.revision).toMatchObject({ number: 2, changeReason: REASON });
    const pdf = await tom.get(`/api/runs/${run.body.run.id}/sheet.pdf`).buffer(true).parse(pdfBody);
    expect(pdf.status).toBe(200);
    const text = pdfText(pdf.body as Buffer)
      .join(' ')
      .replace(/\s+/g, ' ');
    expect(text).toMatch(/Change reason: Heater band tightened to ±5 % after two marginal transformers/);
  });

  it('refuses an acknowledgement over another hash, of a revision no longer approved, or malformed', async () => {
    const { r1, r2, tom } = await revisedAfterARun();
    const wrong = await tom.post(`/api/revisions/${r2.id}/acknowledge`).send({ contentHash: 'a'.repeat(64) });
    expect(wrong.status).toBe(409);
    expect(wrong.body.error).toMatch(/not the one you were shown/);
    const old = await tom
      .post(`/api/revisions/${r1.id}/acknowledge`)
      .send({ contentHash: await hashOf(r1.id) });
    expect(old.status).toBe(409);
    expect(old.body.error).toMatch(/superseded; only the approved revision is acknowledged/);
    const bad = await tom.post(`/api/revisions/${r2.id}/acknowledge`).send({ contentHash: 'not a hash' });
    expect(bad.status).toBe(400);
    expect(bad.body.fields[0].field).toBe('body.contentHash');
    const none = await tom.post(`/api/revisions/${r2.id}/acknowledge`).send({});
    expect(none.body.fields).toContainEqual({
      field: 'body.contentHash',
      label: 'Content hash',
      reason: 'Content hash is required',
    });
    expect(
      await t.db
        .select()
        .from(revisionAcknowledgements)
        .where(eq(revisionAcknowledgements.revisionId, r2.id)),
    ).toEqual([]);
  });

  it('the database keeps acknowledgements append-only and checks each one against its revision', async () => {
    const { r1, r2, tom } = await revisedAfterARun();
    expect(
      (await tom.post(`/api/revisions/${r2.id}/acknowledge`).send({ contentHash: await hashOf(r2.id) }))
        .status,
    ).toBe(201);
    const refusal = (db: typeof t.db, statement: ReturnType<typeof sql>) =>
      db.execute(statement).then(
        () => null,
        (e: Error & { cause?: Error }) => e.cause?.message ?? e.message,
      );
    // The app's role may not change or remove one; nor may the owner, past the trigger.
    for (const statement of [
      sql`update revision_acknowledgements set acknowledged_at = now() - interval '1 day' where revision_id = ${r2.id}`,
      sql`delete from revision_acknowledgements where revision_id = ${r2.id}`,
    ]) {
      expect(await refusal(t.db, statement)).toMatch(/permission denied/);
      expect(await refusal(t.ownerDb, statement)).toMatch(/revision_acknowledgements is append-only/);
    }
    expect(await refusal(t.ownerDb, sql`truncate revision_acknowledgements`)).toMatch(/append-only/);
    // Written directly, it must still name the approved revision's own hash.
    const [person] = await t.db
      .execute<{ id: string }>(sql`select id from people where email = ${demo.sam.email}`)
      .then((r) => r.rows);
    expect(
      await refusal(
        t.ownerDb,
        sql`insert into revision_acknowledgements (revision_id, procedure_id, revision_number, person_id, person_name, content_hash)
            select id, procedure_id, number, ${person!.id}, 'Sam', ${'b'.repeat(64)} from revisions where id = ${r2.id}`,
      ),
    ).toMatch(/does not match it/);
    expect(
      await refusal(
        t.ownerDb,
        sql`insert into revision_acknowledgements (revision_id, procedure_id, revision_number, person_id, person_name, content_hash)
            select id, procedure_id, number, ${person!.id}, 'Sam', content_hash from revisions where id = ${r1.id}`,
      ),
    ).toMatch(/only an approved revision can be acknowledged/);
  });
});

describe('demo content', () => {
  it('Priya ran the bleeder retrofit before revision 2 was approved: her acknowledgement is pending', async () => {
    const [r2] = await t.db
      .select()
      .from(revisions)
      .where(
        and(
          eq(revisions.title, 'TC-30H: bleeder resistor retrofit across the reservoir'),
          eq(revisions.number, 2),
        ),
      );
    expect(r2).toMatchObject({ state: 'approved' });
    expect(r2!.changeReason).toMatch(/Discharge-time band narrowed/);
    const priya = await t.as('priya');
    expect((await priya.get(`/api/revisions/${r2!.id}/acknowledgement`)).body.acknowledgement.required).toBe(
      true,
    );
    const marek = await t.as('marek');
    const status = await marek.get(`/api/revisions/${r2!.id}/acknowledgements`);
    expect(status.body.status.people).toEqual([
      expect.objectContaining({ displayName: 'Priya Lindqvist', acknowledgedAt: null }),
    ]);
  });
});
