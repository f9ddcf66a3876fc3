/**
 * Four eyes follows provenance: the authors and editors of every revision a draft was started from
 * count as its authors, so nobody approves their own words by way of a returned revision.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, demo, type TestApp } from '../support/test-app';
import { approve, inReview } from './review-support';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('four eyes across a returned revision', () => {
  it('Dee writes r1, it is returned, Hal starts r2 from it unchanged: Dee may not approve r2, Marek may', async () => {
    const { c: dee, revision: r1 } = await inReview(t, 'dee');
    const marek = await t.as('marek');
    const returned = await marek.post(`/api/revisions/${r1.id}/return`).send({ password: demo.marek.password, comment: 'Say which meter range to use.' });
    expect(returned.status).toBe(200);

    const hal = await t.as('hal');
    const started = await hal.post(`/api/procedures/${r1.procedureId}/drafts`).send({});
    expect(started.status).toBe(201);
    const r2 = started.body.revision as { id: string; number: number };
    expect((await hal.post(`/api/revisions/${r2.id}/submit`).send({})).status).toBe(200);

    // Dee's own words, unchanged: she is one of r2's authors by provenance.
    const byDee = await approve(dee, r2.id, 'dee');
    expect(byDee.status).toBe(403);
    expect(byDee.body.error).toMatch(/started from a revision you wrote or edited/);
    // The queue marks it as her own work, and the review page does not offer her the decision.
    const queue = await dee.get('/api/review/queue');
    const item = (queue.body.items as { revisionId: string; ownWork: boolean }[]).find((i) => i.revisionId === r2.id);
    expect(item?.ownWork).toBe(true);

    expect((await approve(marek, r2.id, 'marek')).status).toBe(200);
  });
});
