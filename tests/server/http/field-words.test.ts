/**
 * Every 400 names the field as its form labels it, in sentences a person reads: the message and
 * each field's reason and label. The machine path stays in `field` for clients. zod's own English
 * ("Invalid input: expected string, received undefined") never comes back.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { params } from '../../support/documents';
import { createTestApp, type TestApp } from '../../support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const DEVELOPER_WORDS =
  /body\.|params\.|query\.|Invalid input|expected \w+, received|Invalid UUID|Too small|Too big/;

const meta = {
  title: 'TC-18 mains fuse check',
  equipmentFamily: 'Guitar amplifier',
  equipmentModel: 'TC-18',
  tags: [],
};

describe('refusals name fields by their labels', () => {
  it('a procedure without a title or model: "Title is required", "Model is required"', async () => {
    const hal = await t.as('hal');
    const res = await hal.post('/api/procedures').send({ equipmentFamily: 'Guitar amplifier', tags: [] });
    expect(res.status).toBe(400);
    expect(res.body.fields).toEqual(
      expect.arrayContaining([
        { field: 'body.title', label: 'Title', reason: 'Title is required' },
        { field: 'body.equipmentModel', label: 'Model', reason: 'Model is required' },
      ]),
    );
    expect(res.body.error).toContain('Title is required.');
    expect(res.body.error).toContain('Model is required.');
    expect(res.body.error).not.toMatch(DEVELOPER_WORDS);
  });

  it('a title too short and too many characters, by label with the limit', async () => {
    const hal = await t.as('hal');
    const res = await hal
      .post('/api/procedures')
      .send({ ...meta, title: 'TC', equipmentModel: 'M'.repeat(81) });
    expect(res.status).toBe(400);
    expect(res.body.error).toBe('Title must be at least 3 characters. Model must be at most 80 characters.');
  });

  it('a bad revision id in the address: "The revision address is not valid"', async () => {
    const hal = await t.as('hal');
    const res = await hal.get('/api/revisions/not-a-revision');
    expect(res.status).toBe(400);
    expect(res.body.fields).toEqual([
      { field: 'params.id', label: 'Revision address', reason: 'The revision address is not valid' },
    ]);
    expect(res.body.error).toBe('The revision address is not valid.');
  });

  it('a unit without model or serial, and a filter outside its options, in words', async () => {
    const tom = await t.as('tom');
    const res = await tom.post('/api/units').send({ owner: 'A. Customer' });
    expect(res.status).toBe(400);
    expect(res.body.error).toBe('Model is required. Serial is required.');
    const list = await tom.get('/api/procedures?state=lost&limit=0');
    expect(list.status).toBe(400);
    expect(list.body.error).toMatch(
      /^State must be one of “draft”, “in review”, .* or “withdrawn”\. Limit must be at least 1\.$/,
    );
    expect(list.body.error).not.toMatch(DEVELOPER_WORDS);
  });

  it('a wrong type is said as what is wanted', async () => {
    const hal = await t.as('hal');
    const res = await hal.post('/api/procedures').send({ ...meta, title: 42 });
    expect(res.status).toBe(400);
    expect(res.body.fields[0]).toMatchObject({ field: 'body.title', reason: 'Title must be text' });
  });

  it('a mains-fuse block with a winding voltage missing: "Winding 1 voltage is required" in the procedure check', async () => {
    const hal = await t.as('hal');
    const created = await hal.post('/api/procedures').send(meta);
    expect(created.status).toBe(201);
    const document = {
      type: 'doc',
      content: [
        { type: 'heading', attrs: { level: 2 }, content: [{ type: 'text', text: 'Mains fuse' }] },
        {
          type: 'reckoner',
          attrs: {
            id: 'fuse-block-1',
            name: 'mainsFuse',
            kind: 'mains-fuse',
            inputs: { windings: [{ label: 'HT', amps: '0.1 A' }], mainsVoltage: { param: 'mainsVoltage' } },
          },
        },
      ],
    };
    const saved = await hal
      .put(`/api/revisions/${created.body.revision.id}`)
      .send({ ...meta, params, lockVersion: 1, document });
    expect(saved.status).toBe(200);
    const messages: string[] = saved.body.revision.lint.map((w: { message: string }) => w.message);
    expect(messages).toContain('The Mains fuse block in “Mains fuse”: Winding 1 voltage is required.');
    for (const m of messages) expect(m).not.toMatch(/mainsFuse|windings\.0|Reckoner "/);
    // Submitting is refused with the same words.
    const submit = await hal
      .post(`/api/revisions/${created.body.revision.id}/submit`)
      .send({ changeReason: 'First issue' });
    expect(submit.status).toBe(409);
    expect(submit.body.error).toContain('Winding 1 voltage is required');
    expect(submit.body.error).not.toMatch(/mainsFuse|windings\.0/);
  });
});
