import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { revisions, runs } from '../../../../server/db/schema';
import { pdfText as spelled } from '../../../../server/modules/runs/pdf';
import { formatQuantity } from '../../../../shared/units/format';
import { runSheetModel } from '../../../../shared/runs/run-sheet-model';
import { pdfBody, pdfText } from '../../../support/pdf-text';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import { benchProcedure, entry, newUnit } from '../runs/runs-fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

type Client = Awaited<ReturnType<TestApp['as']>>;
type Reading = { id: string; expected: number | null; bandText: string | null; unit: string };
type Step = { id: string; position: number; reading?: Reading & { expected: number | null } };

const dayOffset = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);
/** What the database said when it refused a statement (drizzle wraps it). */
const refusal = (p: Promise<unknown>) =>
  p.then(
    () => 'accepted',
    (e: Error & { cause?: Error }) => e.cause?.message ?? e.message,
  );
const flat = (lines: string[]) => lines.join(' ').replace(/\s+/g, ' ');

async function sheetPdf(c: Client, revisionId: string, query: Record<string, string>) {
  const res = await c
    .get(`/api/revisions/${revisionId}/bench-sheet.pdf`)
    .query(query)
    .buffer(true)
    .parse(pdfBody);
  return res;
}

/** The lines of one reading's row: its label first, then expected value, band and tolerance. */
function rowOf(lines: string[], position: number, label: string) {
  const at = lines.findIndex((l) => l.startsWith(`${position}. ${label}`));
  expect(at, `row ${position}. ${label}`).toBeGreaterThanOrEqual(0);
  return lines.slice(at, at + 8);
}

describe('blank bench sheet', () => {
  it('works out every expected value and band for the mains chosen, as the reader and a bench run at that mains do', async () => {
    const revision = await benchProcedure(t, 'approved', 'TC-18 bench sheet check');
    const tom = await t.as('tom');
    // What the reader shows: the revision's own evaluation at its design mains (230 V).
    const read = await tom.get(`/api/revisions/${revision.id}`);
    expect(read.status).toBe(200);
    const readerReadings = read.body.revision.snapshot.readings as Reading[];

    const at230 = await sheetPdf(tom, revision.id, { mainsVoltage: '230', mainsFrequency: '50' });
    expect(at230.status).toBe(200);
    expect(at230.headers['content-type']).toBe('application/pdf');
    expect((at230.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
    expect(at230.headers['content-disposition']).toMatch(
      /^attachment; filename="bench-sheet-BS-[0-9a-f]{12}-230V-50Hz-\d{8}\.pdf"$/,
    );
    const lines230 = pdfText(at230.body as Buffer);
    for (const [position, r] of [
      [2, readerReadings.find((x) => x.id === 'rd-ht-ac')!],
      [3, readerReadings.find((x) => x.id === 'rd-heater')!],
    ] as const) {
      const row = rowOf(lines230, position, r.id === 'rd-ht-ac' ? 'HT winding, each half' : 'Heater winding');
      expect(row).toContain(spelled(formatQuantity(r.expected!, r.unit, 4)));
      expect(row).toContain(spelled(r.bandText!));
    }

    // At 240 V: what a bench run started at 240 V expects, and different from the sheet at 230 V.
    const unit = await newUnit(tom);
    const started = await tom
      .post('/api/runs')
      .send({ revisionId: revision.id, unitId: unit.id, mainsVoltage: 240, mainsFrequency: 50 });
    expect(started.status).toBe(201);
    const ht240 = (started.body.run.steps as Step[]).find((s) => s.id === 'rd-ht-ac')!.reading!;
    // A winding rated 250 V at 230 V nominal, scaled with the mains: a secondary follows its primary by the turns ratio (docs/references.md §10).
    expect(ht240.expected).toBeCloseTo((250 * 240) / 230, 9);
    const at240 = await sheetPdf(tom, revision.id, { mainsVoltage: '240' });
    expect(at240.status).toBe(200);
    const lines240 = pdfText(at240.body as Buffer);
    const row240 = rowOf(lines240, 2, 'HT winding, each half');
    expect(row240).toContain(spelled(formatQuantity(ht240.expected!, 'V', 4)));
    expect(row240).toContain(spelled(ht240.bandText!));
    expect(row240).not.toContain(spelled(formatQuantity(250, 'V', 4)));
    // The heater reading is a typed value that does not follow the mains: the same at both.
    expect(rowOf(lines240, 3, 'Heater winding')).toContain('6.3 V');

    const text = flat(lines240);
    // The approval record, the mains, the caution and signs of the run sheet, a box per step, the lines for the bench.
    expect(text).toContain(`Revision content SHA-256: ${started.body.run.revision.contentHash}`);
    expect(text).toContain('Worked out for mains: 240 V rms, 50 Hz (procedure nominal 230 V)');
    expect(text).toContain('DANGER Lethal voltages.');
    expect(text).toContain('DANGER 1. The HT winding is live');
    expect(text).toContain('4. Check: Reservoir discharged below 60 V');
    for (const blank of [
      'Unit model',
      'Serial',
      'Technician',
      'Date filled in',
      'Instrument',
      'Calibration due',
    ])
      expect(lines240).toContain(blank);
    // The identifier names the revision's hash, the mains and the day printed.
    const id = `BS-${started.body.run.revision.contentHash.slice(0, 12)}-240V-50Hz-${dayOffset(0).replaceAll('-', '')}`;
    expect(text).toContain(`Sheet ${id}`);
  });

  it('refuses a mains out of range with 400 naming it, and a revision that is not approved with 409', async () => {
    const revision = await benchProcedure(t, 'approved', 'TC-18 bench sheet range');
    const tom = await t.as('tom');
    const bad = await tom.get(`/api/revisions/${revision.id}/bench-sheet.pdf`).query({ mainsVoltage: '400' });
    expect(bad.status).toBe(400);
    expect(bad.body.fields.map((f: { field: string }) => f.field)).toEqual(['query.mainsVoltage']);
    const draft = await benchProcedure(t, 'draft', 'TC-18 bench sheet draft');
    const hal = await t.as('hal');
    const refused = await hal
      .get(`/api/revisions/${draft.id}/bench-sheet.pdf`)
      .query({ mainsVoltage: '230' });
    expect(refused.status).toBe(409);
    expect(refused.body.error).toMatch(/approved revisions only/);
  });
});

describe('readings copied from a paper sheet', () => {
  async function paperRun(paperSheet: Record<string, unknown>, mainsVoltage = 230) {
    const revision = await benchProcedure(t, 'approved', 'TC-18 paper run');
    const tom = await t.as('tom');
    const unit = await newUnit(tom);
    const res = await tom
      .post('/api/runs')
      .send({ revisionId: revision.id, unitId: unit.id, mainsVoltage, mainsFrequency: 50, paperSheet });
    return { tom, revision, unit, res };
  }

  it('refuses a paper date in the future or before the revision was approved, naming the field', async () => {
    const future = await paperRun({ date: dayOffset(2) });
    expect(future.res.status).toBe(400);
    expect(future.res.body.fields).toEqual([
      expect.objectContaining({
        field: 'body.paperSheet.date',
        reason: expect.stringMatching(/in the future/),
      }),
    ]);
    const early = await paperRun({ date: dayOffset(-2) });
    expect(early.res.status).toBe(400);
    expect(early.res.body.fields).toEqual([
      expect.objectContaining({
        field: 'body.paperSheet.date',
        reason: expect.stringMatching(/before revision/),
      }),
    ]);
    const garbled = await paperRun({ date: '14/03/2026' });
    expect(garbled.res.status).toBe(400);
    expect(garbled.res.body.fields[0].field).toBe('body.paperSheet.date');
  });

  it('refuses a sheet identifier from another revision or another mains', async () => {
    const other = await paperRun({
      date: dayOffset(0),
      reference: `BS-000000000000-230V-50Hz-${dayOffset(0).replaceAll('-', '')}`,
    });
    expect(other.res.status).toBe(400);
    expect(other.res.body.fields[0]).toMatchObject({
      field: 'body.paperSheet.reference',
      reason: 'This sheet was printed from another revision',
    });
    const nonsense = await paperRun({ date: dayOffset(0), reference: 'sheet 4' });
    expect(nonsense.res.status).toBe(400);
    expect(nonsense.res.body.fields[0].field).toBe('body.paperSheet.reference');
  });

  it('keeps the paper date on every entry made from it, beside the recorded time, in the signed hash, the sheet and the PDF', async () => {
    const today = dayOffset(0);
    const revision = await benchProcedure(t, 'approved', 'TC-18 paper run signed');
    const tom = await t.as('tom');
    const unit = await newUnit(tom);
    // The sheet printed for 236 V, then its readings copied in on a run at the same mains.
    const printed = await sheetPdf(tom, revision.id, { mainsVoltage: '236', mainsFrequency: '50' });
    const sheetId = /filename="bench-sheet-(BS-[^"]+)\.pdf"/.exec(
      String(printed.headers['content-disposition']),
    )![1]!;
    const wrongMains = await tom.post('/api/runs').send({
      revisionId: revision.id,
      unitId: unit.id,
      mainsVoltage: 230,
      mainsFrequency: 50,
      paperSheet: { date: today, reference: sheetId },
    });
    expect(wrongMains.status).toBe(400);
    expect(wrongMains.body.fields[0].reason).toMatch(/worked out for 236 V, 50 Hz/);
    const started = await tom.post('/api/runs').send({
      revisionId: revision.id,
      unitId: unit.id,
      mainsVoltage: 236,
      mainsFrequency: 50,
      paperSheet: { date: today, reference: sheetId },
    });
    expect(started.status).toBe(201);
    const runId = started.body.run.id as string;
    expect(started.body.run.paperSheet).toEqual({ date: today, reference: sheetId });
    for (const [step, body] of [
      ['hz-ht-live', { done: true }],
      ['rd-ht-ac', { value: '257 V' }],
      ['rd-heater', { value: '6.3' }],
      ['ck-discharge', { done: true }],
    ] as const)
      expect((await entry(tom, runId, step, body)).status).toBe(200);
    const signed = await tom.post(`/api/runs/${runId}/sign`).send({ password: demo.tom.password });
    expect(signed.status).toBe(200);
    const run = signed.body.run;
    expect(run.signature.verified).toBe(true);
    for (const e of run.entries) {
      expect(e.takenOn).toBe(today);
      expect(e.enteredAt).toMatch(/^\d{4}-\d\d-\d\dT/); // the server's time stays
    }
    const sheet = runSheetModel(run);
    expect(sheet.bench).toContainEqual(
      expect.objectContaining({ value: `Entered from a paper sheet dated ${today} (sheet ${sheetId})` }),
    );
    const pdf = await tom.get(`/api/runs/${runId}/sheet.pdf`).buffer(true).parse(pdfBody);
    const text = flat(pdfText(pdf.body as Buffer));
    expect(text).toContain(`Entered from a paper sheet dated ${today}`);
    expect(text).toContain(`entered from a paper sheet dated ${today}`);

    // The signature covers the paper date: changed underneath (as the owner, triggers aside), the check fails.
    await t.ownerDb.transaction(async (tx) => {
      await tx.execute(sql`alter table runs disable trigger user`);
      await tx
        .update(runs)
        .set({ paperSheetDate: dayOffset(-1) })
        .where(eq(runs.id, runId));
      await tx.execute(sql`alter table runs enable trigger user`);
    });
    const after = await tom.get(`/api/runs/${runId}`);
    expect(after.body.run.signature.verified).toBe(false);
  });

  it('within a run: entries made after saying "from paper" keep its date, earlier ones do not; only the performer says so', async () => {
    const revision = await benchProcedure(t, 'approved', 'TC-18 paper run midway');
    const tom = await t.as('tom');
    const unit = await newUnit(tom);
    const started = await tom
      .post('/api/runs')
      .send({ revisionId: revision.id, unitId: unit.id, mainsVoltage: 230, mainsFrequency: 50 });
    const runId = started.body.run.id as string;
    expect((await entry(tom, runId, 'hz-ht-live', { done: true })).status).toBe(200);
    const today = dayOffset(0);
    const future = await tom
      .put(`/api/runs/${runId}/paper-sheet`)
      .send({ paperSheet: { date: dayOffset(3) } });
    expect(future.status).toBe(400);
    expect(future.body.fields[0].field).toBe('body.paperSheet.date');
    const hal = await t.as('hal');
    expect(
      (await hal.put(`/api/runs/${runId}/paper-sheet`).send({ paperSheet: { date: today } })).status,
    ).toBe(403);
    const said = await tom.put(`/api/runs/${runId}/paper-sheet`).send({ paperSheet: { date: today } });
    expect(said.status).toBe(200);
    expect(said.body.run.paperSheet).toEqual({ date: today, reference: null });
    const taken = await entry(tom, runId, 'rd-ht-ac', { value: '250 V' });
    // The entry's answer carries its paper date; the run page shows it beside the earlier entry.
    expect(taken.body.entry.takenOn).toBe(today);
    const entriesNow = async () =>
      (await tom.get(`/api/runs/${runId}`)).body.run.entries as { stepId: string; takenOn: string | null }[];
    expect((await entriesNow()).find((e) => e.stepId === 'rd-ht-ac')!.takenOn).toBe(today);
    expect((await entriesNow()).find((e) => e.stepId === 'hz-ht-live')!.takenOn).toBeNull();
    // Back at the bench: the next entries are the tablet's own again.
    const back = await tom.put(`/api/runs/${runId}/paper-sheet`).send({ paperSheet: null });
    expect(back.body.run.paperSheet).toBeNull();
    const heater = await entry(tom, runId, 'rd-heater', { value: '6.3' });
    expect(heater.body.entry.takenOn).toBeNull();
    expect((await entriesNow()).find((e) => e.stepId === 'rd-heater')!.takenOn).toBeNull();
  });

  it('the database refuses a paper date in the future, before approval, or an entry dated otherwise', async () => {
    const revision = await benchProcedure(t, 'approved', 'TC-18 paper guard');
    const tom = await t.as('tom');
    const unit = await newUnit(tom);
    const started = await tom
      .post('/api/runs')
      .send({ revisionId: revision.id, unitId: unit.id, mainsVoltage: 230, mainsFrequency: 50 });
    const runId = started.body.run.id as string;
    const setDate = (d: string) => t.db.update(runs).set({ paperSheetDate: d }).where(eq(runs.id, runId));
    expect(await refusal(setDate(dayOffset(2)))).toMatch(/in the future/);
    const [rev] = await t.db
      .select({ decidedAt: revisions.decidedAt })
      .from(revisions)
      .where(eq(revisions.id, revision.id));
    expect(rev!.decidedAt).not.toBeNull();
    expect(await refusal(setDate(dayOffset(-2)))).toMatch(/before revision/);
    await setDate(dayOffset(0));
    // An entry dated other than the run's paper sheet.
    expect((await entry(tom, runId, 'hz-ht-live', { done: true })).status).toBe(200);
    expect(
      await refusal(
        t.db.execute(sql`update run_entries set taken_on = ${dayOffset(-1)}::date where run_id = ${runId}`),
      ),
    ).toMatch(/paper sheet is dated/);
  });
});
