import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../../support/test-app';
import { benchProcedure, entry, newUnit, startRun, tinyPng } from '../runs/runs-fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('the unit register', () => {
  it('technicians, authors, reviewers and admins register units; bad input gets 400 naming the field', async () => {
    for (const who of ['tom', 'hal', 'marek', 'admin'] as const) {
      const c = await t.as(who);
      const res = await c
        .post('/api/units')
        .send({ model: 'TC-30H', serial: `H-${who}-001`, owner: 'Tallow Creek demo', notes: 'Hum at idle' });
      expect(res.status, who).toBe(201);
      expect(res.body.unit).toMatchObject({
        model: 'TC-30H',
        serial: `H-${who}-001`,
        jobNumber: '',
        lockVersion: 1,
      });
    }
    const tom = await t.as('tom');
    const bad = await tom.post('/api/units').send({ model: '', serial: 'x'.repeat(81), status: 'done' });
    expect(bad.status).toBe(400);
    expect(bad.body.fields.map((f: { field: string }) => f.field).sort()).toEqual([
      'body',
      'body.model',
      'body.serial',
    ]);
    const dup = await tom.post('/api/units').send({ model: 'tc-30h', serial: 'h-TOM-001' });
    expect(dup.status).toBe(409);
    expect((await t.client().get('/api/units')).status).toBe(401);
  });

  it('searches and filters, and edits with an optimistic lock', async () => {
    const tom = await t.as('tom');
    const a = await newUnit(tom, 'R5-7781', { model: 'TC-5R', owner: 'Odile Pardoe', jobNumber: 'J-3310' });
    await newUnit(tom, 'R5-7782', { model: 'TC-5R', owner: 'Basil Marrow' });
    const search = await tom.get('/api/units?q=pardoe');
    expect(search.body.units.map((u: { serial: string }) => u.serial)).toEqual(['R5-7781']);
    const byJob = await tom.get('/api/units?q=J-3310');
    expect(byJob.body.units).toHaveLength(1);
    const byModel = await tom.get('/api/units?model=TC-5R');
    // The demo content has a TC-5R of its own, which has been run.
    expect(byModel.body.units.every((u: { model: string }) => u.model === 'TC-5R')).toBe(true);
    expect(byModel.body.units.map((u: { serial: string }) => u.serial)).toEqual(
      expect.arrayContaining(['R5-7781', 'R5-7782']),
    );
    expect(byModel.body.models).toContain('TC-5R');
    const never = await tom.get('/api/units?model=TC-5R&state=never-run');
    expect(never.body.units).toHaveLength(2);
    const like = await tom.get('/api/units?q=%25');
    expect(like.body.units).toHaveLength(0);

    const edit = await tom.put(`/api/units/${a.id}`).send({
      model: 'TC-5R',
      serial: 'R5-7781',
      owner: 'Odile Pardoe',
      jobNumber: 'J-3311',
      notes: 'Dial lamp out',
      lockVersion: 1,
    });
    expect(edit.status).toBe(200);
    expect(edit.body.unit).toMatchObject({ jobNumber: 'J-3311', lockVersion: 2 });
    const stale = await (
      await t.as('priya')
    )
      .put(`/api/units/${a.id}`)
      .send({ model: 'TC-5R', serial: 'R5-7781', lockVersion: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.current.jobNumber).toBe('J-3311');
    const photo = await tom
      .post(`/api/units/${a.id}/photos`)
      .field('caption', 'Chassis, top')
      .attach('file', tinyPng(), { filename: 'top.png' });
    expect(photo.status).toBe(201);
    const page = await tom.get(`/api/units/${a.id}`);
    expect(page.body.photos).toMatchObject([{ caption: 'Chassis, top' }]);
  });

  it('shows every run of a unit and a trend of one reading across runs, with its band', async () => {
    const tom = await t.as('tom');
    const revision = await benchProcedure(t);
    const unit = await newUnit(tom, 'TC18-TREND');
    const visits = [
      { mains: 230, ht: '249 V' },
      { mains: 240, ht: '262 V' },
      { mains: 228, ht: '275 V' },
    ];
    for (const v of visits) {
      const run = (await startRun(tom, revision.id, unit.id, v.mains)).body.run;
      await entry(tom, run.id, 'hz-ht-live', { done: true });
      await entry(tom, run.id, 'rd-ht-ac', { value: v.ht });
    }
    const history = await tom.get(`/api/units/${unit.id}`);
    expect(history.body.runs).toHaveLength(3);
    expect(history.body.runs.every((r: { status: string }) => r.status === 'in_progress')).toBe(true);
    expect(history.body.runs.filter((r: { outOfTolerance: boolean }) => r.outOfTolerance)).toHaveLength(1);

    const pick = await tom.get(`/api/units/${unit.id}/trend`);
    expect(pick.body.readings).toEqual([
      { id: 'rd-ht-ac', label: 'HT winding, each half', unit: 'V', measure: 'rms', count: 3 },
    ]);
    const trend = await tom.get(`/api/units/${unit.id}/trend?reading=rd-ht-ac`);
    expect(trend.body.points.map((p: { measured: number }) => p.measured)).toEqual([249, 262, 275]);
    expect(trend.body.points.map((p: { within: boolean }) => p.within)).toEqual([true, true, false]);
    // Each visit's band is at that visit's mains.
    expect(trend.body.points[1].expected).toBeCloseTo((250 * 240) / 230, 9);
    expect(trend.body.points[2].high).toBeCloseTo(((250 * 228) / 230) * 1.05, 6);
    expect((await tom.get(`/api/units?state=out&q=TC18-TREND`)).body.units).toHaveLength(1);
    expect((await tom.get(`/api/units?state=open-run&q=TC18-TREND`)).body.units).toHaveLength(1);
  });
});
