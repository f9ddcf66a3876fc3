import { readFileSync } from 'node:fs';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { HomeSection, HomeView } from '../../../../shared/schemas/home';
import { procedureInState, textDoc } from '../../../support/review-path';
import { benchDoc, entry, newUnit, personId } from '../runs/runs-fixtures';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';

// The demo content, read from its own files: what each person should find waiting.
const seedRuns = (
  JSON.parse(readFileSync('content-seed/runs.json', 'utf8')) as {
    runs: {
      procedure: string;
      technician: string;
      signedAt?: string;
      witness?: string;
      unit: { serial: string };
    }[];
  }
).runs;
const laterRevisions = (
  JSON.parse(readFileSync('content-seed/revisions.json', 'utf8')) as { revisions: { procedure: string }[] }
).revisions;
const seedInstruments = (
  JSON.parse(readFileSync('content-seed/registers.json', 'utf8')) as {
    instruments: { identifier: string; dueInMonths: number }[];
  }
).instruments;

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

async function homeOf(who: keyof typeof demo) {
  const c = await t.as(who);
  const res = await c.get('/api/home');
  expect(res.status).toBe(200);
  const view = res.body as HomeView;
  return Object.fromEntries(view.sections.map((s) => [s.key, s])) as Partial<
    Record<HomeSection['key'], HomeSection>
  >;
}

const openRunsOf = (who: string) =>
  seedRuns.filter((r) => r.technician === `${who}@tallowcreek.example` && !r.signedAt);

const newDoc = (title: string) => ({
  title,
  equipmentFamily: 'Table radio',
  equipmentModel: 'TC-5R',
  tags: [],
  document: textDoc('Check the dial lamp and the rectifier.'),
});

describe('home page: what waits for me', () => {
  it('a technician sees their own open runs and the acknowledgements they owe, nothing of another’s', async () => {
    for (const who of ['tom', 'priya', 'sam'] as const) {
      const home = await homeOf(who);
      // Technicians see no review queue, drafts or reviews due.
      expect(Object.keys(home).sort()).toEqual([
        'acknowledgements',
        'followUps',
        'instruments',
        'runs',
        'witness',
      ]);
      const open = openRunsOf(who);
      expect(home.runs!.count, who).toBe(open.length);
      expect(home.runs!.items.map((i) => i.label.split(' ').at(-1)).sort()).toEqual(
        open.map((r) => r.unit.serial).sort(),
      );
      // Owed: a later approved revision of a procedure they ran before, and no run on it yet.
      const owed = laterRevisions.filter((rev) =>
        seedRuns.some((r) => r.procedure === rev.procedure && r.technician === `${who}@tallowcreek.example`),
      );
      expect(home.acknowledgements!.count, who).toBe(owed.length);
      for (const item of home.acknowledgements!.items)
        expect(item.href).toMatch(/^\/revisions\/.+\/acknowledge$/);
      // The demo's witnessed run is signed: nothing left to co-sign.
      expect(home.witness!.count).toBe(0);
    }
    // The demo has open runs for Priya and Sam, and Priya owes the bleeder retrofit's revision 2.
    expect(openRunsOf('priya').length + openRunsOf('sam').length).toBeGreaterThan(1);
    expect((await homeOf('priya')).acknowledgements!.count).toBe(1);
    expect((await homeOf('tom')).runs!.count).toBe(0);
  });

  it('lists instruments overdue or due within 30 days, for technicians, reviewers and admins', async () => {
    const home = await homeOf('tom');
    const listed = home.instruments!.items.map((i) => i.label);
    const [{ today }] = (await t.db.execute<{ today: string }>(sql`select current_date::text as today`))
      .rows as [{ today: string }];
    const dayMs = 86_400_000;
    const regRes = await (await t.as('tom')).get('/api/instruments');
    const register = regRes.body.instruments as { identifier: string; calibrationDue: string }[];
    const expected = register
      .filter((i) => (Date.parse(i.calibrationDue) - Date.parse(today)) / dayMs <= 30)
      .map((i) => i.identifier)
      .sort();
    expect(listed.sort()).toEqual(expected);
    // The demo always has one instrument past its date; none due two months or more ahead is listed.
    const overdue = seedInstruments.filter((i) => i.dueInMonths < 0).map((i) => i.identifier);
    expect(overdue.length).toBeGreaterThan(0);
    for (const id of overdue) expect(home.instruments!.items.find((i) => i.label === id)?.urgent).toBe(true);
    for (const i of seedInstruments.filter((x) => x.dueInMonths >= 2))
      expect(listed).not.toContain(i.identifier);
    expect((await homeOf('marek')).instruments!.count).toBe(expected.length);
    expect((await homeOf('admin')).instruments!.count).toBe(expected.length);
    expect((await homeOf('hal')).instruments).toBeUndefined();
  });

  it('authors see their own drafts and returned revisions; reviewers the queue without their own work', async () => {
    const halDraft = await procedureInState(t.db, 'draft', newDoc('TC-5R dial lamp, Hal’s draft'));
    const halReturned = await procedureInState(t.db, 'returned', newDoc('TC-5R dial lamp, returned'));
    const ruthInReview = await procedureInState(t.db, 'in_review', newDoc('TC-5R dial lamp, Ruth’s'), {
      author: 'ruth',
    });
    const deeInReview = await procedureInState(t.db, 'in_review', newDoc('TC-5R dial lamp, Dee’s'), {
      author: 'dee',
    });

    const hal = await homeOf('hal');
    expect(Object.keys(hal)).toEqual(['drafts']);
    expect(hal.drafts!.count).toBe(2);
    const byId = new Map(hal.drafts!.items.map((i) => [i.id, i]));
    expect(byId.get(halDraft.revision.id)?.href).toBe(`/revisions/${halDraft.revision.id}/edit`);
    expect(byId.get(halReturned.revision.id)).toMatchObject({
      urgent: true,
      href: `/revisions/${halReturned.revision.id}`,
    });

    const ruth = await homeOf('ruth');
    expect(ruth.drafts!.count).toBe(0);
    expect(ruth.reviews).toBeUndefined();

    const marek = await homeOf('marek');
    expect(marek.reviews!.items.map((i) => i.id).sort()).toEqual(
      [ruthInReview.revision.id, deeInReview.revision.id].sort(),
    );
    expect(marek.drafts).toBeUndefined();
    // Dee reviews and writes: her own revision is not waiting for her review.
    const dee = await homeOf('dee');
    expect(dee.reviews!.items.map((i) => i.id)).toEqual([ruthInReview.revision.id]);
    expect(dee.reviews!.count).toBe(1);
    expect(dee.drafts!.count).toBe(0);
  });

  it('reviewers see procedures due for periodic review', async () => {
    const before = (await homeOf('marek')).reviewDue!.count;
    const { revision } = await procedureInState(
      t.db,
      'approved',
      newDoc('TC-5R dial lamp, approved long ago'),
    );
    await t.ownerDb.execute(
      sql`update revisions set decided_at = now() - interval '25 months' where id = ${revision.id}`,
    );
    const after = (await homeOf('marek')).reviewDue!;
    expect(after.count).toBe(before + 1);
    expect(after.items.find((i) => i.id === revision.id)).toMatchObject({ urgent: true });
    expect((await homeOf('tom')).reviewDue).toBeUndefined();
  });

  it('a witness sees the trainee’s open run until their co-signature covers it as it stands; nobody else does', async () => {
    // Sam is not qualified for table radios: his run names Tom as witness.
    const { revision } = await procedureInState(t.db, 'approved', {
      ...newDoc('TC-5R HT check, witnessed'),
      params: { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 },
      document: structuredClone(benchDoc),
    });
    const sam = await t.as('sam');
    const unit = await newUnit(sam, 'TC5R-W1');
    const started = await sam.post('/api/runs').send({
      revisionId: revision.id,
      unitId: unit.id,
      mainsVoltage: 230,
      mainsFrequency: 50,
      witnessId: await personId(t, 'tom'),
    });
    expect(started.status).toBe(201);
    const runId = started.body.run.id as string;
    const tomHome = await homeOf('tom');
    expect(tomHome.witness!.items.map((i) => i.id)).toEqual([runId]);
    expect(tomHome.runs!.items.map((i) => i.id)).not.toContain(runId);
    expect((await homeOf('priya')).witness!.count).toBe(0);
    const samHome = await homeOf('sam');
    expect(samHome.witness!.count).toBe(0);
    expect(samHome.runs!.items.map((i) => i.id)).toContain(runId);

    // Finished and co-signed: nothing left for Tom; a changed entry brings it back.
    for (const [id, body] of [
      ['hz-ht-live', { done: true }],
      ['rd-ht-ac', { value: '251 V' }],
      ['rd-heater', { value: '6.3 V' }],
      ['ck-discharge', { done: true }],
    ] as const)
      expect((await entry(sam, runId, id, body)).status, id).toBe(200);
    const tom = await t.as('tom');
    expect((await tom.post(`/api/runs/${runId}/witness`).send({ password: demo.tom.password })).status).toBe(
      200,
    );
    expect((await homeOf('tom')).witness!.count).toBe(0);
    expect((await entry(sam, runId, 'rd-heater', { value: '6.4 V', reason: 'Meter settled' })).status).toBe(
      200,
    );
    expect((await homeOf('tom')).witness!.items.map((i) => i.id)).toEqual([runId]);
  });

  it('is for signed-in people only', async () => {
    expect((await t.client().get('/api/home')).status).toBe(401);
  });
});
