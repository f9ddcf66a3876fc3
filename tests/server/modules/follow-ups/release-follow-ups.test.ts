// The release signature ("checked and released") and non-conformance follow-ups, on the real
// database: every refusal with its reason, the unit's state following the signatures, the owner's
// mail through the local catcher, and the database guarding the records when the server is bypassed.
import { randomUUID } from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditLog, followUps, runReleases, unitStateChanges } from '../../../../server/db/schema';
import { mailsMatching } from '../../../support/parsed-mail';
import { pdfBody, pdfText } from '../../../support/pdf-text';
import { procedureInState } from '../../../support/review-path';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import { benchDoc, benchProcedure, entry, newUnit, personId, startRun } from '../runs/runs-fixtures';

let t: TestApp;
let revisionId: string;
beforeAll(async () => {
  t = await createTestApp({}, { mail: true });
  revisionId = (await benchProcedure(t)).id;
});
afterAll(() => t.close());

type Client = Awaited<ReturnType<TestApp['as']>>;
type Who = 'tom' | 'priya' | 'sam';

/** A signed run by `who` on the unit; the HT winding reads `ht` (250 V ±5 % at 230 V mains: 290 V is out of band). */
async function signedRun(who: Who, unitId: string, ht: string, rev = revisionId) {
  const c = await t.as(who);
  const started = await startRun(c, rev, unitId);
  expect(started.status, JSON.stringify(started.body)).toBe(201);
  const runId = started.body.run.id as string;
  for (const [id, body] of [
    ['hz-ht-live', { done: true }],
    ['rd-ht-ac', { value: ht }],
    ['rd-heater', { value: '6.3 V' }],
    ['ck-discharge', { done: true }],
  ] as const)
    expect((await entry(c, runId, id, body)).status).toBe(200);
  const signed = await c.post(`/api/runs/${runId}/sign`).send({ password: demo[who].password });
  expect(signed.status, JSON.stringify(signed.body)).toBe(200);
  return signed.body.run as {
    id: string;
    outOfTolerance: boolean;
    followUp: { id: string; readings: { stepId: string }[]; owner: { id: string } } | null;
  };
}

const release = (c: Client, runId: string, password: string) =>
  c.post(`/api/runs/${runId}/release`).send({ password });

const stateOf = async (c: Client, unitId: string) =>
  ((await c.get(`/api/units/${unitId}`)).body.states as { state: string; reason: string | null }[])[0];

/** The database's answer to statements run in one transaction as the owner: null when it committed. */
const refusal = (
  run: (tx: Parameters<Parameters<TestApp['ownerDb']['transaction']>[0]>[0]) => Promise<unknown>,
) =>
  t.ownerDb.transaction(run).then(
    () => null,
    (e: Error & { cause?: Error }) => e.cause?.message ?? e.message,
  );

describe('the release signature', () => {
  it('refuses before the performed signature, the performer, an unqualified technician and other roles, each with the reason; a reviewer releases with the password, the unit follows', async () => {
    const tom = await t.as('tom');
    const marek = await t.as('marek');
    const unit = await newUnit(tom);
    const open = await startRun(tom, revisionId, unit.id);
    const early = await release(marek, open.body.run.id, demo.marek.password);
    expect(early.status).toBe(409);
    expect(early.body.code).toBe('not-performed');
    expect(early.body.error).toMatch(/not signed as performed yet/);

    const run = await signedRun('tom', unit.id, '251 V');
    expect(run.followUp).toBeNull();
    expect((await stateOf(tom, unit.id))!.state).toBe('on_bench');

    const own = await release(tom, run.id, demo.tom.password);
    expect(own.status).toBe(403);
    expect(own.body.code).toBe('performer-cannot-release');
    for (const who of ['hal', 'admin'] as const)
      expect((await release(await t.as(who), run.id, demo[who].password)).status).toBe(403);
    const wrong = await release(marek, run.id, 'not-my-password');
    expect(wrong.status).toBe(401);
    expect((await t.db.select().from(runReleases).where(eq(runReleases.runId, run.id))).length).toBe(0);

    const toRelease = async () =>
      (await marek.get('/api/home')).body.sections.find((s: { key: string }) => s.key === 'releases')
        .count as number;
    const waiting = await toRelease();
    const ok = await release(marek, run.id, demo.marek.password);
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body.run.release).toMatchObject({
      signer: { displayName: 'Marek Vos' },
      signerRole: 'reviewer',
      meaning: 'released',
      matchesRun: true,
    });
    expect(ok.body.run.release.contentHash).toBe(ok.body.run.signature.contentHash);
    expect((await stateOf(tom, unit.id))!.state).toBe('released');
    expect(await toRelease()).toBe(waiting - 1);
    const again = await release(await t.as('priya'), run.id, demo.priya.password);
    expect(again.status).toBe(409);
    expect(again.body.code).toBe('already-released');
    const [audited] = await t.db
      .select()
      .from(auditLog)
      .where(sql`${auditLog.action} = 'run.released' and ${auditLog.subject} = ${`run ${run.id}`}`);
    expect(audited?.actorId).toBe(await personId(t, 'marek'));

    // The run sheet PDF names both signatures.
    const pdf = await tom.get(`/api/runs/${run.id}/sheet.pdf`).buffer(true).parse(pdfBody);
    const text = pdfText(pdf.body as Buffer)
      .join(' ')
      .replace(/\s+/g, ' ');
    expect(text).toMatch(/Signed by.*Tom Achterberg.*performed/s);
    expect(text).toMatch(/Checked and released.*Released by.*Marek Vos \(reviewer\)/s);
  });

  it('a technician releases only a run of a family they are qualified for', async () => {
    // Sam holds the amplifier families only (demo registers): a table-radio run is not his to release.
    const { revision } = await procedureInState(t.db, 'approved', {
      title: `TC-5R HT check ${randomUUID().slice(0, 6)}`,
      equipmentFamily: 'Table radio',
      equipmentModel: 'TC-5R',
      tags: [],
      params: { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 },
      document: structuredClone(benchDoc),
    });
    const unit = await newUnit(await t.as('tom'));
    const radio = await signedRun('tom', unit.id, '251 V', revision.id);
    const sam = await t.as('sam');
    const refused = await release(sam, radio.id, demo.sam.password);
    expect(refused.status).toBe(403);
    expect(refused.body.code).toBe('not-qualified');
    expect(refused.body.error).toMatch(/not qualified for Table radio procedures/);
    const amp = await signedRun('tom', (await newUnit(await t.as('tom'))).id, '251 V');
    const bySam = await release(sam, amp.id, demo.sam.password);
    expect(bySam.status).toBe(200);
    expect(bySam.body.run.release.signerRole).toBe('technician');
  });

  it('the database refuses a release by the performer, before the performed signature, over another hash, and any change to one', async () => {
    const unit = await newUnit(await t.as('tom'));
    const run = await signedRun('tom', unit.id, '251 V');
    const [row] = await t.db
      .execute<{ content_hash: string }>(sql`select content_hash from runs where id = ${run.id}`)
      .then((r) => r.rows);
    const values = (signer: string, hash = row!.content_hash) =>
      sql`insert into run_releases (run_id, signer_id, signer_name, signer_role, content_hash)
          values (${run.id}, ${signer}, 'x', 'reviewer', ${hash})`;
    expect(await refusal((tx) => tx.execute(values(tomId)))).toMatch(/its performer cannot release it/);
    expect(await refusal((tx) => tx.execute(values(marekId, 'f'.repeat(64))))).toMatch(
      /must cover the signed content hash/,
    );
    expect(await refusal((tx) => tx.execute(values(halId)))).toMatch(/neither a reviewer nor qualified/);
    const unsigned = (await startRun(await t.as('tom'), revisionId, unit.id)).body.run.id as string;
    expect(
      await refusal((tx) =>
        tx.execute(sql`insert into run_releases (run_id, signer_id, signer_name, signer_role, content_hash)
                       values (${unsigned}, ${marekId}, 'x', 'reviewer', 'h')`),
      ),
    ).toMatch(/is not signed as performed/);
    expect(await refusal((tx) => tx.execute(values(marekId)))).toBeNull();
    expect(
      await refusal((tx) =>
        tx.execute(sql`update run_releases set signer_name = 'y' where run_id = ${run.id}`),
      ),
    ).toMatch(/append-only/);
    expect(await refusal((tx) => tx.execute(sql`delete from run_releases where run_id = ${run.id}`))).toMatch(
      /append-only/,
    );
    // The app's own role may not even try.
    await expect(t.db.execute(sql`delete from run_releases where run_id = ${run.id}`)).rejects.toThrow();
    expect(
      await refusal((tx) =>
        tx.execute(sql`insert into unit_state_changes (unit_id, state, run_id, by_id, by_name)
                       values (${unit.id}, 'released', ${unsigned}, ${marekId}, 'x')`),
      ),
    ).toMatch(/not a signed run on this unit/);
  });
});

let tomId: string;
let marekId: string;
let halId: string;
beforeAll(async () => {
  tomId = await personId(t, 'tom');
  marekId = await personId(t, 'marek');
  halId = await personId(t, 'hal');
});

describe('follow-ups', () => {
  it('an out-of-band run opens one for its owner (mailed), counted at home; it bars the release; a passing re-run closes it', async () => {
    const tom = await t.as('tom');
    const marek = await t.as('marek');
    const unit = await newUnit(tom);
    const before = (await tom.get('/api/home')).body.sections.find(
      (s: { key: string }) => s.key === 'followUps',
    );
    const run = await signedRun('tom', unit.id, '290 V');
    expect(run.outOfTolerance).toBe(true);
    expect(run.followUp?.readings.map((r) => r.stepId)).toEqual(['rd-ht-ac']);
    expect(run.followUp?.owner.id).toBe(tomId);
    const [mail] = await mailsMatching(
      t.catcher!.received,
      (m) => m.subject.startsWith('Follow-up open: ') && m.text.includes(unit.id === '' ? 'x' : 'HT winding'),
    );
    expect(mail, 'mail in the SMTP catcher').toBeTruthy();
    expect(mail!.to).toEqual([demo.tom.email]);
    expect(mail!.text).toMatch(/HT winding, each half: measured 290 V/);
    expect(mail!.links.some((l) => l.endsWith('/follow-ups'))).toBe(true);

    // The PDF run sheet names the follow-up and its out-of-band reading.
    const pdf = await tom.get(`/api/runs/${run.id}/sheet.pdf`).buffer(true).parse(pdfBody);
    const sheet = pdfText(pdf.body as Buffer)
      .join(' ')
      .replace(/\s+/g, ' ');
    expect(sheet).toMatch(
      /Follow-up of out-of-band readings Out of band: HT winding, each half: 290 V \(band 238 V \.\.\. 263 V\).*Owner: Tom Achterberg.*Status: open/,
    );

    const home = (await tom.get('/api/home')).body.sections.find(
      (s: { key: string }) => s.key === 'followUps',
    );
    expect(home.count).toBe((before?.count ?? 0) + 1);
    const listed = await marek.get('/api/follow-ups').query({ status: 'open' });
    expect(listed.body.followUps.map((f: { id: string }) => f.id)).toContain(run.followUp!.id);

    const barred = await release(marek, run.id, demo.marek.password);
    expect(barred.status).toBe(409);
    expect(barred.body.code).toBe('follow-up-open');
    expect(barred.body.error).toMatch(/open follow-up/);

    // Dispositions: the owner chooses repair; a technician cannot accept; accepting needs a reason.
    const id = run.followUp!.id;
    const repair = await tom.post(`/api/follow-ups/${id}/disposition`).send({ disposition: 'repair' });
    expect(repair.status, JSON.stringify(repair.body)).toBe(200);
    expect(repair.body.followUp.closed).toBeNull();
    const notReviewer = await tom
      .post(`/api/follow-ups/${id}/disposition`)
      .send({ disposition: 'accept', reason: 'Within what the customer needs' });
    expect(notReviewer.status).toBe(403);
    expect(notReviewer.body.error).toMatch(/Only a reviewer accepts/);
    const noReason = await marek.post(`/api/follow-ups/${id}/disposition`).send({ disposition: 'accept' });
    expect(noReason.status).toBe(400);
    expect(noReason.body.fields[0].field).toBe('body.reason');
    const sam = await t.as('sam');
    const notOwner = await sam.post(`/api/follow-ups/${id}/disposition`).send({ disposition: 'repair' });
    expect(notOwner.status).toBe(403);
    expect(notOwner.body.code).toBe('not-the-owner');

    // A reviewer hands it to Priya, who repairs and re-runs: in band, the re-run closes it.
    expect((await tom.post(`/api/follow-ups/${id}/owner`).send({ ownerId: tomId })).status).toBe(403);
    const badOwner = await marek.post(`/api/follow-ups/${id}/owner`).send({ ownerId: halId });
    expect(badOwner.status).toBe(400);
    expect(badOwner.body.fields[0].field).toBe('body.ownerId');
    const moved = await marek
      .post(`/api/follow-ups/${id}/owner`)
      .send({ ownerId: await personId(t, 'priya') });
    expect(moved.body.followUp.owner.displayName).toBe('Priya Lindqvist');
    const rerun = await signedRun('priya', unit.id, '251 V');
    expect(rerun.followUp).toBeNull();
    const [closed] = await t.db.select().from(followUps).where(eq(followUps.id, id));
    expect(closed!.closingRunId).toBe(rerun.id);
    expect(closed!.closedAt).not.toBeNull();
    const view = (await tom.get(`/api/runs/${rerun.id}`)).body.run;
    expect(view.closesFollowUps.map((f: { id: string }) => f.id)).toEqual([id]);

    // Closed: no change through the API; the failing run is not released, the passing re-run is.
    const late = await marek
      .post(`/api/follow-ups/${id}/disposition`)
      .send({ disposition: 'accept', reason: 'Fine after all' });
    expect(late.status).toBe(409);
    expect(late.body.code).toBe('follow-up-closed');
    const old = await release(marek, run.id, demo.marek.password);
    expect(old.status).toBe(409);
    expect(old.body.error).toMatch(/closed by a later passing run; release that run instead/);
    expect((await release(marek, rerun.id, demo.marek.password)).status).toBe(200);
    const after = (await tom.get('/api/home')).body.sections.find(
      (s: { key: string }) => s.key === 'followUps',
    );
    expect(after?.count ?? 0).toBe(before?.count ?? 0);
  });

  it('a reviewer accepts with a reason and the run may be released; return unrepaired closes it with the unit returned and bars the release', async () => {
    const marek = await t.as('marek');
    const tom = await t.as('tom');
    const unitA = await newUnit(tom);
    const a = await signedRun('tom', unitA.id, '290 V');
    const accepted = await marek
      .post(`/api/follow-ups/${a.followUp!.id}/disposition`)
      .send({ disposition: 'accept', reason: 'Customer runs it on 220 V mains; within band there.' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.followUp.closed.by.displayName).toBe('Marek Vos');
    expect(accepted.body.followUp.closed.run).toBeNull();
    expect((await release(marek, a.id, demo.marek.password)).status).toBe(200);

    const unitB = await newUnit(tom);
    const b = await signedRun('tom', unitB.id, '290 V');
    const returned = await tom
      .post(`/api/follow-ups/${b.followUp!.id}/disposition`)
      .send({ disposition: 'return', reason: 'Customer declined the repair quote.' });
    expect(returned.status).toBe(200);
    expect(returned.body.followUp.closed).not.toBeNull();
    const state = await stateOf(tom, unitB.id);
    expect(state).toMatchObject({ state: 'returned' });
    expect(state!.reason).toMatch(/Customer declined the repair quote/);
    const barred = await release(marek, b.id, demo.marek.password);
    expect(barred.status).toBe(409);
    expect(barred.body.error).toMatch(/returned unrepaired/);
  });

  it('the database opens follow-ups only for out-of-band signed runs, closes them only by the routes, and freezes them closed', async () => {
    const tom = await t.as('tom');
    const unit = await newUnit(tom);
    const bad = await signedRun('tom', unit.id, '290 V');
    const good = await signedRun('tom', (await newUnit(tom)).id, '251 V');
    const id = bad.followUp!.id;
    // Not for an in-band run, nor naming a reading that was in band.
    expect(
      await refusal((tx) =>
        tx.execute(sql`insert into follow_ups (run_id, unit_id, procedure_id, entry_ids, owner_id)
          select id, unit_id, procedure_id, array(select id from run_entries where run_id = ${good.id}), performed_by
          from runs where id = ${good.id}`),
      ),
    ).toMatch(/not a signed run with out-of-band readings/);
    // Closed without a closing run or a reviewer's reason; by a repair decision alone; by an in-band run on another unit.
    expect(
      await refusal((tx) =>
        tx.execute(sql`update follow_ups set closed_at = now(), closed_by = owner_id where id = ${id}`),
      ),
    ).toMatch(/follow_ups_closed_ck/);
    expect(
      await refusal((tx) =>
        tx.execute(sql`update follow_ups set disposition = 'repair', disposition_by = owner_id, disposition_at = now(),
          closing_run_id = ${good.id}, closed_at = now(), closed_by = owner_id where id = ${id}`),
      ),
    ).toMatch(/closed only by a later signed run of the same procedure on the same unit/);
    expect(
      await refusal((tx) =>
        tx.execute(sql`update follow_ups set disposition = 'accept', disposition_reason = 'fine', disposition_by = owner_id,
          disposition_at = now(), closed_at = now(), closed_by = owner_id where id = ${id}`),
      ),
    ).toMatch(/only a reviewer accepts/);
    expect(
      await refusal((tx) =>
        tx.execute(sql`update follow_ups set disposition = 'return', disposition_reason = 'gone', disposition_by = owner_id,
          disposition_at = now(), closed_at = now(), closed_by = owner_id where id = ${id}`),
      ),
    ).toMatch(/returned unrepaired only with the unit recorded as returned/);
    expect(await refusal((tx) => tx.execute(sql`delete from follow_ups where id = ${id}`))).toMatch(
      /cannot be deleted/,
    );
    // Closed through the route, it is frozen: no edit, no reopening.
    const marek = await t.as('marek');
    expect(
      (
        await marek
          .post(`/api/follow-ups/${id}/disposition`)
          .send({ disposition: 'accept', reason: 'Accepted for the test' })
      ).status,
    ).toBe(200);
    expect(
      await refusal((tx) =>
        tx.execute(sql`update follow_ups set closed_at = null, closed_by = null where id = ${id}`),
      ),
    ).toMatch(/is closed and cannot be reopened or changed/);
    expect(
      await refusal((tx) => tx.execute(sql`update follow_ups set owner_id = ${tomId} where id = ${id}`)),
    ).toMatch(/is closed/);
    // A run signed out of band without its follow-up cannot commit (its own signature check set aside here).
    const openRun = (await startRun(tom, revisionId, unit.id)).body.run.id as string;
    expect(
      await refusal(async (tx) => {
        await tx.execute(sql`alter table runs disable trigger runs_signature_present`);
        await tx.execute(
          sql`update runs set status = 'signed', signed_at = now(), content_hash = 'x', out_of_tolerance = true where id = ${openRun}`,
        );
      }),
    ).toMatch(/has out-of-band readings and no follow-up/);
  });
});

describe('the unit state', () => {
  it('a person sets waiting for parts or returned with a reason, audited; released only follows a release; other roles may not', async () => {
    const tom = await t.as('tom');
    const unit = await newUnit(tom);
    const set = await tom
      .post(`/api/units/${unit.id}/state`)
      .send({ state: 'waiting_parts', reason: 'Reservoir capacitor on order' });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    expect(set.body.states[0]).toMatchObject({
      state: 'waiting_parts',
      reason: 'Reservoir capacitor on order',
      by: { displayName: 'Tom Achterberg' },
    });
    const noReason = await tom.post(`/api/units/${unit.id}/state`).send({ state: 'returned' });
    expect(noReason.status).toBe(400);
    expect(noReason.body.fields[0].field).toBe('body.reason');
    const released = await tom
      .post(`/api/units/${unit.id}/state`)
      .send({ state: 'released', reason: 'Looks fine' });
    expect(released.status).toBe(400);
    expect(released.body.fields[0].field).toBe('body.state');
    const hal = await t.as('hal');
    expect(
      (await hal.post(`/api/units/${unit.id}/state`).send({ state: 'returned', reason: 'Picked up' })).status,
    ).toBe(403);
    const [audited] = await t.db
      .select()
      .from(auditLog)
      .where(
        sql`${auditLog.action} = 'unit.state-changed' and ${auditLog.details} ->> 'unitId' = ${unit.id}`,
      );
    expect(audited?.details).toMatchObject({
      state: 'waiting_parts',
      reason: 'Reservoir capacitor on order',
    });
    expect(
      await refusal((tx) =>
        tx.execute(sql`update unit_state_changes set state = 'returned' where unit_id = ${unit.id}`),
      ),
    ).toMatch(/append-only/);
    const rows = await t.db.select().from(unitStateChanges).where(eq(unitStateChanges.unitId, unit.id));
    expect(rows).toHaveLength(1);
  });
});
