/**
 * An idempotency key stands for one request: sent again with the same body it is answered from
 * what was stored; sent with another body it is refused with 422 and nothing changes.
 */
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runEntries } from '../../../../server/db/schema';
import { createTestApp, type TestApp } from '../../../support/test-app';
import { benchProcedure, newUnit } from './runs-fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('idempotency keys are bound to the request', () => {
  it('an entry resent with its key is stored once; the same key with another value is 422 and the first value stays', async () => {
    const tom = await t.as('tom');
    const revision = await benchProcedure(t);
    const unit = await newUnit(tom);
    const run = (
      await tom
        .post('/api/runs')
        .send({ revisionId: revision.id, unitId: unit.id, mainsVoltage: 230, mainsFrequency: 50 })
    ).body.run;
    await tom.put(`/api/runs/${run.id}/entries/hz-ht-live`).send({ key: randomUUID(), done: true });

    const key = randomUUID();
    const first = await tom.put(`/api/runs/${run.id}/entries/rd-ht-ac`).send({ key, value: '251 V' });
    expect(first.status).toBe(200);
    const again = await tom.put(`/api/runs/${run.id}/entries/rd-ht-ac`).send({ key, value: '251 V' });
    expect(again.status).toBe(200);
    const other = await tom
      .put(`/api/runs/${run.id}/entries/rd-ht-ac`)
      .send({ key, value: '262 V', reason: 'misread' });
    expect(other.status).toBe(422);
    expect(other.body.fields[0]).toMatchObject({ field: 'body.key' });
    const [stored] = await t.db
      .select()
      .from(runEntries)
      .where(eq(runEntries.runId, run.id))
      .then((rows) => rows.filter((r) => r.stepId === 'rd-ht-ac'));
    expect(stored!.measured).toBe(251);
    expect(stored!.version).toBe(1);
  });

  it('a start key reused for another mains figure is 422, and no second run is made', async () => {
    const tom = await t.as('tom');
    const revision = await benchProcedure(t);
    const unit = await newUnit(tom);
    const key = randomUUID();
    const body = { revisionId: revision.id, unitId: unit.id, mainsVoltage: 230, mainsFrequency: 50, key };
    const first = await tom.post('/api/runs').send(body);
    expect(first.status).toBe(201);
    expect((await tom.post('/api/runs').send(body)).body.run.id).toBe(first.body.run.id);
    const other = await tom.post('/api/runs').send({ ...body, mainsVoltage: 240 });
    expect(other.status).toBe(422);
  });

  it('the key may come as the Idempotency-Key header: a resend is answered from what was stored, never stored twice', async () => {
    const tom = await t.as('tom');
    const revision = await benchProcedure(t);
    const unit = await newUnit(tom);
    const key = randomUUID();
    const start = { revisionId: revision.id, unitId: unit.id, mainsVoltage: 230, mainsFrequency: 50 };
    const first = await tom.post('/api/runs').set('idempotency-key', key).send(start);
    expect(first.status).toBe(201);
    const again = await tom.post('/api/runs').set('idempotency-key', key).send(start);
    expect([again.status, again.body.run.id]).toEqual([200, first.body.run.id]);
    const run = first.body.run;
    await tom
      .put(`/api/runs/${run.id}/entries/hz-ht-live`)
      .set('idempotency-key', randomUUID())
      .send({ done: true });

    const entryKey = randomUUID();
    const put = () =>
      tom
        .put(`/api/runs/${run.id}/entries/rd-ht-ac`)
        .set('idempotency-key', entryKey)
        .send({ value: '251 V' });
    expect((await put()).body.replayed).toBe(false);
    expect((await put()).body.replayed).toBe(true);
    const rows = (await t.db.select().from(runEntries).where(eq(runEntries.runId, run.id))).filter(
      (r) => r.stepId === 'rd-ht-ac',
    );
    expect(rows.map((r) => [r.measured, r.version])).toEqual([[251, 1]]);
    // A header and a body key that differ are refused, naming the header.
    const both = await tom
      .put(`/api/runs/${run.id}/entries/rd-ht-ac`)
      .set('idempotency-key', randomUUID())
      .send({ key: randomUUID(), value: '252 V', reason: 'misread' });
    expect(both.status).toBe(400);
    expect(both.body.fields[0]).toMatchObject({ field: 'headers.idempotency-key' });
  });
});
