import { expect } from 'vitest';
import { fuseBlock, params } from '../../../support/documents';
import type { TestApp } from '../../../support/test-app';
import { demo } from '../../../support/test-app';

type Who = keyof typeof demo;
export type Client = Awaited<ReturnType<TestApp['as']>>;

export { fuseBlock, params };

export const reading = (tolerance: string, expected = '350 V') => ({
  type: 'reading',
  attrs: {
    id: 'reading-bplus2',
    label: 'B+2',
    testPoint: 'V2 anode',
    meterRange: '1000 V DC',
    unit: 'V',
    expected: { literal: expected },
    tolerance,
  },
});

export const paragraph = (text: string) => ({ type: 'paragraph', content: [{ type: 'text', text }] });

export const doc = (...blocks: unknown[]) => ({
  type: 'doc',
  content: [
    { type: 'heading', attrs: { level: 2 }, content: [{ type: 'text', text: 'First power-up' }] },
    ...blocks,
  ],
});

export const goodDoc = (
  htAmps = '0.1 A',
  tolerance = '±5 %',
  text = 'Bring the unit up on the current-limited supply and watch the HT.',
) => doc(paragraph(text), fuseBlock(htAmps), reading(tolerance));

let seq = 0;
/** A new procedure whose draft revision 1 holds a valid document; returns the author's client. */
export async function newDraft(t: TestApp, author: Who = 'hal', document: unknown = goodDoc()) {
  const c = await t.as(author);
  const meta = {
    title: `TC-18 first power-up ${++seq}`,
    equipmentFamily: 'Guitar amplifier',
    equipmentModel: 'TC-18',
    tags: ['first power-up'],
  };
  const created = await c.post('/api/procedures').send(meta);
  expect(created.status).toBe(201);
  const saved = await c
    .put(`/api/revisions/${created.body.revision.id}`)
    .send({ ...meta, params, lockVersion: 1, document });
  expect(saved.status).toBe(200);
  return {
    c,
    meta,
    revision: saved.body.revision as { id: string; procedureId: string; number: number; lockVersion: number },
  };
}

export async function inReview(t: TestApp, author: Who = 'hal', document?: unknown) {
  const d = await newDraft(t, author, document);
  const res = await d.c.post(`/api/revisions/${d.revision.id}/submit`).send({ changeReason: 'Test change.' });
  expect(res.status).toBe(200);
  return d;
}

export const approve = (c: Client, id: string, who: Who, comment = 'Checked against the TC-18 schematic.') =>
  c.post(`/api/revisions/${id}/approve`).send({ password: demo[who].password, comment });
