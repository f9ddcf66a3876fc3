// An open bench run whose revision is no longer the current one: superseded by a newer approved
// revision, it goes on with a warning naming what changed; withdrawn, it is on hold and every entry is
// refused with the reason. The unit page says which revision each visit followed and whether it still holds.
import { readFileSync } from 'node:fs';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import { benchProcedure, entry, newUnit, startRun } from './runs-fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

// The demo's later revision of the bleeder retrofit, approved after Priya's open run on revision 1.
const later = (
  JSON.parse(readFileSync('content-seed/revisions.json', 'utf8')) as {
    revisions: { procedure: string; number: number; changeReason: string }[];
  }
).revisions.find((r) => r.procedure === 'bleeder-retrofit')!;

interface RunSummary {
  id: string;
  revisionNumber: number;
  revisionState: string;
}

async function openRunOf(who: 'priya' | 'sam', serial: string) {
  const c = await t.as(who);
  const list = (await c.get('/api/runs?status=in_progress&mine=1')).body.runs as {
    id: string;
    unit: { id: string; serial: string };
  }[];
  const found = list.find((r) => r.unit.serial === serial)!;
  expect(found, `${who}'s open run on ${serial}`).toBeDefined();
  const run = (await c.get(`/api/runs/${found.id}`)).body.run;
  const visits = (await c.get(`/api/units/${found.unit.id}`)).body.runs as RunSummary[];
  return { c, run, visit: visits.find((v) => v.id === found.id)! };
}

describe('open runs on a revision that is no longer current', () => {
  it('a run on a superseded revision shows the newer revision and its change reason, and may go on', async () => {
    const { c, run, visit } = await openRunOf('priya', 'TC30H-0088');
    expect(run.revision).toMatchObject({ number: later.number - 1, state: 'superseded' });
    expect(run.hold).toBeNull();
    expect(run.superseded).toMatchObject({
      number: later.number,
      changes: [{ number: later.number, changeReason: later.changeReason }],
    });
    // The newer revision named is the procedure's approved one.
    const [current] = (
      await t.db.execute<{ id: string }>(
        sql`select r.id from revisions r join runs x on x.procedure_id = r.procedure_id
             where x.id = ${run.id} and r.state = 'approved'`,
      )
    ).rows;
    expect(run.superseded.revisionId).toBe(current!.id);
    // The run goes on: the next step after the demo's last entry is accepted.
    const next = await entry(c, run.id, 'bleed-ck-mount', { done: true });
    expect(next.status).toBe(200);
    expect(visit).toMatchObject({ revisionNumber: later.number - 1, revisionState: 'superseded' });
  });

  it('a run on the current revision carries no warning, and its visit reads as current', async () => {
    const { run, visit } = await openRunOf('sam', 'TC30H-0217');
    expect(run.superseded).toBeNull();
    expect(run.hold).toBeNull();
    expect(visit.revisionState).toBe('approved');
  });

  it('a run on a withdrawn revision is on hold: an entry is refused with 409 and the reason in words', async () => {
    const tom = await t.as('tom');
    const revision = await benchProcedure(t, 'approved', 'TC-18 HT winding check, to be withdrawn');
    const unit = await newUnit(tom);
    const started = await startRun(tom, revision.id, unit.id);
    expect(started.status).toBe(201);
    const runId = started.body.run.id as string;
    expect((await entry(tom, runId, 'hz-ht-live', { done: true })).status).toBe(200);

    const reason = 'HT winding values were for the wrong transformer.';
    const marek = await t.as('marek');
    const withdrawn = await marek
      .post(`/api/procedures/${revision.procedureId}/withdraw`)
      .send({ password: demo.marek.password, reason });
    expect(withdrawn.status).toBe(200);

    const refused = await entry(tom, runId, 'rd-ht-ac', { value: '251 V' });
    expect(refused.status).toBe(409);
    expect(refused.body.code).toBe('on-hold');
    expect(refused.body.error).toContain(reason);
    expect(refused.body.error).toMatch(/on hold/);

    const view = (await tom.get(`/api/runs/${runId}`)).body.run;
    expect(view.hold).toMatchObject({ reason, revisionNumber: 1 });
    expect(view.superseded).toBeNull();
    const visits = (await tom.get(`/api/units/${unit.id}`)).body.runs as RunSummary[];
    expect(visits.find((v) => v.id === runId)).toMatchObject({
      revisionNumber: 1,
      revisionState: 'withdrawn',
    });
  });
});
