// Hold points and step records on a bench run: an out-of-band reading at a hold point stops the run
// until a reviewer or admin not on it decides; a step may be not applicable (with why) or a
// deviation (what was done instead) that a senior approves before the run can be signed. The
// database refuses the same shortcuts underneath.
import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditLog, runHolds, runs, runStepExceptions } from '../../../../server/db/schema';
import { runContentHash } from '../../../../server/modules/runs/run-hash';
import { runContent } from '../../../../server/modules/runs/run-view';
import type { HomeView } from '../../../../shared/schemas/home';
import type { RunView } from '../../../../shared/schemas/runs';
import { pdfBody, pdfText } from '../../../support/pdf-text';
import { procedureInState } from '../../../support/review-path';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import { benchDoc, entry, newUnit, personId, startRun } from './runs-fixtures';

let t: TestApp;
let revisionId: string;
beforeAll(async () => {
  t = await createTestApp();
  // The heater reading (6.3 V ± 0.3 V) is a hold point.
  const document = structuredClone(benchDoc);
  for (const n of document.content!)
    if (n.type === 'reading' && n.attrs?.id === 'rd-heater') n.attrs.holdPoint = true;
  const { revision } = await procedureInState(t.db, 'approved', {
    title: 'TC-18 heater hold point',
    equipmentFamily: 'Guitar amplifier',
    equipmentModel: 'TC-18',
    tags: ['ht'],
    params: { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 },
    document,
  });
  revisionId = revision.id;
});
afterAll(() => t.close());

type Client = Awaited<ReturnType<TestApp['as']>>;

async function openRun() {
  const priya = await t.as('priya');
  const unit = await newUnit(priya);
  const res = await startRun(priya, revisionId, unit.id);
  expect(res.status).toBe(201);
  const run = res.body.run as RunView;
  expect((await entry(priya, run.id, 'hz-ht-live', { done: true })).status).toBe(200);
  return { priya, runId: run.id };
}

const decideHold = (c: Client, runId: string, holdId: string, body: Record<string, unknown>) =>
  c.post(`/api/runs/${runId}/holds/${holdId}/decision`).send(body);
const except = (c: Client, runId: string, body: Record<string, unknown>) =>
  c.post(`/api/runs/${runId}/exceptions`).send(body);
const decideDeviation = (c: Client, runId: string, id: string, body: Record<string, unknown>) =>
  c.post(`/api/runs/${runId}/exceptions/${id}/decision`).send(body);
const sign = (c: Client, runId: string) =>
  c.post(`/api/runs/${runId}/sign`).send({ password: demo.priya.password });

/** The database's answer to a statement: null when it went through. */
const refusal = (db: TestApp['db'], statement: ReturnType<typeof sql>) =>
  db.execute(statement).then(
    () => null,
    (e: Error & { cause?: Error }) => e.cause?.message ?? e.message,
  );

describe('a hold point', () => {
  it('is carried by the run’s step, and only by the step marked', async () => {
    const { priya, runId } = await openRun();
    const run = (await priya.get(`/api/runs/${runId}`)).body.run as RunView;
    expect(run.steps.find((s) => s.id === 'rd-heater')?.holdPoint).toBe(true);
    expect(run.steps.find((s) => s.id === 'rd-ht-ac')?.holdPoint).toBeUndefined();
  });

  it('an in-band reading there does not stop the run', async () => {
    const { priya, runId } = await openRun();
    const res = await entry(priya, runId, 'rd-heater', { value: '6.4 V' });
    expect(res.status).toBe(200);
    expect(res.body.run.stoppedAtHoldPoint).toBe(false);
    expect((await priya.get(`/api/runs/${runId}`)).body.run.holdPoints).toEqual([]);
    expect((await entry(priya, runId, 'ck-discharge', { done: true })).status).toBe(200);
  });

  it('out of band stops the run until a reviewer decides to continue, with a reason; the decision is audited and fixed', async () => {
    const { priya, runId } = await openRun();
    // 7.2 V is outside 6.3 V ± 0.3 V (6.0 … 6.6 V).
    const out = await entry(priya, runId, 'rd-heater', { value: '7.2 V' });
    expect(out.status).toBe(200);
    // The entry's answer says the run stopped; the run page shows the hold.
    expect(out.body.run.stoppedAtHoldPoint).toBe(true);
    const held = (await priya.get(`/api/runs/${runId}`)).body.run as RunView;
    const [hold] = held.holdPoints as RunView['holdPoints'] & object[];
    expect(hold).toMatchObject({ stepId: 'rd-heater', raw: '7.2 V', decision: null });

    // Everything else waits, with a sentence that says why and who decides.
    const next = await entry(priya, runId, 'ck-discharge', { done: true });
    expect(next.status).toBe(409);
    expect(next.body.error).toMatch(
      /“Heater winding” \(step 3\) is a hold point and was out of band: measured 7\.2 V.*stopped until a reviewer or an admin who is not performing the run decides/,
    );
    expect(
      (
        await except(priya, runId, {
          stepId: 'ck-discharge',
          kind: 'not_applicable',
          reason: 'No reservoir fitted yet',
        })
      ).status,
    ).toBe(409);
    expect((await sign(priya, runId)).body.error).toMatch(/hold point/);

    // The reviewers' list shows it; a technician cannot decide it.
    const marek = await t.as('marek');
    const waiting = (await marek.get('/api/runs/awaiting-decision')).body.awaiting as {
      id: string;
      kind: string;
    }[];
    expect(waiting).toContainEqual(expect.objectContaining({ id: hold!.id, kind: 'hold' }));
    // The run list says so too.
    const listed = (await marek.get('/api/runs?status=in_progress')).body.runs as {
      id: string;
      atHoldPoint: boolean;
    }[];
    expect(listed.find((r) => r.id === runId)?.atHoldPoint).toBe(true);
    // And the reviewer's home page, under what waits for them.
    const home = (await marek.get('/api/home')).body as HomeView;
    const decisions = home.sections.find((x) => x.key === 'decisions');
    expect(decisions?.items).toContainEqual(
      expect.objectContaining({ id: hold!.id, href: `/runs/${runId}`, urgent: true }),
    );
    expect((await priya.get('/api/home')).body.sections.map((x: { key: string }) => x.key)).not.toContain(
      'decisions',
    );
    expect(
      (await decideHold(priya, runId, hold!.id, { decision: 'continue', reason: 'x'.repeat(5) })).status,
    ).toBe(403);

    // A reason is required.
    const bare = await decideHold(marek, runId, hold!.id, { decision: 'continue', reason: ' ' });
    expect(bare.status).toBe(400);
    expect(bare.body.fields).toContainEqual(expect.objectContaining({ field: 'body.reason' }));

    const ok = await decideHold(marek, runId, hold!.id, {
      decision: 'continue',
      reason: 'Heater winding runs high on this mains tap; within the valve maker’s limit.',
    });
    expect(ok.status).toBe(200);
    expect(ok.body.run.holdPoints[0]).toMatchObject({
      decision: 'continue',
      decidedBy: { displayName: 'Marek Vos' },
    });
    expect((await entry(priya, runId, 'ck-discharge', { done: true })).status).toBe(200);
    const after = (await marek.get('/api/runs?status=in_progress')).body.runs as {
      id: string;
      atHoldPoint: boolean;
    }[];
    expect(after.find((r) => r.id === runId)?.atHoldPoint).toBe(false);

    // Decided once: again through the API, and underneath.
    const again = await decideHold(marek, runId, hold!.id, {
      decision: 'abandon',
      reason: 'Changed my mind',
    });
    expect(again.status).toBe(409);
    expect(again.body.error).toMatch(/already decided/);
    expect(
      await refusal(t.db, sql`update run_holds set reason = 'Something else' where id = ${hold!.id}`),
    ).toMatch(/decided and cannot be changed/);
    expect(await refusal(t.db, sql`delete from run_holds where id = ${hold!.id}`)).toMatch(
      /permission denied/,
    );
    expect(await refusal(t.ownerDb, sql`delete from run_holds where id = ${hold!.id}`)).toMatch(
      /cannot be deleted/,
    );

    const audit = await t.db.select().from(auditLog).where(eq(auditLog.action, 'run.hold-decided'));
    expect(audit.some((a) => a.details.holdId === hold!.id && a.details.decision === 'continue')).toBe(true);
  });

  it('a reviewer may abandon the run there: it closes as abandoned, with the reason', async () => {
    const { priya, runId } = await openRun();
    await entry(priya, runId, 'rd-heater', { value: '5.1 V' });
    const holdId = (await priya.get(`/api/runs/${runId}`)).body.run.holdPoints[0].id as string;
    const dee = await t.as('dee');
    const res = await decideHold(dee, runId, holdId, {
      decision: 'abandon',
      reason: 'Heater winding shorted turns suspected.',
    });
    expect(res.status).toBe(200);
    expect(res.body.run.status).toBe('abandoned');
    expect(res.body.run.closed.by.displayName).toBe('Dee Sandoval');
    expect(res.body.run.closed.reason).toMatch(/hold point “Heater winding”.*shorted turns/);
    expect((await entry(priya, runId, 'ck-discharge', { done: true })).status).toBe(409);
  });

  it('the database refuses entries while held, a decided insert, a hold on another step, and a decision by the performer or a technician', async () => {
    const { priya, runId } = await openRun();
    await entry(priya, runId, 'rd-heater', { value: '7.0 V' });
    const holdId = (await priya.get(`/api/runs/${runId}`)).body.run.holdPoints[0].id as string;
    const priyaId = await personId(t, 'priya');
    const samId = await personId(t, 'sam');
    expect(
      await refusal(
        t.db,
        sql`insert into run_entries (run_id, step_id, kind, done, last_key, entered_by) values (${runId}, 'ck-discharge', 'check', true, gen_random_uuid(), ${priyaId})`,
      ),
    ).toMatch(/stopped at a hold point/);
    expect(
      await refusal(
        t.db,
        sql`insert into run_holds (run_id, step_id, entry_version, raw, measured, unit, opened_by) values (${runId}, 'rd-ht-ac', 1, '1 V', 1, 'V', ${priyaId})`,
      ),
    ).toMatch(/not a hold point/);
    expect(
      await refusal(
        t.db,
        sql`insert into run_holds (run_id, step_id, entry_version, raw, measured, unit, opened_by, decision, reason, decided_by, decided_by_name, decided_at)
            values (${runId}, 'rd-heater', 1, '7 V', 7, 'V', ${priyaId}, 'continue', 'Decided in advance', ${samId}, 'Sam Oduya', now())`,
      ),
    ).toMatch(/opened undecided/);
    for (const who of [priyaId, samId])
      expect(
        await refusal(
          t.db,
          sql`update run_holds set decision = 'continue', reason = 'Looks fine to me', decided_by = ${who}, decided_by_name = 'x', decided_at = now() where id = ${holdId}`,
        ),
      ).toMatch(
        who === priyaId
          ? /only an active reviewer or admin|does not decide/
          : /only an active reviewer or admin/,
      );
  });
});

describe('steps not applicable and deviations', () => {
  it('a deviation waits for a senior’s approval before signing; a refused one leaves the step unfinished; the sheet, PDF and hash carry them', async () => {
    const { priya, runId } = await openRun();
    // A hazard note is never skipped; a reason is required.
    const hazard = await except(priya, runId, {
      stepId: 'hz-ht-live',
      kind: 'not_applicable',
      reason: 'Unit is cold',
    });
    expect(hazard.status).toBe(400);
    expect(hazard.body.fields[0].reason).toMatch(/hazard note is always acknowledged/);
    const bare = await except(priya, runId, { stepId: 'ck-discharge', kind: 'not_applicable', reason: '' });
    expect(bare.status).toBe(400);
    expect(bare.body.fields).toContainEqual(expect.objectContaining({ field: 'body.reason' }));

    expect((await entry(priya, runId, 'rd-ht-ac', { value: '251 V' })).status).toBe(200);
    expect((await entry(priya, runId, 'rd-heater', { value: '6.3 V' })).status).toBe(200);
    const na = await except(priya, runId, {
      stepId: 'ck-discharge',
      kind: 'deviation',
      reason: 'Reservoir discharged through the 10 kΩ probe and read at 2 V instead of the bleeder wait.',
    });
    expect(na.status).toBe(201);
    const deviation = (na.body.run as RunView).exceptions![0]!;
    expect(deviation).toMatchObject({ kind: 'deviation', decision: null, current: true });

    const waiting = await sign(priya, runId);
    expect(waiting.status).toBe(409);
    expect(waiting.body.error).toMatch(
      /deviation on “Reservoir discharged.*” \(step 4\) waits for a reviewer or an admin/,
    );

    const marek = await t.as('marek');
    expect(
      (await decideDeviation(priya, runId, deviation.id, { decision: 'approved', note: 'Fine' })).status,
    ).toBe(403);
    const noNote = await decideDeviation(marek, runId, deviation.id, { decision: 'approved' });
    expect(noNote.status).toBe(400);
    expect(noNote.body.fields).toContainEqual(expect.objectContaining({ field: 'body.note' }));
    const refused = await decideDeviation(marek, runId, deviation.id, {
      decision: 'refused',
      note: 'Use the bleeder wait as written; the probe reading is not recorded.',
    });
    expect(refused.status).toBe(200);
    const unfinished = await sign(priya, runId);
    expect(unfinished.status).toBe(409);
    expect(unfinished.body.error).toMatch(/1 step is not finished: 4\. Reservoir discharged/);

    // Recorded again, approved: the step counts as finished and the run is signed.
    const second = await except(priya, runId, {
      stepId: 'ck-discharge',
      kind: 'deviation',
      reason: 'Discharged through the probe; 2 V read on the meter, photo of the reading kept.',
    });
    const secondId = (second.body.run as RunView).exceptions!.find((x) => x.current)!.id;
    expect(
      (
        await decideDeviation(marek, runId, secondId, {
          decision: 'approved',
          note: 'Probe discharge with a reading is acceptable.',
        })
      ).status,
    ).toBe(200);
    expect(
      await refusal(
        t.db,
        sql`update run_step_exceptions set decision_note = 'Something else' where id = ${secondId}`,
      ),
    ).toMatch(/decided and cannot be changed/);
    const signed = await sign(priya, runId);
    expect(signed.status).toBe(200);
    const run = signed.body.run as RunView;
    expect(run.signature?.verified).toBe(true);
    expect(run.progress.done).toBe(run.progress.total);

    // The signature covers the records: without them the content hashes differently.
    const [row] = await t.db.select().from(runs).where(eq(runs.id, runId));
    const content = await runContent(t.db, t.files, row!, row!.unitRecord!);
    expect(runContentHash(content)).toBe(run.signature!.contentHash);
    expect(content.exceptions).toHaveLength(2);
    expect(runContentHash({ ...content, exceptions: undefined })).not.toBe(run.signature!.contentHash);

    const pdf = await priya.get(`/api/runs/${runId}/sheet.pdf`).buffer(true).parse(pdfBody);
    const text = pdfText(pdf.body as Buffer)
      .join(' ')
      .replace(/\s+/g, ' ');
    expect(text).toContain('Hold points, steps not applicable and deviations');
    expect(text).toContain('Approved by Marek Vos');
    expect(text).toContain('Refused by Marek Vos');
  });

  it('not applicable finishes a step without a decision, and cannot be decided', async () => {
    const { priya, runId } = await openRun();
    const res = await except(priya, runId, {
      stepId: 'rd-ht-ac',
      kind: 'not_applicable',
      reason: 'Chassis has a solid-state HT module; no winding to measure.',
    });
    expect(res.status).toBe(201);
    const run = res.body.run as RunView;
    expect(run.progress.done).toBe(2);
    const marek = await t.as('marek');
    const decided = await decideDeviation(marek, runId, run.exceptions![0]!.id, {
      decision: 'approved',
      note: 'Fine by me',
    });
    expect(decided.status).toBe(409);
    expect(decided.body.error).toMatch(/needs no decision/);
    // A step already done is not also not applicable.
    expect((await entry(priya, runId, 'rd-heater', { value: '6.3 V' })).status).toBe(200);
    const done = await except(priya, runId, {
      stepId: 'rd-heater',
      kind: 'not_applicable',
      reason: 'Skipped it',
    });
    expect(done.status).toBe(409);
  });
});

describe('demo content', () => {
  it('has a hold point decided to continue, with its reason, and a deviation a reviewer approved', async () => {
    const holds = await t.db.select().from(runHolds);
    const demoHold = holds.find((h) => h.stepId === 'tc30h-rd-ht-ohms');
    expect(demoHold).toMatchObject({ decision: 'continue', decidedByName: 'Marek Vos', raw: '29.6 Ω' });
    const [deviation] = await t.db
      .select()
      .from(runStepExceptions)
      .where(eq(runStepExceptions.stepId, 'bleed-ck-fuse'));
    expect(deviation).toMatchObject({
      kind: 'deviation',
      decision: 'approved',
      decidedByName: 'Dee Sandoval',
    });
  });
});
