import { randomUUID } from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../../server/app';
import { createDb, createPool } from '../../../../server/db/client';
import { revisions, runEntryHistory, runEntries, runs } from '../../../../server/db/schema';
import supertest from 'supertest';
import { createLogger } from '../../../../server/logger';
import { pdfText as spelled } from '../../../../server/modules/runs/pdf';
import { runSheetModel } from '../../../../shared/runs/run-sheet-model';
import { mailsMatching } from '../../../support/parsed-mail';
import { pdfBody, pdfText } from '../../../support/pdf-text';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import { benchProcedure, entry, newUnit, startRun, tinyPng } from './runs-fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { mail: true });
});
afterAll(() => t.close());

type Step = { id: string; kind: string; reading?: { expected: number; low: number; high: number } };
const readingOf = (run: { steps: Step[] }, id: string) => run.steps.find((s) => s.id === id)!.reading!;

async function openRun(mainsVoltage = 230, on: TestApp = t) {
  const tom = await on.as('tom');
  const revision = await benchProcedure(on);
  const unit = await newUnit(tom);
  const res = await startRun(tom, revision.id, unit.id, mainsVoltage);
  expect(res.status).toBe(201);
  return { tom, revision, unit, run: res.body.run };
}

/** Acknowledge the hazard note, record both readings, tick the check step. */
async function finishSteps(c: Awaited<ReturnType<TestApp['as']>>, runId: string, htValue = '251 V') {
  expect((await entry(c, runId, 'hz-ht-live', { done: true })).status).toBe(200);
  expect((await entry(c, runId, 'rd-ht-ac', { value: htValue })).status).toBe(200);
  expect((await entry(c, runId, 'rd-heater', { value: '6.4' })).status).toBe(200);
  expect((await entry(c, runId, 'ck-discharge', { done: true })).status).toBe(200);
}

describe('starting a bench run', () => {
  it('refuses a revision that is not approved with 409, and authors cannot start runs', async () => {
    const tom = await t.as('tom');
    const unit = await newUnit(tom);
    for (const state of ['draft', 'in_review', 'returned', 'withdrawn'] as const) {
      const rev = await benchProcedure(t, state, `TC-18 check (${state})`);
      const res = await startRun(tom, rev.id, unit.id);
      expect(res.status, state).toBe(409);
      expect(res.body.error).toMatch(/approved revisions only/);
    }
    const approved = await benchProcedure(t);
    const hal = await t.as('hal');
    expect((await startRun(hal, approved.id, unit.id)).status).toBe(403);
    const bad = await tom
      .post('/api/runs')
      .send({ revisionId: approved.id, unitId: unit.id, mainsVoltage: 400, mainsFrequency: 'fifty' });
    expect(bad.status).toBe(400);
    expect(bad.body.fields.map((f: { field: string }) => f.field).sort()).toEqual([
      'body.mainsFrequency',
      'body.mainsVoltage',
    ]);
  });

  it('recomputes every expected value at the measured mains: a winding read at 240 V is expected higher than at 230 V', async () => {
    const at230 = (await openRun(230)).run;
    const at240 = (await openRun(240)).run;
    const w230 = readingOf(at230, 'rd-ht-ac');
    const w240 = readingOf(at240, 'rd-ht-ac');
    // 250 V rated at 230 V nominal, scaled by the mains ratio [derived: V × 240 / 230].
    expect(w230.expected).toBeCloseTo(250, 9);
    expect(w240.expected).toBeCloseTo((250 * 240) / 230, 9);
    expect(w240.low).toBeCloseTo(((250 * 240) / 230) * 0.95, 6);
    // A literal expectation does not move with the mains.
    expect(readingOf(at240, 'rd-heater').expected).toBe(6.3);
    expect(at240.params).toMatchObject({ mainsNominal: 230, mainsVoltage: 240, mainsFrequency: 50 });
    // The same value is within at 240 V and out at 230 V.
    expect((await entry(await t.as('tom'), at230.id, 'hz-ht-live', { done: true })).status).toBe(200);
    const tom = await t.as('tom');
    await entry(tom, at240.id, 'hz-ht-live', { done: true });
    expect((await entry(tom, at230.id, 'rd-ht-ac', { value: '270 V' })).body.entry.within).toBe(false);
    expect((await entry(tom, at240.id, 'rd-ht-ac', { value: '270 V' })).body.entry.within).toBe(true);
  });

  it('keeps the revision it was started on when that revision is superseded; a new run on it gets 409', async () => {
    const { tom, revision, unit, run } = await openRun();
    await t.db.update(revisions).set({ state: 'superseded' }).where(eq(revisions.id, revision.id));
    expect((await entry(tom, run.id, 'hz-ht-live', { done: true })).status).toBe(200);
    const again = await tom.get(`/api/runs/${run.id}`);
    expect(again.body.run.revision).toMatchObject({ id: revision.id, number: 1 });
    expect((await startRun(tom, revision.id, unit.id)).status).toBe(409);
  });
});

describe('entries', () => {
  it('the same entry sent three times is stored once', async () => {
    const { tom, run } = await openRun();
    await entry(tom, run.id, 'hz-ht-live', { done: true });
    const key = randomUUID();
    const sends = [];
    for (let i = 0; i < 3; i++)
      sends.push(await tom.put(`/api/runs/${run.id}/entries/rd-heater`).send({ key, value: '6.2 V' }));
    expect(sends.map((s) => s.status)).toEqual([200, 200, 200]);
    expect(sends.map((s) => s.body.replayed)).toEqual([false, true, true]);
    expect(sends[2]!.body.entry).toMatchObject({ raw: '6.2 V', measured: 6.2, version: 1, lastKey: key });
    const history = await t.db.select().from(runEntryHistory).where(eq(runEntryHistory.idempotencyKey, key));
    expect(history).toHaveLength(1);
    const rows = await t.db.select().from(runEntries).where(eq(runEntries.runId, run.id));
    expect(rows.filter((r) => r.stepId === 'rd-heater')).toHaveLength(1);
    // Parallel resends of one key also leave one row.
    const key2 = randomUUID();
    const parallel = await Promise.all(
      [0, 1, 2].map(() => tom.put(`/api/runs/${run.id}/entries/rd-ht-ac`).send({ key: key2, value: '250' })),
    );
    expect(parallel.every((p) => p.status === 200)).toBe(true);
    expect(
      await t.db.select().from(runEntryHistory).where(eq(runEntryHistory.idempotencyKey, key2)),
    ).toHaveLength(1);
    // A key reused for another step is refused (the key stands for one request).
    expect((await tom.put(`/api/runs/${run.id}/entries/rd-ht-ac`).send({ key, value: '250' })).status).toBe(
      422,
    );
  });

  it('marks an out-of-tolerance reading out whatever the client claims; client marks are refused', async () => {
    const { tom, run } = await openRun();
    await entry(tom, run.id, 'hz-ht-live', { done: true });
    const claim = await entry(tom, run.id, 'rd-ht-ac', { value: '300 V', within: true, expected: 300 });
    expect(claim.status).toBe(400);
    expect(claim.body.fields.map((f: { field: string }) => f.field)).toEqual(['body']);
    expect(claim.body.error).toMatch(/within/);
    const res = await entry(tom, run.id, 'rd-ht-ac', { value: '300 V' });
    expect(res.status).toBe(200);
    expect(res.body.entry).toMatchObject({
      within: false,
      measured: 300,
      expected: 250,
      low: 237.5,
      high: 262.5,
    });
    expect(res.body.entry.deviation).toBeCloseTo(50, 9);
    expect(res.body.entry.deviationPercent).toBeCloseTo(20, 9);
    expect(res.body.run.outOfTolerance).toBe(true);
    const rows = await t.db.select().from(runEntries).where(eq(runEntries.runId, run.id));
    expect(rows.find((r) => r.stepId === 'rd-ht-ac')!.within).toBe(false);
    // Parsed as people write it, in the reading's unit.
    const kilo = await entry(tom, run.id, 'rd-heater', { value: '0.0063 kV' });
    expect(kilo.body.entry).toMatchObject({ measured: 6.3, within: true, raw: '0.0063 kV' });
  });

  it('refuses NaN, ±Infinity, 1e309 and absurd units with 400 naming the field', async () => {
    const { tom, run } = await openRun();
    await entry(tom, run.id, 'hz-ht-live', { done: true });
    for (const value of ['NaN', 'Infinity', '-Infinity', '1e309', '352 kΩ', '352 Hz', '5 MV', 'twelve']) {
      const res = await entry(tom, run.id, 'rd-ht-ac', { value });
      expect(res.status, value).toBe(400);
      expect(res.body.fields[0].field, value).toBe('body.value');
    }
    // 1e309 as a JSON number parses to Infinity.
    const raw = await tom
      .put(`/api/runs/${run.id}/entries/rd-ht-ac`)
      .set('Content-Type', 'application/json')
      .send(`{"key":"${randomUUID()}","value":1e309}`);
    expect(raw.status).toBe(400);
    expect(raw.body.fields[0].field).toBe('body.value');
    expect(await t.db.select().from(runEntries).where(eq(runEntries.stepId, 'rd-ht-ac'))).toHaveLength(
      await countRecordedHt(),
    );
    // A value accepted round-trips exactly.
    const ok = await entry(tom, run.id, 'rd-ht-ac', { value: 251.37 });
    expect(ok.body.entry.measured).toBe(251.37);
  });

  it('locks the steps after an unacknowledged hazard note (409) until it is acknowledged', async () => {
    const { tom, run } = await openRun();
    expect(run.locked).toEqual(['rd-ht-ac', 'rd-heater', 'ck-discharge']);
    const early = await entry(tom, run.id, 'rd-ht-ac', { value: '250 V' });
    expect(early.status).toBe(409);
    expect(early.body.hazardNoteId).toBe('hz-ht-live');
    expect((await entry(tom, run.id, 'hz-ht-live', { value: '1 V' })).status).toBe(400);
    const ack = await entry(tom, run.id, 'hz-ht-live', { done: true });
    expect(ack.body.run.locked).toEqual([]);
    expect((await entry(tom, run.id, 'rd-ht-ac', { value: '250 V' })).status).toBe(200);
    expect((await entry(tom, run.id, 'hz-ht-live', { done: false, reason: 'x' })).status).toBe(400);
  });

  it('an edited measurement keeps its original, with who, when and why; the technician the run was handed to corrects it', async () => {
    const { tom, run } = await openRun();
    await entry(tom, run.id, 'hz-ht-live', { done: true });
    await entry(tom, run.id, 'rd-heater', { value: '6.1 V', note: 'meter on 20 V range' });
    const noReason = await entry(tom, run.id, 'rd-heater', { value: '6.35 V' });
    expect(noReason.status).toBe(400);
    expect(noReason.body.fields[0].field).toBe('body.reason');
    const priya = await t.as('priya');
    const priyaId = (await priya.get('/api/auth/session')).body.user.id;
    expect(
      (
        await tom
          .post(`/api/runs/${run.id}/handover`)
          .send({ to: priyaId, reason: 'Priya finishes the heater checks.' })
      ).status,
    ).toBe(200);
    const fixed = await entry(priya, run.id, 'rd-heater', { value: '6.35 V', reason: 'misread the display' });
    expect(fixed.status).toBe(200);
    const seen = (await tom.get(`/api/runs/${run.id}`)).body.run.entries.find(
      (e: { stepId: string }) => e.stepId === 'rd-heater',
    );
    expect(seen).toMatchObject({
      raw: '6.35 V',
      version: 2,
      note: 'meter on 20 V range',
      enteredBy: { displayName: 'Priya Lindqvist' },
    });
    expect(seen.history).toHaveLength(2);
    expect(seen.history[0]).toMatchObject({
      version: 1,
      raw: '6.1 V',
      reason: null,
      enteredBy: { displayName: 'Tom Achterberg' },
    });
    expect(seen.history[1]).toMatchObject({
      version: 2,
      raw: '6.35 V',
      reason: 'misread the display',
      enteredBy: { displayName: 'Priya Lindqvist' },
    });
    expect(Date.parse(seen.history[0].enteredAt)).toBeLessThanOrEqual(Date.parse(seen.history[1].enteredAt));
  });

  it('takes a photo for a step, judged by its content', async () => {
    const { tom, run } = await openRun();
    const res = await tom
      .post(`/api/runs/${run.id}/photos`)
      .field('stepId', 'rd-ht-ac')
      .attach('file', tinyPng(), { filename: 'tp1.png' });
    expect(res.status).toBe(201);
    expect(res.body.photo.stepId).toBe('rd-ht-ac');
    const html = await tom
      .post(`/api/runs/${run.id}/photos`)
      .attach('file', Buffer.from('<html></html>'), { filename: 'x.png' });
    expect(html.status).toBe(415);
    expect((await tom.get(res.body.photo.url)).headers['content-type']).toBe('image/png');
  });
});

async function countRecordedHt() {
  const rows = await t.db
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(runEntries)
    .where(eq(runEntries.stepId, 'rd-ht-ac'));
  return rows[0]!.n;
}

describe('signing the run sheet', () => {
  it('names the unfinished steps with 409, refuses a wrong password with 401, then signs once', async () => {
    const { tom, run } = await openRun();
    await entry(tom, run.id, 'hz-ht-live', { done: true });
    const early = await tom.post(`/api/runs/${run.id}/sign`).send({ password: demo.tom.password });
    expect(early.status).toBe(409);
    expect(early.body.unfinished.map((s: { id: string }) => s.id)).toEqual([
      'rd-ht-ac',
      'rd-heater',
      'ck-discharge',
    ]);
    expect(early.body.error).toMatch(/3 steps are not finished/);
    await finishSteps(tom, run.id);
    const wrong = await tom.post(`/api/runs/${run.id}/sign`).send({ password: 'not-my-password' });
    expect(wrong.status).toBe(401);
    const signed = await tom.post(`/api/runs/${run.id}/sign`).send({ password: demo.tom.password });
    expect(signed.status).toBe(200);
    const sheet = signed.body.run;
    expect(sheet.status).toBe('signed');
    expect(sheet.signature).toMatchObject({
      signer: { displayName: 'Tom Achterberg' },
      signerRole: 'technician',
      meaning: 'performed',
      verified: true,
    });
    expect(sheet.signature.contentHash).toMatch(/^[0-9a-f]{64}$/);
    expect(sheet.outOfTolerance).toBe(false);
    expect((await tom.post(`/api/runs/${run.id}/sign`).send({ password: demo.tom.password })).status).toBe(
      409,
    );
  });

  it('a signed run sheet cannot be changed: the API answers 409 and the database refuses direct SQL', async () => {
    const { tom, run } = await openRun();
    await finishSteps(tom, run.id);
    expect((await tom.post(`/api/runs/${run.id}/sign`).send({ password: demo.tom.password })).status).toBe(
      200,
    );
    const edit = await entry(tom, run.id, 'rd-heater', { value: '6.3 V', reason: 'late change' });
    expect(edit.status).toBe(409);
    expect(
      (await tom.post(`/api/runs/${run.id}/photos`).attach('file', tinyPng(), { filename: 'late.png' }))
        .status,
    ).toBe(409);
    // As the owner: the triggers refuse whoever connects, even past the application role's grants.
    const refused = async (statement: ReturnType<typeof sql>) => {
      const err = await t.ownerDb.execute(statement).then(
        () => null,
        (e: Error & { cause?: Error }) => e,
      );
      expect(err, 'the statement should fail').not.toBeNull();
      expect(err!.cause?.message ?? err!.message).toMatch(/is signed and cannot be changed|append-only/);
    };
    await refused(
      sql`update run_entries set measured = 6.3, within = true where run_id = ${run.id} and step_id = 'rd-heater'`,
    );
    await refused(sql`delete from run_entries where run_id = ${run.id}`);
    await refused(sql`update run_signatures set signer_name = 'Someone else' where run_id = ${run.id}`);
    await refused(sql`delete from run_signatures where run_id = ${run.id}`);
    await refused(sql`update runs set out_of_tolerance = true where id = ${run.id}`);
    await refused(sql`update run_entry_history set raw = '1 V' where run_id = ${run.id}`);
    const [row] = await t.db
      .select()
      .from(runEntries)
      .where(sql`${runEntries.runId} = ${run.id} and ${runEntries.stepId} = 'rd-heater'`);
    expect(row!.measured).toBe(6.4);
    // A superuser-style edit that slips past (here: the trigger disabled) is caught by the hash on read.
    await t.ownerDb.transaction(async (tx) => {
      await tx.execute(sql`alter table run_entries disable trigger run_entries_signed_guard`);
      await tx.execute(
        sql`update run_entries set note = 'edited' where run_id = ${run.id} and step_id = 'rd-heater'`,
      );
      await tx.execute(sql`alter table run_entries enable trigger run_entries_signed_guard`);
    });
    expect((await tom.get(`/api/runs/${run.id}`)).body.run.signature.verified).toBe(false);
  });

  it('an out-of-tolerance run is marked so and the author hears about it by e-mail', async () => {
    const { tom, run } = await openRun();
    await finishSteps(tom, run.id, '290 V');
    const signed = await tom.post(`/api/runs/${run.id}/sign`).send({ password: demo.tom.password });
    expect(signed.status).toBe(200);
    expect(signed.body.run.outOfTolerance).toBe(true);
    const [stored] = await t.db.select().from(runs).where(eq(runs.id, run.id));
    expect(stored!.outOfTolerance).toBe(true);
    const [mail] = await mailsMatching(
      t.catcher!.received,
      (m) => m.subject.startsWith('Out of tolerance: ') && m.links.some((l) => l.includes(run.id)),
    );
    expect(mail, 'mail in the SMTP catcher').toBeTruthy();
    expect(mail!.to).toContain(demo.hal.email);
    expect(mail!.text).toMatch(/HT winding, each half: measured 290 V/);
    // The reviewer who approved the revision is told too; the other reviewers are not.
    expect(mail!.to).toContain(demo.marek.email);
    expect(mail!.to).not.toContain(demo.dee.email);
  });

  it('exports the run sheet as a PDF with the rows the page shows: value, expected value and band, deviation, mark, note', async () => {
    const { tom, run } = await openRun();
    const note = 'Reservoir capacitor bulging; replaced after this run.';
    expect((await entry(tom, run.id, 'hz-ht-live', { done: true })).status).toBe(200);
    expect((await entry(tom, run.id, 'rd-ht-ac', { value: '290 V', note })).status).toBe(200);
    expect((await entry(tom, run.id, 'rd-heater', { value: '6.4' })).status).toBe(200);
    expect((await entry(tom, run.id, 'ck-discharge', { done: true })).status).toBe(200);
    const signed = await tom.post(`/api/runs/${run.id}/sign`).send({ password: demo.tom.password });
    expect(signed.status).toBe(200);
    const res = await tom.get(`/api/runs/${run.id}/sheet.pdf`).buffer(true).parse(pdfBody);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    // Sent as is with its length, though the client accepts gzip: API compression leaves PDFs alone.
    expect(res.headers['content-encoding']).toBeUndefined();
    expect(Number(res.headers['content-length'])).toBe((res.body as Buffer).length);
    expect((res.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="run-sheet-TC-18-/);

    const lines = pdfText(res.body as Buffer);
    const text = lines.join(' ').replace(/\s+/g, ' ');
    // The out-of-band reading: measured, deviation from the expected value the server worked out, mark, note.
    const expected = readingOf(signed.body.run, 'rd-ht-ac').expected;
    const at = lines.indexOf('290 V');
    const [, dev, pct] = /^([+-][\d.]+) V \(([+-][\d.]+) %\)$/.exec(lines[at + 1]!) ?? [];
    expect(Number(dev)).toBeCloseTo(290 - expected, 0);
    expect(Number(pct)).toBeCloseTo(((290 - expected) / expected) * 100, 0);
    expect(lines[at + 2]).toBe('out of band');
    expect(text).toContain(`Note: ${note}`);
    expect(text).toContain('Meaning: performed: I performed this bench run and recorded these readings.');
    expect(text).toContain('DANGER Lethal voltages.');
    // The hazard note's row leads with its own signal word, as on the page.
    const hazard = runSheetModel(signed.body.run).checks.find((c) => c.stepId === 'hz-ht-live')!;
    expect(hazard.signal).toBe('danger');
    expect(text).toContain(`DANGER ${hazard.position}. The HT winding is live`);

    // Every reading row of the model the page draws is in the PDF, cell by cell.
    const readings = runSheetModel(signed.body.run).readings;
    expect(readings.map((r) => r.markText)).toEqual(['out of band', 'in band']);
    for (const r of readings)
      for (const cell of [
        r.expected,
        r.band,
        r.measured,
        r.deviation,
        r.markText,
        r.note && `Note: ${r.note}`,
      ])
        if (cell) expect(text, `${r.label}: ${cell}`).toContain(spelled(cell).replace(/\s+/g, ' '));

    // The plot the page draws is in the PDF too: its heading, legend, a label per plotted reading and the
    // axis title with its unit, and round tick labels (1, 2 or 5 × 10ⁿ apart, docs/references.md §11).
    const plot = runSheetModel(signed.body.run).plot;
    expect(plot.readings.map((r) => r.stepId)).toEqual(['rd-ht-ac', 'rd-heater']);
    expect(lines).toContain('Readings against their bands');
    expect(lines).toEqual(expect.arrayContaining(['tolerance band', 'in band', 'out of band']));
    for (const r of plot.readings) {
      const label = spelled(`${r.position}. ${r.label}`).slice(0, 29);
      expect(
        lines.some((l) => l.startsWith(label)),
        label,
      ).toBe(true);
    }
    expect(lines).toContain('Deviation from expected (%)');
    const axis = lines.slice(0, lines.indexOf('Deviation from expected (%)')).slice(-12);
    const ticks = axis.slice(axis.findLastIndex((l) => !/^-?\d+(\.\d+)?$/.test(l)) + 1).map(Number);
    expect(ticks.length).toBeGreaterThanOrEqual(3);
    const step = ticks[1]! - ticks[0]!;
    const decade = 10 ** Math.floor(Math.log10(step));
    expect(
      [1, 2, 5, 10].some((m) => Math.abs(step / decade - m) < 1e-9),
      `tick step ${step}`,
    ).toBe(true);
    ticks.forEach((t, i) => expect(t).toBeCloseTo(ticks[0]! + i * step, 9));
    // The plot's text is set in the sheet's own fonts: no other font is embedded or named.
    const fonts = new Set((res.body as Buffer).toString('latin1').match(/\/BaseFont\s*\/[\w-]+/g));
    const names = [...fonts].map((f) => f.split('/').pop());
    expect(names).toContain('Helvetica');
    for (const f of names) expect(['Helvetica', 'Helvetica-Bold', 'Helvetica-Oblique']).toContain(f);
  });
});

describe('nothing lost', () => {
  it('a server restart mid-run loses no acknowledged entry', async () => {
    const first = await createTestApp();
    const { tom, run } = await openRun(230, first);
    await entry(tom, run.id, 'hz-ht-live', { done: true });
    const acked = await entry(tom, run.id, 'rd-ht-ac', { value: '248 V', note: 'before restart' });
    expect(acked.status).toBe(200);
    // The process goes away: its session store and database pool are closed.
    const url = (first.pool as unknown as { options: { connectionString: string } }).options.connectionString;
    const config = defaultConfigOf();
    first.app.deps.auth.sessions.store.close();
    await first.pool.end();
    Object.assign(first.pool, { end: async () => undefined });
    // A new server process: new pool, new app, same database.
    const pool2 = createPool(url);
    const app2 = createApp({ db: createDb(pool2), pool: pool2, logger: createLogger('silent'), config });
    try {
      const agent = supertest.agent(app2);
      const session = await agent.get('/api/auth/session');
      const signIn = await agent
        .post('/api/auth/sign-in')
        .set('x-csrf-token', session.body.csrfToken)
        .send({ email: demo.tom.email, password: demo.tom.password });
      expect(signIn.status).toBe(200);
      const back = await agent.get(`/api/runs/${run.id}`);
      expect(back.status).toBe(200);
      const ht = back.body.run.entries.find((e: { stepId: string }) => e.stepId === 'rd-ht-ac');
      expect(ht).toMatchObject({
        raw: '248 V',
        measured: 248,
        within: true,
        note: 'before restart',
        lastKey: acked.body.entry.lastKey,
      });
      expect(back.body.run.progress).toMatchObject({ done: 2, total: 4 });
      // The technician carries on where they were on the new process.
      const next = await agent
        .put(`/api/runs/${run.id}/entries/rd-heater`)
        .set('x-csrf-token', signIn.body.csrfToken)
        .send({ key: randomUUID(), value: '6.3 V' });
      expect(next.status).toBe(200);
    } finally {
      app2.deps.auth.sessions.store.close();
      await pool2.end();
      await first.close();
    }
  });
});

function defaultConfigOf(): Parameters<typeof createApp>[0]['config'] {
  return {
    sessionSecret: 'test-secret-'.padEnd(40, 'x'),
    trustProxy: false,
    publicUrl: 'http://127.0.0.1',
    signInLimits: { perAccount: 10, perAddress: 50, windowMs: 900_000 },
    sessionIdleMs: 8 * 3600_000,
    sessionAbsoluteMs: 24 * 3600_000,
    uploadDir: '/tmp',
  };
}
