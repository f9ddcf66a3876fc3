import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { procedures, revisions } from '../../../server/db/schema';
import { approveRevision } from '../../support/review-path';
import { createTestApp, type TestApp } from '../../support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { search: true });
});
afterAll(() => t.close());

const params = { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 };
const meta = {
  title: 'TC-18 reservoir swap and hum check',
  equipmentFamily: 'Guitar amplifier',
  equipmentModel: 'TC-18',
  tags: ['recap'],
};
const para = (text: string) => ({ type: 'paragraph', content: [{ type: 'text', text }] });

/** Creates a draft with the given lines, returning its ids. */
async function draftWith(lines: string[]) {
  const hal = await t.as('hal');
  const created = await hal.post('/api/procedures').send(meta);
  const rev = created.body.revision;
  const saved = await hal
    .put(`/api/revisions/${rev.id}`)
    .send({ ...meta, params, lockVersion: 1, document: { type: 'doc', content: lines.map(para) } });
  expect(saved.status).toBe(200);
  return { procedureId: rev.procedureId as string, revisionId: rev.id as string };
}

/**
 * Submits and approves without passwords, by the same steps as the API (the signed review flow is
 * tested in the review tests); the state-change trigger notifies search at commit.
 */
async function approve(revisionId: string) {
  const procedureId = (await t.db.select().from(revisions).where(eq(revisions.id, revisionId)))[0]!
    .procedureId;
  const refreshed = t.search!.nextRefreshOf(procedureId);
  await approveRevision(t.db, revisionId);
  expect(await refreshed).toBe(true);
  // The draft's own notification (at its INSERT) may be the one that arrived: wait for the approval's.
  for (let i = 0; i < 10 && !t.search!.index.has(procedureId); i++)
    await t.search!.nextRefreshOf(procedureId, 500);
  expect(t.search!.index.has(procedureId)).toBe(true);
}

let tomClient: Awaited<ReturnType<TestApp['as']>> | undefined;
async function search(q: string, extra = '') {
  const tom = (tomClient ??= await t.as('tom'));
  const res = await tom.get(`/api/search?q=${encodeURIComponent(q)}${extra}`);
  expect(res.status).toBe(200);
  return res.body as {
    total: number;
    results: { procedureId: string; title: string; snippet: { text: string; hit: boolean }[] }[];
    partial: { label: string; total: number; results: { procedureId: string; missing: string[] }[] } | null;
    correctedQuery: string | null;
    suggestions: string[];
    facets: { families: string[] };
  };
}

describe('search over approved procedures', () => {
  it('finds the seeded demo procedures and needs a session', async () => {
    expect((await t.client().get('/api/search?q=fuse')).status).toBe(401);
    const res = await search('TC-30H bleeder');
    expect(res.results[0]!.title).toMatch(/bleeder/i);
  });

  it('a draft’s unique word is not found; after approval it is; after supersede the old wording is gone', async () => {
    const { procedureId, revisionId } = await draftWith(['Listen for the zorbulating hum near the choke.']);
    expect((await search('zorbulating')).total).toBe(0);
    await approve(revisionId);
    const found = await search('zorbulating');
    expect(found.results.map((r) => r.procedureId)).toEqual([procedureId]);
    expect(found.results[0]!.snippet.some((s) => s.hit && /zorbulating/i.test(s.text))).toBe(true);

    // Revision 2 with new wording is approved; revision 1 is superseded.
    const hal = await t.as('hal');
    const draft = await hal.post(`/api/procedures/${procedureId}/drafts`);
    expect(draft.status).toBe(201);
    const rev2 = draft.body.revision;
    await hal.put(`/api/revisions/${rev2.id}`).send({
      ...meta,
      params,
      lockVersion: rev2.lockVersion,
      document: { type: 'doc', content: [para('Listen for the quibbling buzz near the choke.')] },
    });
    const refreshed = t.search!.nextRefreshOf(procedureId);
    await approveRevision(t.db, rev2.id); // supersedes revision 1 in the same transaction
    await refreshed;
    await new Promise((r) => setTimeout(r, 200)); // the second notification of the same commit
    expect((await search('zorbulating')).total).toBe(0);
    expect((await search('quibbling')).results[0]!.procedureId).toBe(procedureId);
  });

  it('each pair of trade words finds the same procedure', async () => {
    const { procedureId, revisionId } = await draftWith([
      'Check the plate supply at the reservoir after the xfmr has warmed.',
      'The filament winding gives 6.3V; the slow-blow fuse is 1.25 A.',
      'Replace the 47uF cap and measure again.',
    ]);
    await approve(revisionId);
    const pairs = [
      ['HT', 'B+', 'plate supply'],
      ['heater', 'filament'],
      ['slow-blow', 'time-delay', 'T fuse'],
      ['cap', 'capacitor'],
      ['xfmr', 'transformer'],
      ['6.3V', '6.3 V'],
      ['47uF', '47 µF'],
    ];
    for (const group of pairs) {
      for (const q of group) {
        const ids = (await search(`${q} reservoir`)).results.map((r) => r.procedureId);
        expect(ids, `"${q}"`).toContain(procedureId);
      }
    }
  });

  it('a model code typed any way finds the same procedures; a question’s filler words are dropped', async () => {
    const [tc18] = await t.db.select().from(procedures).where(eq(procedures.seedKey, 'tc18-first-power-up'));
    const asWritten = (await search('TC-18 series lamp')).results.map((r) => r.procedureId);
    expect(asWritten[0]).toBe(tc18!.id);
    for (const q of [
      'TC18 series lamp',
      'tc 18 series lamp',
      'tc.18 series lamp',
      'where is the series lamp on my TC18',
    ])
      expect(
        (await search(q)).results.map((r) => r.procedureId),
        q,
      ).toEqual(asWritten);
  });

  it('a query the library does not cover: no full match, and the partial matches come as a separate labelled group', async () => {
    for (const q of ['speaker cone repair', 'guitar pickup rewind', 'phantom power 48V']) {
      const res = await search(q);
      expect(res.total, q).toBe(0);
      expect(res.results, q).toEqual([]);
    }
    const res = await search('speaker cone repair');
    expect(res.partial?.label).toBe('Matches some of your words');
    expect(res.partial!.total).toBeGreaterThan(0);
    expect(res.partial!.results.every((r) => r.missing.includes('cone'))).toBe(true);
    // A full match carries no partial group beside it.
    expect((await search('bleeder retrofit')).partial).toBeNull();
  });

  it('a typo of one letter still finds it (saying what it searched for); nothing found suggests a spelling', async () => {
    const { procedureId, revisionId } = await draftWith(['Fit a new thermistor in series with the primary.']);
    await approve(revisionId);
    const typo = await search('thermostor');
    expect(typo.results.map((r) => r.procedureId)).toContain(procedureId);
    expect(typo.correctedQuery).toBe('thermistor');
    expect((await search('thermostor primary')).results.map((r) => r.procedureId)).toContain(procedureId);
    const none = await search('qqqzzzx');
    expect(none.total).toBe(0);
    const weird = await search('thermistxr wibble');
    expect(Array.isArray(weird.suggestions)).toBe(true);
  });

  it('two letters swapped count as one edit: "hetaer" and "ehater" find what "heater" finds', async () => {
    const heater = (await search('heater')).results.map((r) => r.procedureId).sort();
    expect(heater.length).toBeGreaterThan(0);
    for (const typo of ['hetaer', 'ehater']) {
      const found = await search(typo);
      expect(found.results.map((r) => r.procedureId).sort()).toEqual(heater);
      expect(found.correctedQuery).toBe('heater');
    }
  });

  it('a server that missed notifications while disconnected catches up when it reconnects', async () => {
    const { revisionId } = await draftWith(['The wobbleflux reading drifts when the chassis warms.']);
    // Cut the index's LISTEN connection, then approve while it is away.
    await t.db.execute(
      sql`select pg_terminate_backend(pid) from pg_stat_activity where datname = current_database() and query ilike 'LISTEN%'`,
    );
    await approveRevision(t.db, revisionId);
    let total = 0;
    for (let i = 0; i < 50 && !total; i++) {
      await new Promise((r) => setTimeout(r, 100));
      total = (await search('wobbleflux')).total;
    }
    expect(total).toBe(1);
  });

  it('filters by equipment family and pages', async () => {
    const all = await search('fuse');
    expect(all.facets.families.length).toBeGreaterThan(1);
    const radios = await search('fuse', '&family=Table%20radio');
    expect(radios.total).toBeGreaterThan(0);
    const [procedure] = await t.db
      .select()
      .from(procedures)
      .where(eq(procedures.seedKey, 'tc5r-rectifier-recap'));
    expect(radios.results.map((r) => r.procedureId)).toContain(procedure!.id);
    const paged = await search('fuse', '&pageSize=1&page=2');
    expect(paged.results.length).toBe(1);
    expect((await (await t.as('tom')).get('/api/search?q=fuse&page=0')).status).toBe(400);
  });
});
