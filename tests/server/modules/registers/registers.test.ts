// The instrument register and qualifications: an instrument past its calibration due date takes no
// reading; a technician runs a procedure alone only when qualified for its family (and, where it
// carries a hazard note, for live work), otherwise with a qualified witness who co-signs first.
import { randomUUID } from 'node:crypto';
import { and, eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditLog, qualifications, runEntries } from '../../../../server/db/schema';
import { auditSentence } from '../../../../shared/audit-actions';
import { pdfBody, pdfText } from '../../../support/pdf-text';
import { procedureInState } from '../../../support/review-path';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import { benchDoc, entry, newUnit, personId, startRun } from '../runs/runs-fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

type Client = Awaited<ReturnType<TestApp['as']>>;

/** An approved procedure of the table-radio family (Sam, in the demo, is not yet qualified for it); it carries a hazard note, so it is live work. */
async function radioProcedure(title = `TC-5R HT check ${randomUUID().slice(0, 6)}`) {
  const { revision } = await procedureInState(t.db, 'approved', {
    title,
    equipmentFamily: 'Table radio',
    equipmentModel: 'TC-5R',
    tags: [],
    params: { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 },
    document: structuredClone(benchDoc),
  });
  return revision;
}

const finish = async (c: Client, runId: string) => {
  for (const [id, body] of [
    ['hz-ht-live', { done: true }],
    ['rd-ht-ac', { value: '251 V' }],
    ['rd-heater', { value: '6.3 V' }],
    ['ck-discharge', { done: true }],
  ] as const) {
    const res = await entry(c, runId, id, body);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
  }
};

async function addInstrument(c: Client, identifier: string, calibrationDue: string) {
  const res = await c.post('/api/instruments').send({ identifier, kind: 'meter', calibrationDue });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.instrument as { id: string; refusal: string | null; lockVersion: number };
}

/** The database's answer to statements run in one transaction as the owner: null when it committed. */
const refusal = (
  run: (tx: Parameters<Parameters<TestApp['ownerDb']['transaction']>[0]>[0]) => Promise<unknown>,
) =>
  t.ownerDb.transaction(run).then(
    () => null,
    (e: Error & { cause?: Error }) => e.cause?.message ?? e.message,
  );

describe('the instrument register', () => {
  it('reviewers and admins add and edit instruments, audited; a technician may not; bad input names the field', async () => {
    const marek = await t.as('marek');
    const tom = await t.as('tom');
    expect(
      (
        await tom
          .post('/api/instruments')
          .send({ identifier: 'X', kind: 'meter', calibrationDue: '2099-01-01' })
      ).status,
    ).toBe(403);
    const bad = await marek
      .post('/api/instruments')
      .send({ identifier: 'TC-DMM-77', kind: 'kettle', calibrationDue: '2026-02-30' });
    expect(bad.status).toBe(400);
    expect(bad.body.fields.map((f: { field: string }) => f.field).sort()).toEqual([
      'body.calibrationDue',
      'body.kind',
    ]);
    const added = await addInstrument(marek, 'TC-DMM-77', '2099-06-15');
    expect(added.refusal).toBeNull();
    const again = await marek
      .post('/api/instruments')
      .send({ identifier: 'tc-dmm-77', kind: 'meter', calibrationDue: '2099-06-15' });
    expect(again.status).toBe(400);
    expect(again.body.fields[0]).toEqual({
      field: 'body.identifier',
      label: 'Identifier',
      reason: 'An instrument named tc-dmm-77 is already in the register',
    });
    const admin = await t.as('admin');
    const edited = await admin.put(`/api/instruments/${added.id}`).send({
      identifier: 'TC-DMM-77',
      kind: 'meter',
      calibrationDue: '2020-03-01',
      description: 'dropped',
      lockVersion: added.lockVersion,
    });
    expect(edited.status).toBe(200);
    expect(edited.body.instrument.refusal).toBe(
      'TC-DMM-77 was due for calibration on 2020-03-01; it cannot take readings until it is calibrated again',
    );
    const stale = await admin.put(`/api/instruments/${added.id}`).send({
      identifier: 'TC-DMM-77',
      kind: 'meter',
      calibrationDue: '2099-03-01',
      lockVersion: added.lockVersion,
    });
    expect(stale.status).toBe(409);
    const rows = await t.db
      .select()
      .from(auditLog)
      .where(sql`${auditLog.details} ->> 'instrumentId' = ${added.id}`);
    expect(rows.map((r) => r.action).sort()).toEqual(['instrument.added', 'instrument.changed']);
    const addedRow = rows.find((r) => r.action === 'instrument.added')!;
    expect(
      auditSentence(addedRow.action, {
        actor: 'Marek Vos',
        subject: addedRow.subject,
        details: addedRow.details,
      }),
    ).toBe('Marek Vos added TC-DMM-77 to the instrument register.');
  });

  it('a calibration certificate is uploaded by the upload rules, stored by its SHA-256, and readable by a technician', async () => {
    const marek = await t.as('marek');
    const inst = await addInstrument(marek, `TC-SCOPE-${randomUUID().slice(0, 4)}`, '2099-01-01');
    const pdf = Buffer.from('%PDF-1.4\n1 0 obj <<>> endobj\ntrailer <<>>\n%%EOF\n');
    const up = await marek
      .post(`/api/instruments/${inst.id}/certificate`)
      .attach('file', pdf, { filename: 'cert.pdf' });
    expect(up.status, JSON.stringify(up.body)).toBe(201);
    expect(up.body.instrument.certificate.fileName).toBe('cert.pdf');
    const notPdf = await marek
      .post(`/api/instruments/${inst.id}/certificate`)
      .attach('file', Buffer.from('hello'), { filename: 'cert.pdf' });
    expect(notPdf.status).toBe(415);
    const tom = await t.as('tom');
    const got = await tom.get(up.body.instrument.certificate.url).buffer(true);
    expect(got.status).toBe(200);
    expect(Buffer.from(got.body).equals(pdf)).toBe(true);
  });

  it('an instrument past its due date cannot be chosen for a run or a reading, with the reason; the database refuses it too', async () => {
    const marek = await t.as('marek');
    const tom = await t.as('tom');
    const overdue = await addInstrument(marek, `TC-IR-${randomUUID().slice(0, 4)}`, '2021-05-14');
    const good = await addInstrument(marek, `TC-DMM-${randomUUID().slice(0, 4)}`, '2099-05-14');
    const revision = await radioProcedure();
    const unit = await newUnit(tom);
    const refused = await tom.post('/api/runs').send({
      revisionId: revision.id,
      unitId: unit.id,
      mainsVoltage: 230,
      mainsFrequency: 50,
      instrumentId: overdue.id,
    });
    expect(refused.status).toBe(400);
    expect(refused.body.fields[0].field).toBe('body.instrumentId');
    expect(refused.body.fields[0].reason).toMatch(
      /was due for calibration on 2021-05-14; it cannot take readings/,
    );

    const started = await tom.post('/api/runs').send({
      revisionId: revision.id,
      unitId: unit.id,
      mainsVoltage: 230,
      mainsFrequency: 50,
      instrumentId: good.id,
    });
    expect(started.status).toBe(201);
    const runId = started.body.run.id as string;
    expect(started.body.run.defaultInstrument.id).toBe(good.id);
    expect((await entry(tom, runId, 'hz-ht-live', { done: true })).status).toBe(200);
    const withOverdue = await entry(tom, runId, 'rd-ht-ac', { value: '251 V', instrumentId: overdue.id });
    expect(withOverdue.status).toBe(400);
    expect(withOverdue.body.fields[0].reason).toMatch(/due for calibration on 2021-05-14/);
    const onCheck = await entry(tom, runId, 'hz-ht-live', { done: true, instrumentId: good.id });
    expect(onCheck.status).toBe(400);
    // The usual instrument takes the reading when none is chosen.
    const taken = await entry(tom, runId, 'rd-ht-ac', { value: '251 V' });
    expect(taken.status).toBe(200);
    expect(taken.body.entry.instrument).toEqual(
      expect.objectContaining({ id: good.id, calibrationDue: '2099-05-14' }),
    );
    // Underneath, as the application connects: a reading is not moved onto the overdue instrument.
    const db = await t.db
      .execute(
        sql`update run_entries set instrument_id = ${overdue.id} where run_id = ${runId} and step_id = 'rd-ht-ac'`,
      )
      .then(
        () => null,
        (e: Error & { cause?: Error }) => e.cause?.message ?? e.message,
      );
    expect(db).toMatch(/was due for calibration on 2021-05-14 and takes no readings/);
    const [row] = await t.db
      .select()
      .from(runEntries)
      .where(and(eq(runEntries.runId, runId), eq(runEntries.stepId, 'rd-ht-ac')));
    expect(row!.instrumentId).toBe(good.id);
  });
});

describe('qualifications', () => {
  it('an unqualified start is refused with the reason and the witnesses who could co-sign; a grant lets it through, a withdrawal stops it, both audited', async () => {
    const sam = await t.as('sam');
    const revision = await radioProcedure();
    const unit = await newUnit(sam);
    const asked = await sam.get('/api/runs/eligibility').query({ revisionId: revision.id });
    expect(asked.status).toBe(200);
    expect(asked.body.eligibility).toMatchObject({ family: 'Table radio', liveWork: true });
    expect(asked.body.eligibility.refusal).toMatch(/not qualified for Table radio procedures/);
    expect(asked.body.eligibility.witnesses.map((w: { displayName: string }) => w.displayName)).toEqual([
      'Priya Lindqvist',
      'Tom Achterberg',
    ]);
    const refused = await startRun(sam, revision.id, unit.id);
    expect(refused.status).toBe(403);
    expect(refused.body.code).toBe('not-qualified');
    expect(refused.body.error).toMatch(
      /You are not qualified for Table radio procedures; a run of this procedure needs a qualified witness who co-signs it/,
    );

    const samId = await personId(t, 'sam');
    const dee = await t.as('dee');
    expect(
      (
        await (
          await t.as('tom')
        )
          .post('/api/qualifications')
          .send({ personId: samId, scope: 'family', family: 'Table radio' })
      ).status,
    ).toBe(403);
    const noFamily = await dee.post('/api/qualifications').send({ personId: samId, scope: 'family' });
    expect(noFamily.status).toBe(400);
    expect(noFamily.body.fields[0].field).toBe('body.family');
    const granted = await dee
      .post('/api/qualifications')
      .send({ personId: samId, scope: 'family', family: 'Table radio', note: 'Passed the radio bench test' });
    expect(granted.status).toBe(201);
    const twice = await dee
      .post('/api/qualifications')
      .send({ personId: samId, scope: 'family', family: 'table radio' });
    expect(twice.status).toBe(409);
    expect((await startRun(sam, revision.id, unit.id)).status).toBe(201);

    const withdrawNoReason = await dee
      .post(`/api/qualifications/${granted.body.qualification.id}/withdraw`)
      .send({});
    expect(withdrawNoReason.status).toBe(400);
    expect(withdrawNoReason.body.fields[0].field).toBe('body.reason');
    const withdrawn = await dee
      .post(`/api/qualifications/${granted.body.qualification.id}/withdraw`)
      .send({ reason: 'Granted a week early' });
    expect(withdrawn.status).toBe(200);
    const unit2 = await newUnit(sam);
    expect((await startRun(sam, revision.id, unit2.id)).status).toBe(403);
    const listed = await sam.get('/api/qualifications').query({ all: '1' });
    const mine = listed.body.qualifications.find(
      (q: { id: string }) => q.id === granted.body.qualification.id,
    );
    expect(mine.withdrawn).toMatchObject({
      reason: 'Granted a week early',
      by: { displayName: 'Dee Sandoval' },
    });
    const audit = await t.db
      .select()
      .from(auditLog)
      .where(sql`${auditLog.details} ->> 'qualificationId' = ${granted.body.qualification.id}`);
    expect(
      audit.map((r) =>
        auditSentence(r.action, { actor: 'Dee Sandoval', subject: r.subject, details: r.details }),
      ),
    ).toEqual([
      'Dee Sandoval qualified Sam Oduya for Table radio procedures.',
      'Dee Sandoval withdrew Table radio procedures from Sam Oduya.',
    ]);
  });

  it('live work needs its own qualification: without it a procedure with a hazard note is refused', async () => {
    const priyaId = await personId(t, 'priya');
    const [live] = await t.db
      .select()
      .from(qualifications)
      .where(and(eq(qualifications.personId, priyaId), eq(qualifications.scope, 'live')));
    const dee = await t.as('dee');
    expect(
      (await dee.post(`/api/qualifications/${live!.id}/withdraw`).send({ reason: 'Refresher course due' }))
        .status,
    ).toBe(200);
    const priya = await t.as('priya');
    const revision = await radioProcedure();
    const res = await startRun(priya, revision.id, (await newUnit(priya)).id);
    expect(res.status).toBe(403);
    expect(res.body.error).toMatch(/not qualified for live work/);
    expect((await dee.post('/api/qualifications').send({ personId: priyaId, scope: 'live' })).status).toBe(
      201,
    );
    expect((await startRun(priya, revision.id, (await newUnit(priya)).id)).status).toBe(201);
  });

  it('the witness must be someone else, active and qualified', async () => {
    const sam = await t.as('sam');
    const revision = await radioProcedure();
    const unit = await newUnit(sam);
    const start = (witnessId: string) =>
      sam
        .post('/api/runs')
        .send({ revisionId: revision.id, unitId: unit.id, mainsVoltage: 230, mainsFrequency: 50, witnessId });
    const self = await start(await personId(t, 'sam'));
    expect(self.status).toBe(400);
    expect(self.body.fields[0]).toEqual({
      field: 'body.witnessId',
      label: 'Witness',
      reason: 'The witness must be someone other than you',
    });
    const author = await start(await personId(t, 'hal'));
    expect(author.status).toBe(400);
    expect(author.body.fields[0].reason).toBe(
      'Hal Brennan is not qualified for Table radio procedures or live work',
    );
  });
});

describe('a trainee’s witnessed run', () => {
  it('the witness co-signs first, over the content as it stands; then the trainee signs; the run sheet shows both', async () => {
    const sam = await t.as('sam');
    const tom = await t.as('tom');
    const priya = await t.as('priya');
    const revision = await radioProcedure();
    const unit = await newUnit(sam);
    const started = await sam.post('/api/runs').send({
      revisionId: revision.id,
      unitId: unit.id,
      mainsVoltage: 230,
      mainsFrequency: 50,
      witnessId: await personId(t, 'tom'),
    });
    expect(started.status).toBe(201);
    const runId = started.body.run.id as string;
    expect(started.body.run.witness).toEqual({
      person: expect.objectContaining({ displayName: 'Tom Achterberg' }),
      signature: null,
    });
    // Not finished: the witness cannot co-sign yet.
    expect((await tom.post(`/api/runs/${runId}/witness`).send({ password: demo.tom.password })).status).toBe(
      409,
    );
    await finish(sam, runId);
    const early = await sam.post(`/api/runs/${runId}/sign`).send({ password: demo.sam.password });
    expect(early.status).toBe(409);
    expect(early.body.error).toMatch(/Tom Achterberg has not co-signed this run as it stands now/);
    // Said before the password is checked, so no password try is spent on it.
    expect((await sam.post(`/api/runs/${runId}/sign`).send({ password: 'not it' })).status).toBe(409);
    const notWitness = await priya.post(`/api/runs/${runId}/witness`).send({ password: demo.priya.password });
    expect(notWitness.status).toBe(403);
    expect(notWitness.body.error).toBe('Tom Achterberg is this run’s witness; only they co-sign it.');
    const wrongPassword = await tom.post(`/api/runs/${runId}/witness`).send({ password: 'not it' });
    expect(wrongPassword.status).toBe(401);
    expect((await tom.post(`/api/runs/${runId}/witness`).send({ password: demo.tom.password })).status).toBe(
      200,
    );
    // A changed entry after the co-signature needs the witness again.
    const changed = await entry(sam, runId, 'rd-heater', { value: '6.4 V', reason: 'Meter settled' });
    expect(changed.status).toBe(200);
    expect((await sam.get(`/api/runs/${runId}`)).body.run.witness.signature.current).toBe(false);
    expect((await sam.post(`/api/runs/${runId}/sign`).send({ password: demo.sam.password })).status).toBe(
      409,
    );
    expect((await tom.post(`/api/runs/${runId}/witness`).send({ password: demo.tom.password })).status).toBe(
      200,
    );
    const signed = await sam.post(`/api/runs/${runId}/sign`).send({ password: demo.sam.password });
    expect(signed.status, JSON.stringify(signed.body)).toBe(200);
    expect(signed.body.run.signature.verified).toBe(true);
    expect(signed.body.run.witness.signature).toMatchObject({
      current: true,
      contentHash: signed.body.run.signature.contentHash,
    });
    const audit = await t.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.action, 'run.witnessed'), eq(auditLog.subject, `run ${runId}`)));
    expect(audit).toHaveLength(2);
  });

  it('the database refuses an unqualified performer without a witness, a co-signature by anyone but the witness, a changed witness, and signing without the co-signature', async () => {
    const sam = await t.as('sam');
    const revision = await radioProcedure();
    const unit = await newUnit(sam);
    const samId = await personId(t, 'sam');
    const tomId = await personId(t, 'tom');
    const priyaId = await personId(t, 'priya');
    expect(
      await refusal((tx) =>
        tx.execute(sql`insert into runs (unit_id, procedure_id, revision_id, revision_number, revision_hash, title, params, snapshot, steps, started_by, performed_by)
          select ${unit.id}, procedure_id, id, number, 'x', title, params, snapshot, '[]'::jsonb, ${samId}, ${samId} from revisions where id = ${revision.id}`),
      ),
    ).toMatch(
      /the performer is not qualified for Table radio procedures with live work, and no witness is named/,
    );

    const started = await sam.post('/api/runs').send({
      revisionId: revision.id,
      unitId: unit.id,
      mainsVoltage: 230,
      mainsFrequency: 50,
      witnessId: tomId,
    });
    const runId = started.body.run.id as string;
    await finish(sam, runId);
    expect(
      await refusal((tx) => tx.execute(sql`update runs set witness_id = null where id = ${runId}`)),
    ).toMatch(/the witness is named when the run starts and cannot be changed/);
    expect(
      await refusal((tx) =>
        tx.execute(sql`insert into run_witness_signatures (run_id, signer_id, signer_name, content_hash, revision_id, revision_hash)
          select id, ${priyaId}, 'Priya Lindqvist', 'x', revision_id, revision_hash from runs where id = ${runId}`),
      ),
    ).toMatch(/only its named witness co-signs it/);
    // The performer's signature over a hash, and the run marked signed with it, but no co-signature.
    expect(
      await refusal(async (tx) => {
        await tx.execute(sql`insert into run_signatures (run_id, signer_id, signer_name, signer_role, meaning, content_hash, revision_id, revision_hash)
          select id, ${samId}, 'Sam Oduya', 'technician', 'performed', ${'a'.repeat(64)}, revision_id, revision_hash from runs where id = ${runId}`);
        await tx.execute(
          sql`update runs set status = 'signed', content_hash = ${'a'.repeat(64)}, signed_at = now() where id = ${runId}`,
        );
      }),
    ).toMatch(/cannot be signed without its witness's co-signature over content hash a{64}/);
    // Append-only, as the application connects.
    const tom = await t.as('tom');
    expect((await tom.post(`/api/runs/${runId}/witness`).send({ password: demo.tom.password })).status).toBe(
      200,
    );
    const changedBy = await t.db
      .execute(sql`update run_witness_signatures set content_hash = 'x' where run_id = ${runId}`)
      .then(
        () => null,
        (e: Error & { cause?: Error }) => e.cause?.message ?? e.message,
      );
    expect(changedBy).toMatch(/run_witness_signatures is append-only|permission denied/);
  });

  it('a run cannot be handed over to a technician not qualified for it when it has no witness', async () => {
    const tom = await t.as('tom');
    const revision = await radioProcedure();
    const res = await startRun(tom, revision.id, (await newUnit(tom)).id);
    expect(res.status).toBe(201);
    const handed = await tom
      .post(`/api/runs/${res.body.run.id}/handover`)
      .send({ to: await personId(t, 'sam'), reason: 'End of my shift' });
    expect(handed.status).toBe(400);
    expect(handed.body.fields[0].reason).toBe(
      'Sam Oduya is not qualified for Table radio procedures, and this run has no witness',
    );
  });
});

describe('the demo content', () => {
  it('has an instrument due next month and one past due, and a trainee’s witnessed run whose sheet and PDF name the witness and the instrument', async () => {
    const tom = await t.as('tom');
    const list = (await tom.get('/api/instruments')).body.instruments as {
      identifier: string;
      calibrationDue: string;
      refusal: string | null;
    }[];
    const today = new Date().toISOString().slice(0, 10);
    const next = new Date(Date.UTC(Number(today.slice(0, 4)), Number(today.slice(5, 7)), 15))
      .toISOString()
      .slice(0, 7);
    expect(list.find((i) => i.identifier === 'TC-DMM-01')).toMatchObject({
      calibrationDue: `${next}-15`,
      refusal: null,
    });
    expect(list.find((i) => i.identifier === 'TC-IR-01')!.refusal).toMatch(
      /^TC-IR-01 was due for calibration on/,
    );

    const runs = (await tom.get('/api/runs').query({ status: 'signed' })).body.runs as {
      id: string;
      unit: { model: string };
    }[];
    const radio = runs.find((r) => r.unit.model === 'TC-5R')!;
    const view = (await tom.get(`/api/runs/${radio.id}`)).body.run;
    expect(view.performedBy.displayName).toBe('Sam Oduya');
    expect(view.signature.verified).toBe(true);
    expect(view.witness).toMatchObject({
      person: { displayName: 'Tom Achterberg' },
      signature: { current: true },
    });
    const pdf = await tom.get(`/api/runs/${radio.id}/sheet.pdf`).buffer(true).parse(pdfBody);
    const text = pdfText(pdf.body as Buffer).join('\n');
    expect(text).toContain('Instruments used');
    expect(text).toMatch(new RegExp(`TC-DMM-01 \\(meter\\)[^\\n]*\\n?[^\\n]*calibration due ${next}-15`));
    expect(text).toMatch(/Witnessed by[^\n]*\n?[^\n]*Tom Achterberg/);
  });
});
