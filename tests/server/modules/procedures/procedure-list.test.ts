import { eq } from 'drizzle-orm';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { procedureListing, revisions } from '../../../../server/db/schema';
import { procedureInState, textDoc } from '../../../support/review-path';
import { createTestApp, type TestApp } from '../../../support/test-app';
import { approve, goodDoc, inReview, newDraft, params } from '../review/review-support';

let t: TestApp;
const GENERATED = 37;
beforeAll(async () => {
  t = await createTestApp();
  // A library bigger than one page: approved procedures over three families, tagged by number.
  for (let i = 0; i < GENERATED; i++) {
    const title = `Listing check ${String(i).padStart(2, '0')}`;
    await procedureInState(t.db, 'approved', {
      title,
      equipmentFamily: ['Hi-fi amplifier', 'Organ', 'Radio'][i % 3]!,
      equipmentModel: `LC-${i}`,
      tags: [i % 2 ? 'odd' : 'even'],
      document: textDoc(`${title}: measure the HT at the reservoir.`),
    });
  }
});
afterAll(() => t.close());

type Item = {
  id: string;
  title: string;
  equipmentFamily: string;
  tags: string[];
  latest: { id: string; state: string; updatedAt: string };
  approved: { id: string } | null;
  updatedAt: string;
};

/** Every page of one query, walked with the given page size. */
async function walk(who: 'tom' | 'hal', query: string, limit: number) {
  const c = await t.as(who);
  const items: Item[] = [];
  let total = -1;
  for (let offset = 0; total < 0 || offset < total; offset += limit) {
    const res = await c.get(`/api/procedures?${query}${query ? '&' : ''}limit=${limit}&offset=${offset}`);
    expect(res.status).toBe(200);
    total = res.body.total;
    expect(res.body.procedures.length).toBeLessThanOrEqual(limit);
    items.push(...res.body.procedures);
  }
  return { items, total };
}

describe('the procedure list, paged on the server', () => {
  it('pages cover the whole library once each: no row skipped or repeated, total stays the same', async () => {
    const whole = await walk('tom', '', 200);
    for (const limit of [7, 25]) {
      const paged = await walk('tom', '', limit);
      expect(paged.total).toBe(whole.total);
      expect(paged.items.map((p) => p.id)).toEqual(whole.items.map((p) => p.id));
    }
    expect(new Set(whole.items.map((p) => p.id)).size).toBe(whole.total);
    expect(whole.total).toBeGreaterThanOrEqual(GENERATED);
  });

  it('sorts newest change first by default, and by title or equipment on request, both ways', async () => {
    const byDate = (await walk('tom', '', 200)).items.map((p) => Date.parse(p.updatedAt));
    expect(byDate).toEqual([...byDate].sort((a, b) => b - a));
    const titles = (await walk('tom', 'family=Organ&sort=title&dir=asc', 5)).items.map((p) => p.title);
    expect(titles).toEqual(titles.map((x) => x).sort());
    expect(titles.length).toBe(Math.ceil((GENERATED - 1) / 3));
    const down = (await walk('tom', 'family=Organ&sort=title&dir=desc', 5)).items.map((p) => p.title);
    expect(down).toEqual([...titles].reverse());
    const families = (await walk('tom', 'sort=equipment&dir=asc', 50)).items.map((p) => p.equipmentFamily);
    expect(families).toEqual([...families].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0)));
  });

  it('filters by family, tag and state on the server, and counts what matches', async () => {
    const odd = await walk('tom', 'tag=ODD', 10);
    expect(odd.items.every((p) => p.tags.includes('odd'))).toBe(true);
    expect(odd.total).toBe(Math.floor(GENERATED / 2));
    const radio = await walk('tom', 'family=Radio&tag=even', 10);
    expect(radio.items.every((p) => p.equipmentFamily === 'Radio' && p.tags.includes('even'))).toBe(true);
    expect(radio.total).toBe([...Array(GENERATED).keys()].filter((i) => i % 3 === 2 && i % 2 === 0).length);
  });

  it('finds titles containing the words typed, in any case, with % and _ taken literally', async () => {
    const found = await walk('tom', `q=${encodeURIComponent('LISTING CHECK 1')}`, 50);
    expect(found.items.map((p) => p.title).sort()).toEqual(
      [...Array(10).keys()].map((i) => `Listing check 1${i}`),
    );
    expect((await walk('tom', `q=${encodeURIComponent('listing%check')}`, 50)).total).toBe(0);
    expect((await walk('tom', `q=${encodeURIComponent('check _5')}`, 50)).total).toBe(0);
    expect(
      (await walk('tom', `q=${encodeURIComponent('check 05')}&family=Radio`, 50)).items.map((p) => p.title),
    ).toEqual(['Listing check 05']);
  });

  it('a technician sees approved work only; staff see drafts as the latest revision, and the approved one beside it', async () => {
    const { c, revision } = await newDraft(t, 'hal');
    const renamed = await c.put(`/api/revisions/${revision.id}`).send({
      title: 'Listing draft only',
      equipmentFamily: 'Organ',
      equipmentModel: 'LD-1',
      tags: ['draft'],
      params,
      lockVersion: revision.lockVersion,
      document: goodDoc(),
    });
    expect(renamed.status).toBe(200);
    const staff = await walk('hal', 'family=Organ', 200);
    const mine = staff.items.find((p) => p.latest.id === revision.id);
    expect(mine).toMatchObject({ title: 'Listing draft only', latest: { state: 'draft' }, approved: null });
    const tech = await walk('tom', 'family=Organ', 200);
    expect(tech.items.some((p) => p.latest.id === revision.id)).toBe(false);
    expect(tech.items.every((p) => ['approved', 'superseded'].includes(p.latest.state))).toBe(true);
    expect(staff.total).toBe(tech.total + 1);
  });

  it('follows review: once approved the procedure is runnable and its new title shows to technicians', async () => {
    const { c, revision } = await inReview(t, 'hal');
    const marek = await t.as('marek');
    expect((await approve(marek, revision.id, 'marek')).status).toBe(200);
    const runnable = await walk('tom', 'runnable=true', 200);
    const item = runnable.items.find((p) => p.latest.id === revision.id);
    expect(item?.approved?.id).toBe(revision.id);
    expect(runnable.items.every((p) => p.approved)).toBe(true);
    // The next draft changes the staff row only; technicians keep seeing the approved revision.
    const next = await c.post(`/api/procedures/${revision.procedureId}/drafts`).send({});
    expect(next.status).toBe(201);
    const staffRow = (await walk('hal', 'runnable=true', 200)).items.find(
      (p) => p.id === revision.procedureId,
    );
    expect(staffRow).toMatchObject({
      latest: { id: next.body.revision.id, state: 'draft' },
      approved: { id: revision.id },
    });
    const techRow = (await walk('tom', 'runnable=true', 200)).items.find(
      (p) => p.id === revision.procedureId,
    );
    expect(techRow).toMatchObject({ latest: { id: revision.id, state: 'approved' } });
  });

  it('the read model matches the revisions table for every procedure (recomputed here from the raw rows)', async () => {
    const all = await t.db
      .select({
        procedureId: revisions.procedureId,
        id: revisions.id,
        number: revisions.number,
        state: revisions.state,
      })
      .from(revisions);
    const listing = await t.db.select().from(procedureListing);
    const newest = (rows: typeof all) => rows.reduce((a, b) => (b.number > a.number ? b : a));
    const procedureIds = [...new Set(all.map((r) => r.procedureId))];
    for (const pid of procedureIds) {
      const mine = all.filter((r) => r.procedureId === pid);
      const published = mine.filter((r) => r.state === 'approved' || r.state === 'superseded');
      const staff = listing.find((l) => l.procedureId === pid && l.audience === 'staff');
      expect(staff?.revisionId).toBe(newest(mine).id);
      const tech = listing.find((l) => l.procedureId === pid && l.audience === 'published');
      expect(tech?.revisionId).toBe(published.length ? newest(published).id : undefined);
      expect(staff?.approvedId ?? null).toBe(mine.find((r) => r.state === 'approved')?.id ?? null);
    }
    expect(listing.length).toBe(
      procedureIds.length +
        new Set(
          all.filter((r) => r.state === 'approved' || r.state === 'superseded').map((r) => r.procedureId),
        ).size,
    );
  });

  it('two transactions changing one procedure at once leave the listing as the database ends up', async () => {
    const { procedure, revision: first } = await procedureInState(t.db, 'approved', {
      title: 'Listing race',
      equipmentFamily: 'Organ',
      equipmentModel: 'LR-1',
      tags: [],
      document: textDoc('Race the listing.'),
    });
    const c = await t.as('hal');
    const next = (await c.post(`/api/procedures/${procedure.id}/drafts`).send({})).body.revision as {
      id: string;
    };
    const withdrawer = new pg.Client({ connectionString: t.databaseUrl });
    const saver = new pg.Client({ connectionString: t.databaseUrl });
    await Promise.all([withdrawer.connect(), saver.connect()]);
    try {
      await withdrawer.query('begin');
      await withdrawer.query(`update revisions set state = 'withdrawn' where id = $1`, [first.id]);
      // A draft save lands while the withdrawal is still open; it must wait for it, then see it.
      const save = saver.query(
        `update revisions set title = 'Listing race, renamed', updated_at = now() where id = $1`,
        [next.id],
      );
      await new Promise((r) => setTimeout(r, 300));
      await withdrawer.query('commit');
      await save;
    } finally {
      await Promise.all([withdrawer.end(), saver.end()]);
    }
    const rows = await t.db
      .select()
      .from(procedureListing)
      .where(eq(procedureListing.procedureId, procedure.id));
    const staff = rows.find((r) => r.audience === 'staff');
    expect(staff).toMatchObject({ revisionId: next.id, title: 'Listing race, renamed', approvedId: null });
  });

  it('facets offer the families, tags and states that occur for the caller', async () => {
    const tech = await (await t.as('tom')).get('/api/procedures/facets');
    expect(tech.status).toBe(200);
    expect(tech.body.facets.families).toEqual(expect.arrayContaining(['Hi-fi amplifier', 'Organ', 'Radio']));
    expect(tech.body.facets.tags).toEqual(expect.arrayContaining(['even', 'odd']));
    expect(tech.body.facets.states.every((s: string) => ['approved', 'superseded'].includes(s))).toBe(true);
    const staff = await (await t.as('hal')).get('/api/procedures/facets');
    expect(staff.body.facets.states).toContain('draft');
    expect(staff.body.facets.tags).toContain('draft');
    expect(tech.body.facets.tags).not.toContain('draft');
  });

  it('bad paging or sort gets 400 naming the field', async () => {
    const c = await t.as('tom');
    for (const [query, field] of [
      ['limit=0', 'query.limit'],
      ['limit=201', 'query.limit'],
      ['offset=-1', 'query.offset'],
      ['offset=1.5', 'query.offset'],
      ['sort=owner', 'query.sort'],
      ['dir=up', 'query.dir'],
      ['runnable=yes', 'query.runnable'],
    ] as const) {
      const res = await c.get(`/api/procedures?${query}`);
      expect(res.status, query).toBe(400);
      expect(res.body.fields.map((f: { field: string }) => f.field)).toContain(field);
    }
    const past = await c.get('/api/procedures?offset=100000');
    expect(past.status).toBe(200);
    expect(past.body.procedures).toEqual([]);
  });
});
