/**
 * Input no handler should see: NUL and other control characters, text-direction overrides, line
 * breaks in one-line names, documents nested without end, dates PostgreSQL cannot hold. Each is a
 * 400 naming the field — never a 500 — and nothing is stored, not even an anonymous session.
 */
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const sessions = async () =>
  Number((await t.ownerDb.execute(sql`select count(*)::int as n from session`)).rows[0]!.n);

describe('control characters', () => {
  it('a NUL in the public sign-in e-mail is a 400 naming the field', async () => {
    const c = t.client();
    await c.refreshToken();
    const res = await c
      .post('/api/auth/sign-in')
      .send({ email: 'a\u0000@x.example', password: 'whatever-long-enough' });
    expect(res.status).toBe(400);
    expect(res.body.fields[0]).toMatchObject({
      field: 'body.email',
      reason: expect.stringContaining('U+0000'),
    });
  });

  it.each([
    ['a NUL', 'TC-18 \u0000 check', 'U+0000'],
    ['a bell', 'TC-18 \u0007 check', 'U+0007'],
    ['a right-to-left override', 'TC-18 \u202Ekcehc', 'U+202E'],
    ['a line break', 'TC-18\nfirst power-up', 'one line'],
  ])('%s in a procedure title is a 400 naming body.title', async (_what, title, reason) => {
    const hal = await t.as('hal');
    const res = await hal
      .post('/api/procedures')
      .send({ title, equipmentFamily: 'Guitar amplifier', equipmentModel: 'TC-18', tags: [] });
    expect(res.status).toBe(400);
    expect(res.body.fields[0]).toMatchObject({
      field: 'body.title',
      reason: expect.stringContaining(reason),
    });
  });

  it('a NUL in a query string or a path parameter is a 400, not a 500', async () => {
    const tom = await t.as('tom');
    const q = await tom.get('/api/search').query({ q: 'hum\u0000' });
    expect(q.status).toBe(400);
    const p = await tom.get('/api/revisions/%00');
    expect(p.status).toBe(400);
  });

  it('unit notes may span lines; a unit serial may not', async () => {
    const tom = await t.as('tom');
    const ok = await tom.post('/api/units').send({
      model: 'TC-18',
      serial: 'TC18-LINES',
      notes: 'Arrived with a cracked cabinet.\nCustomer wants the old caps back.',
    });
    expect(ok.status).toBe(201);
    const bad = await tom.post('/api/units').send({ model: 'TC-18', serial: 'TC18\nX' });
    expect(bad.status).toBe(400);
    expect(bad.body.fields[0].field).toBe('body.serial');
  });
});

describe('size and depth', () => {
  it('a document nested thousands deep is a 400, not a stack overflow', async () => {
    const hal = await t.as('hal');
    const created = await hal
      .post('/api/procedures')
      .send({ title: 'Deep', equipmentFamily: 'Guitar amplifier', equipmentModel: 'TC-18', tags: [] });
    let node: Record<string, unknown> = { type: 'paragraph' };
    for (let i = 0; i < 3000; i++) node = { type: 'blockquote', content: [node] };
    const res = await hal.put(`/api/revisions/${created.body.revision.id}`).send({
      title: 'Deep',
      equipmentFamily: 'Guitar amplifier',
      equipmentModel: 'TC-18',
      tags: [],
      params: { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 },
      lockVersion: 1,
      document: { type: 'doc', content: [node] },
    });
    // Refused before any validator recurses into it (too deep to parse, or beyond the depth limit).
    expect(res.status).toBe(400);
    expect(res.body.error).toMatch(/nested|not valid JSON/);
  });

  it('a document 30 levels deep (within JSON limits) is refused by the document check', async () => {
    const hal = await t.as('hal');
    const created = await hal
      .post('/api/procedures')
      .send({ title: 'Deepish', equipmentFamily: 'Guitar amplifier', equipmentModel: 'TC-18', tags: [] });
    let node: Record<string, unknown> = { type: 'paragraph' };
    for (let i = 0; i < 28; i++) node = { type: 'blockquote', content: [node] };
    const res = await hal.put(`/api/revisions/${created.body.revision.id}`).send({
      title: 'Deepish',
      equipmentFamily: 'Guitar amplifier',
      equipmentModel: 'TC-18',
      tags: [],
      params: { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 },
      lockVersion: 1,
      document: { type: 'doc', content: [node] },
    });
    expect(res.status).toBe(400);
  });
});

describe('dates', () => {
  it.each(['0000-01-01', '-000001-01-01', '275760-09-14'])('GET /api/audit?to=%s is a 400', async (to) => {
    const admin = await t.as('admin');
    const res = await admin.get('/api/audit').query({ to });
    expect(res.status).toBe(400);
    expect(res.body.fields[0].field).toBe('query.to');
  });
});

describe('anonymous requests', () => {
  it('a bad anonymous request stores no session row', async () => {
    const before = await sessions();
    for (let i = 0; i < 5; i++)
      await t.client().post('/api/auth/sign-in').send({ email: '\u0000', password: 'x' });
    expect(await sessions()).toBe(before);
  });
});
