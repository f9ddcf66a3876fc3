// Who may write on a bench run, and what a withdrawn revision does to the runs on it:
// only the run's current performer records entries, adds photos and signs; a handover is an
// explicit, audited step; a withdrawal puts open runs on hold until they are closed as abandoned.
import { randomUUID } from 'node:crypto';
import { and, eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditLog, runEntries } from '../../../../server/db/schema';
import { pdfBody, pdfText } from '../../../support/pdf-text';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import { mailsMatching, type ParsedMail } from '../../../support/parsed-mail';
import { benchProcedure, entry, newUnit, personId, startRun, tinyPng } from './runs-fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { mail: true });
});
afterAll(() => t.close());

type Client = Awaited<ReturnType<TestApp['as']>>;

async function runBy(who: 'tom' | 'priya' | 'sam', revisionId?: string) {
  const c = await t.as(who);
  const revision = revisionId ? { id: revisionId } : await benchProcedure(t);
  const unit = await newUnit(c);
  const res = await startRun(c, revision.id, unit.id);
  expect(res.status).toBe(201);
  return { c, run: res.body.run as { id: string }, revisionId: revision.id };
}

const sign = (c: Client, runId: string, password: string) =>
  c.post(`/api/runs/${runId}/sign`).send({ password });
const handOver = (c: Client, runId: string, body: Record<string, unknown>) =>
  c.post(`/api/runs/${runId}/handover`).send(body);
const abandon = (c: Client, runId: string, reason: string) =>
  c.post(`/api/runs/${runId}/abandon`).send({ reason });

/** The database's answer to a statement run as the application role: null when it went through. */
async function refusal(statement: ReturnType<typeof sql>) {
  return t.db.execute(statement).then(
    () => null,
    (e: Error & { cause?: Error }) => e.cause?.message ?? e.message,
  );
}

describe('only the run’s performer writes on it', () => {
  it('another technician cannot record entries on, add photos to, or sign a run Priya performs', async () => {
    const { c: priya, run } = await runBy('priya');
    const tom = await t.as('tom');
    const tried = await entry(tom, run.id, 'hz-ht-live', { done: true });
    expect(tried.status).toBe(403);
    expect(tried.body.error).toMatch(/Priya Lindqvist is performing this run/);
    expect(
      (await tom.post(`/api/runs/${run.id}/photos`).attach('file', tinyPng(), { filename: 'x.png' })).status,
    ).toBe(403);
    for (const [id, body] of [
      ['hz-ht-live', { done: true }],
      ['rd-ht-ac', { value: '251 V' }],
      ['rd-heater', { value: '6.3 V' }],
      ['ck-discharge', { done: true }],
    ] as const) {
      expect((await entry(priya, run.id, id, body)).status).toBe(200);
    }
    const signed = await sign(tom, run.id, demo.tom.password);
    expect(signed.status).toBe(403);
    expect(
      (await t.db.select().from(runEntries).where(eq(runEntries.runId, run.id))).every(
        (e) => e.version === 1,
      ),
    ).toBe(true);
    // Underneath: the database refuses an entry or a signature by anyone but the performer.
    const tomId = await personId(t, 'tom');
    expect(
      await refusal(
        sql`update run_entries set measured = 999, raw = '999 V', entered_by = ${tomId} where run_id = ${run.id} and step_id = 'rd-ht-ac'`,
      ),
    ).toMatch(/performed by another technician/);
    expect(
      await refusal(sql`insert into run_signatures (run_id, signer_id, signer_name, signer_role, meaning, content_hash, revision_id, revision_hash)
        select id, ${tomId}, 'Tom Achterberg', 'technician', 'performed', 'x', revision_id, revision_hash from runs where id = ${run.id}`),
    ).toMatch(/performed by another technician/);
    expect((await sign(priya, run.id, demo.priya.password)).status).toBe(200);
  });

  it('an entry sent with the id of the person who made it is refused from anyone else’s session', async () => {
    const { c: tom, run } = await runBy('tom');
    const priyaId = await personId(t, 'priya');
    const res = await entry(tom, run.id, 'hz-ht-live', { done: true, by: priyaId });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatch(/made by someone else/);
    expect(await t.db.select().from(runEntries).where(eq(runEntries.runId, run.id))).toEqual([]);
    expect(
      (await entry(tom, run.id, 'hz-ht-live', { done: true, by: await personId(t, 'tom') })).status,
    ).toBe(200);
  });

  it('handing over is an explicit, audited step; the sheet (screen and PDF) names both and who did which entry', async () => {
    const { c: priya, run } = await runBy('priya');
    expect((await entry(priya, run.id, 'hz-ht-live', { done: true })).status).toBe(200);
    expect((await entry(priya, run.id, 'rd-ht-ac', { value: '249 V' })).status).toBe(200);
    const tom = await t.as('tom');
    const tomId = await personId(t, 'tom');

    // Tom cannot take it himself, nor can it go to someone who is not a technician.
    expect((await handOver(tom, run.id, { to: tomId, reason: 'taking over' })).status).toBe(403);
    const toAuthor = await handOver(priya, run.id, { to: await personId(t, 'hal'), reason: 'end of shift' });
    expect(toAuthor.status).toBe(400);
    expect(toAuthor.body.fields[0].field).toBe('body.to');
    expect((await handOver(priya, run.id, { to: tomId })).status).toBe(400);

    const handed = await handOver(priya, run.id, { to: tomId, reason: 'End of my shift; Tom carries on.' });
    expect(handed.status).toBe(200);
    expect(handed.body.run.performedBy.displayName).toBe('Tom Achterberg');
    expect(handed.body.run.handovers).toMatchObject([
      {
        from: { displayName: 'Priya Lindqvist' },
        to: { displayName: 'Tom Achterberg' },
        by: { displayName: 'Priya Lindqvist' },
        reason: 'End of my shift; Tom carries on.',
      },
    ]);
    const audit = await t.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.action, 'run.handed-over'), eq(auditLog.subject, `run ${run.id}`)));
    expect(audit).toHaveLength(1);
    expect(audit[0]!.details).toMatchObject({ from: await personId(t, 'priya'), to: tomId });

    // Now Priya is the one refused, and Tom finishes and signs.
    expect((await entry(priya, run.id, 'rd-heater', { value: '6.3 V' })).status).toBe(403);
    expect((await sign(priya, run.id, demo.priya.password)).status).toBe(403);
    expect((await entry(tom, run.id, 'rd-heater', { value: '6.3 V' })).status).toBe(200);
    expect((await entry(tom, run.id, 'ck-discharge', { done: true })).status).toBe(200);
    const signed = await sign(tom, run.id, demo.tom.password);
    expect(signed.status).toBe(200);
    const sheet = signed.body.run;
    expect(sheet.startedBy.displayName).toBe('Priya Lindqvist');
    expect(sheet.signature.signer.displayName).toBe('Tom Achterberg');
    const by = Object.fromEntries(
      sheet.entries.map((e: { stepId: string; enteredBy: { displayName: string } }) => [
        e.stepId,
        e.enteredBy.displayName,
      ]),
    );
    expect(by).toEqual({
      'hz-ht-live': 'Priya Lindqvist',
      'rd-ht-ac': 'Priya Lindqvist',
      'rd-heater': 'Tom Achterberg',
      'ck-discharge': 'Tom Achterberg',
    });

    const pdf = await tom.get(`/api/runs/${run.id}/sheet.pdf`).buffer(true).parse(pdfBody);
    const lines = pdfText(pdf.body as Buffer);
    const text = lines.join(' ').replace(/\s+/g, ' ');
    expect(text).toContain('Priya Lindqvist handed the run over to Tom Achterberg');
    expect(text).toContain('Reason: End of my shift; Tom carries on.');
    // Each row of the readings table ends with who recorded it (the measured value is the row's last
    // cell with that text: the expected value before it may read the same).
    const rowAfter = (measured: string) =>
      lines.slice(lines.lastIndexOf(measured), lines.lastIndexOf(measured) + 4);
    expect(rowAfter('249 V')).toEqual(['249 V', '-1 V (-0.4 %)', 'in band', 'Priya Lindqvist']);
    expect(rowAfter('6.3 V')).toEqual(['6.3 V', '0 V (0 %)', 'in band', 'Tom Achterberg']);
  });

  it('the database refuses a change of performer with no handover recorded', async () => {
    const { run } = await runBy('priya');
    expect(
      await refusal(sql`update runs set performed_by = ${await personId(t, 'tom')} where id = ${run.id}`),
    ).toMatch(/handover/);
  });
});

describe('a withdrawn revision puts its open runs on hold', () => {
  const reason = 'Wrong bleeder value, do not use.';
  /** The hold mail that links to this run. */
  const holdMailAbout = (runId: string) => (m: ParsedMail) =>
    m.subject.startsWith('On hold: ') && m.links.some((l) => l.endsWith(`/runs/${runId}`));

  async function withdraw(revisionId: string) {
    const [row] = await t.db
      .execute<{ procedure_id: string }>(sql`select procedure_id from revisions where id = ${revisionId}`)
      .then((r) => r.rows);
    const marek = await t.as('marek');
    const res = await marek
      .post(`/api/procedures/${row!.procedure_id}/withdraw`)
      .send({ password: demo.marek.password, reason });
    expect(res.status).toBe(200);
  }

  it('refuses entries, photos and signing with 409 and the reason, shows the hold, and mails the technicians on the run', async () => {
    const { c: tom, run, revisionId } = await runBy('tom');
    for (const [id, body] of [
      ['hz-ht-live', { done: true }],
      ['rd-ht-ac', { value: '251 V' }],
      ['rd-heater', { value: '6.3 V' }],
    ] as const) {
      expect((await entry(tom, run.id, id, body)).status).toBe(200);
    }
    const { c: priya, run: second } = await runBy('priya', revisionId);
    await withdraw(revisionId);

    const late = await entry(tom, run.id, 'ck-discharge', { done: true });
    expect(late.status).toBe(409);
    expect(late.body.error).toContain(reason);
    expect(
      (await tom.post(`/api/runs/${run.id}/photos`).attach('file', tinyPng(), { filename: 'x.png' })).status,
    ).toBe(409);
    const signing = await sign(tom, run.id, demo.tom.password);
    expect(signing.status).toBe(409);
    expect(signing.body.error).toContain(reason);
    // Underneath: the database refuses an entry on a run whose revision was withdrawn.
    expect(
      await refusal(
        sql`insert into run_entries (run_id, step_id, kind, done, last_key, entered_by) values (${run.id}, 'ck-discharge', 'check', true, ${randomUUID()}, ${await personId(t, 'tom')})`,
      ),
    ).toMatch(/withdrawn/);

    const view = (await tom.get(`/api/runs/${run.id}`)).body.run;
    expect(view.status).toBe('in_progress');
    expect(view.hold).toMatchObject({ reason, by: 'Marek Vos', revisionNumber: 1 });
    expect(
      (await priya.get(`/api/runs?status=in_progress`)).body.runs.find(
        (r: { id: string }) => r.id === second.id,
      ),
    ).toMatchObject({ onHold: true });

    const mails = await mailsMatching(t.catcher!.received, holdMailAbout(run.id));
    expect(mails).toHaveLength(1);
    expect(mails[0]!.to).toEqual([demo.tom.email]);
    expect(mails[0]!.subject).toMatch(/^On hold: .* revision 1 was withdrawn$/);
    expect(mails[0]!.text).toContain(reason);
    expect((await mailsMatching(t.catcher!.received, holdMailAbout(second.id)))[0]!.to).toEqual([
      demo.priya.email,
    ]);
  });

  it('a held run can be closed as abandoned by its performer, recorded and audited; after that nothing on it changes', async () => {
    const { c: tom, run, revisionId } = await runBy('tom');
    expect((await entry(tom, run.id, 'hz-ht-live', { done: true })).status).toBe(200);
    await withdraw(revisionId);
    const priya = await t.as('priya');
    expect((await abandon(priya, run.id, 'not mine')).status).toBe(403);
    expect((await tom.post(`/api/runs/${run.id}/abandon`).send({})).status).toBe(400);
    const closed = await abandon(
      tom,
      run.id,
      'Procedure withdrawn; unit goes back on the shelf until the new revision.',
    );
    expect(closed.status).toBe(200);
    expect(closed.body.run.status).toBe('abandoned');
    expect(closed.body.run.closed).toMatchObject({
      by: { displayName: 'Tom Achterberg' },
      reason: 'Procedure withdrawn; unit goes back on the shelf until the new revision.',
    });
    const audit = await t.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.action, 'run.abandoned'), eq(auditLog.subject, `run ${run.id}`)));
    expect(audit).toHaveLength(1);

    expect((await abandon(tom, run.id, 'again')).status).toBe(409);
    const after = await entry(tom, run.id, 'rd-ht-ac', { value: '250 V' });
    expect(after.status).toBe(409);
    expect(after.body.error).toMatch(/abandoned/);
    expect(
      (await handOver(tom, run.id, { to: await personId(t, 'priya'), reason: 'Priya takes it from here.' }))
        .status,
    ).toBe(409);
    expect(
      (await tom.get(`/api/runs?status=abandoned`)).body.runs.some((r: { id: string }) => r.id === run.id),
    ).toBe(true);
    // The database keeps an abandoned run as it was closed.
    expect(await refusal(sql`update runs set status = 'in_progress' where id = ${run.id}`)).toMatch(
      /abandoned/,
    );
    expect(await refusal(sql`update run_entries set note = 'later' where run_id = ${run.id}`)).toMatch(
      /abandoned/,
    );
  });

  it('runs already signed on the revision stay signed and verified, and their technicians get no hold mail', async () => {
    const { c: sam, run, revisionId } = await runBy('sam');
    for (const [id, body] of [
      ['hz-ht-live', { done: true }],
      ['rd-ht-ac', { value: '251 V' }],
      ['rd-heater', { value: '6.3 V' }],
      ['ck-discharge', { done: true }],
    ] as const) {
      expect((await entry(sam, run.id, id, body)).status).toBe(200);
    }
    expect((await sign(sam, run.id, demo.sam.password)).status).toBe(200);
    await withdraw(revisionId);
    const view = (await sam.get(`/api/runs/${run.id}`)).body.run;
    expect(view.status).toBe('signed');
    expect(view.signature.verified).toBe(true);
    expect(await mailsMatching(t.catcher!.received, holdMailAbout(run.id), 0)).toEqual([]);
  });
});
