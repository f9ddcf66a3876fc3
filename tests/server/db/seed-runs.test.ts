import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditLog, runEntries, runEntryHistory, runs, runSignatures, units } from '../../../server/db/schema';
import { contentSeedDir, seedDemoContent } from '../../../server/db/seed';
import { readDemoRuns, readDemoUnits, seedDemoBench } from '../../../server/db/seed-runs';
import { loadRunView } from '../../../server/modules/runs/run-view';
import { createTestApp, type TestApp } from '../../support/test-app';

// The test template is prepared by the same start-up seeding, so the demo history is already here.
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const unitBySerial = async (serial: string) =>
  (await t.db.select().from(units).where(eq(units.serial, serial)))[0]!;
const count = async (
  table:
    | typeof units
    | typeof runs
    | typeof runEntries
    | typeof runEntryHistory
    | typeof runSignatures
    | typeof auditLog,
) => Number((await t.db.select({ n: sql<number>`count(*)` }).from(table))[0]!.n);

describe('demo units and bench runs', () => {
  it('registers every demo unit', async () => {
    for (const u of readDemoUnits(contentSeedDir)) {
      const row = await unitBySerial(u.serial);
      expect(row, u.serial).toMatchObject({ model: u.model, owner: u.owner, jobNumber: u.jobNumber });
    }
  });

  it('gives the demo TC-18 six signed runs that verify, the server flags the low B+, and the trend is in date order', async () => {
    const unit = await unitBySerial('TC18-0142');
    const tom = await t.as('tom');
    const page = await tom.get(`/api/units/${unit.id}`);
    expect(page.status).toBe(200);
    const history = page.body.runs as {
      id: string;
      status: string;
      outOfTolerance: boolean;
      startedAt: string;
      startedBy: { displayName: string };
    }[];
    expect(history).toHaveLength(6);
    expect(history.every((r) => r.status === 'signed')).toBe(true);
    expect(new Set(history.map((r) => r.startedBy.displayName)).size).toBe(3);

    let outRuns = 0;
    const outReadings: string[] = [];
    for (const summary of [...history].reverse()) {
      const view = await loadRunView(t.db, t.files, summary.id);
      expect(view.signature?.verified, summary.id).toBe(true);
      expect(view.signature?.meaning).toBe('performed');
      expect(view.progress.done).toBe(view.progress.total);
      // Every reading carries the server's own verdict against its band at that visit's mains.
      for (const e of view.entries.filter((x) => x.kind === 'reading')) {
        expect(e.within, `${summary.id} ${e.stepId}`).toBe(e.measured! >= e.low! && e.measured! <= e.high!);
      }
      const out = view.entries.filter((e) => e.within === false);
      expect(view.outOfTolerance).toBe(out.length > 0);
      if (out.length) outRuns++;
      outReadings.push(...out.map((e) => `${summary.startedAt.slice(0, 7)} ${e.stepId} ${e.raw}`));
      // The API's run sheet says the same.
      const sheet = await tom.get(`/api/runs/${summary.id}`);
      expect(sheet.body.run.signature.verified).toBe(true);
    }
    expect(outRuns).toBeGreaterThanOrEqual(1);
    // The story of this unit: the reservoir ages, B+ falls below its band in October, and after a new
    // reservoir the November visit is back in band.
    expect(outReadings).toEqual(['2026-10 tc18-rd-bplus 306']);

    const trend = await tom.get(`/api/units/${unit.id}/trend?reading=tc18-rd-bplus`);
    expect(trend.status).toBe(200);
    const points = trend.body.points as {
      at: string;
      measured: number;
      within: boolean;
      mainsVoltage: number;
    }[];
    expect(points).toHaveLength(6);
    const times = points.map((p) => Date.parse(p.at));
    expect(times).toEqual([...times].sort((a, b) => a - b));
    // Visits spread over the year, not all at seeding time.
    expect(times[5]! - times[0]!).toBeGreaterThan(100 * 24 * 3600 * 1000);
    expect(points.some((p) => p.within === false)).toBe(true);
    expect(new Set(points.map((p) => p.mainsVoltage)).size).toBeGreaterThan(1);
  });

  it('gives the demo one follow-up closed by a passing re-run (then released) and one still open', async () => {
    const tom = await t.as('tom');
    const list = (await tom.get('/api/follow-ups')).body.followUps as {
      unit: { serial: string };
      closed: { run: { id: string } | null } | null;
      disposition: { value: string } | null;
      readings: { stepId: string; raw: string }[];
    }[];
    const [closed] = list.filter((f) => f.unit.serial === 'TC18-0142');
    expect(closed?.closed?.run).toBeTruthy();
    expect(closed!.readings.map((r) => `${r.stepId} ${r.raw}`)).toEqual(['tc18-rd-bplus 306']);
    const rerun = await loadRunView(t.db, t.files, closed!.closed!.run!.id);
    expect(rerun.outOfTolerance).toBe(false);
    expect(rerun.release?.matchesRun).toBe(true);
    expect(rerun.release?.signer.displayName).toBe('Marek Vos');
    const states = (await tom.get(`/api/units/${rerun.unit.id}`)).body.states as { state: string }[];
    expect(states[0]!.state).toBe('released');
    const open = list.filter((f) => f.unit.serial === 'TC18-0167');
    expect(open).toHaveLength(1);
    expect(open[0]!.closed).toBeNull();
    expect(open[0]!.disposition?.value).toBe('repair');
  });

  it('leaves one TC-30H run open with a few entries done', async () => {
    const unit = await unitBySerial('TC30H-0217');
    const open = await t.db.select().from(runs).where(eq(runs.unitId, unit.id));
    expect(open).toHaveLength(1);
    expect(open[0]!.status).toBe('in_progress');
    const view = await loadRunView(t.db, t.files, open[0]!.id);
    expect(view.signature).toBeNull();
    expect(view.progress.done).toBeGreaterThan(0);
    expect(view.progress.done).toBeLessThan(view.progress.total);
  });

  it('seeding again adds nothing and keeps what people changed', async () => {
    const tables = [units, runs, runEntries, runEntryHistory, runSignatures, auditLog] as const;
    const before = await Promise.all(tables.map(count));
    const unit = await unitBySerial('TC18-0142');
    await t.db.update(units).set({ owner: 'Changed at the front desk' }).where(eq(units.id, unit.id));

    const again = await seedDemoBench(t.db, contentSeedDir);
    expect(again.units).toEqual({ added: 0, present: readDemoUnits(contentSeedDir).length });
    expect(again.runs).toEqual({ added: 0, present: readDemoRuns(contentSeedDir).length, skipped: 0 });
    await seedDemoContent(t.db);
    expect(await Promise.all(tables.map(count))).toEqual(before);
    expect((await unitBySerial('TC18-0142')).owner).toBe('Changed at the front desk');
  });
});
