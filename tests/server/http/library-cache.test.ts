// Reader, list, filter and search answers kept in memory until the library changes
// (server/http/library-cache.ts). Conditional requests follow RFC 9110 §13.1.2 (If-None-Match,
// strong comparison) and §15.4.5 (304 Not Modified).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { approveRevision, procedureInState, textDoc } from '../../support/review-path';
import { recordWithdrawal } from '../../../server/modules/review/transitions';
import { NO_FILES } from '../../../server/storage/files';
import { people } from '../../../server/db/schema';
import { eq } from 'drizzle-orm';
import { httpSession } from '../../support/http-session';
import { startSecondServer } from '../../support/second-server';
import { createTestApp, demo, type TestApp } from '../../support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { search: true });
});
afterAll(() => t.close());

let n = 0;
const meta = () => ({
  title: `TC-${++n}0 filter choke check`,
  equipmentFamily: 'Guitar amplifier',
  equipmentModel: `TC-${n}0`,
  tags: ['choke'],
  document: textDoc(`Measure the quorbel${n} choke drop.`),
});

/** A new approved procedure, heard by this process's listener (as one approved elsewhere). */
async function approvedElsewhere(extra = '') {
  const draft = await procedureInState(t.db, 'draft', {
    ...meta(),
    ...(extra && { document: textDoc(`Measure the quorbel${n} choke drop. ${extra}`) }),
  });
  const heard = t.search!.nextRefreshOf(draft.procedure.id);
  await approveRevision(t.db, draft.revision.id);
  expect(await heard).toBe(true);
  return { procedureId: draft.procedure.id, revisionId: draft.revision.id };
}

/** Counts the queries this app's pool runs while `fn` runs. */
async function queriesDuring(fn: () => Promise<unknown>) {
  const original = t.pool.query.bind(t.pool);
  let count = 0;
  t.pool.query = ((...args: Parameters<typeof original>) => {
    count++;
    return original(...args);
  }) as typeof t.pool.query;
  try {
    await fn();
  } finally {
    t.pool.query = original;
  }
  return count;
}

describe('the reader answer of an approved revision', () => {
  it('carries a strong ETag; a repeat view is a 304 that reads nothing from the database', async () => {
    const { revisionId } = await approvedElsewhere();
    const tom = await t.as('tom');
    const first = await tom.get(`/api/revisions/${revisionId}`);
    expect(first.status).toBe(200);
    expect(first.body.revision.state).toBe('approved');
    const etag = first.headers.etag as string;
    expect(etag).toMatch(/^"[^"]+"$/); // strong: no W/ prefix
    expect(first.headers['cache-control']).toBe('private, no-cache');

    let again: Awaited<ReturnType<typeof tom.get>> | undefined;
    const queries = await queriesDuring(async () => {
      again = await tom.get(`/api/revisions/${revisionId}`).set('if-none-match', etag);
    });
    expect(again!.status).toBe(304);
    expect(queries).toBe(0);
    // Without the validator the same bytes come again, from memory.
    const third = await tom.get(`/api/revisions/${revisionId}`);
    expect(third.text).toBe(first.text);
  });

  it('a strong ETag names bytes: the gzip, brotli and plain answers each carry their own (RFC 9110 §8.8.3)', async () => {
    // Long enough to be worth compressing (answers under 1 kB go plain).
    const { revisionId } = await approvedElsewhere('Then the bleeder. '.repeat(80));
    const tom = await t.as('tom');
    const url = `/api/revisions/${revisionId}`;
    const plain = await tom.get(url).set('accept-encoding', 'identity');
    const gzip = await tom.get(url).set('accept-encoding', 'gzip');
    const br = await tom.get(url).set('accept-encoding', 'br');
    expect(plain.text.length).toBeGreaterThan(1024);
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(gzip.headers['content-encoding']).toBe('gzip');
    expect(br.headers['content-encoding']).toBe('br');
    for (const res of [plain, gzip, br]) expect(res.headers.vary).toMatch(/accept-encoding/i);
    // supertest decodes both: the same answer underneath.
    expect(gzip.body).toEqual(plain.body);
    expect(br.body).toEqual(plain.body);
    const tags = new Set([plain, gzip, br].map((r) => r.headers.etag));
    expect(tags.size).toBe(3);
    // The plain answer's validator does not stand for the gzip bytes, and the other way round.
    const crossed = await tom
      .get(url)
      .set('accept-encoding', 'gzip')
      .set('if-none-match', plain.headers.etag!);
    expect(crossed.status).toBe(200);
    const same = await tom.get(url).set('accept-encoding', 'gzip').set('if-none-match', gzip.headers.etag!);
    expect(same.status).toBe(304);
  });

  it('a draft gets no ETag and stays no-store', async () => {
    const draft = await procedureInState(t.db, 'draft', meta());
    const hal = await t.as('hal');
    const res = await hal.get(`/api/revisions/${draft.revision.id}`);
    expect(res.status).toBe(200);
    expect(res.headers.etag).toBeUndefined();
    expect(res.headers['cache-control']).toBe('no-store');
  });

  it('an ETag never crosses roles: technician and reviewer get different validators', async () => {
    const { revisionId } = await approvedElsewhere();
    const tom = await t.as('tom');
    const marek = await t.as('marek');
    const tomEtag = (await tom.get(`/api/revisions/${revisionId}`)).headers.etag as string;
    const marekRes = await marek.get(`/api/revisions/${revisionId}`).set('if-none-match', tomEtag);
    expect(marekRes.status).toBe(200);
    expect(marekRes.headers.etag).not.toBe(tomEtag);
    expect(
      (await marek.get(`/api/revisions/${revisionId}`).set('if-none-match', marekRes.headers.etag!)).status,
    ).toBe(304);
  });

  it('a withdrawal through this process: the old ETag gets the withdrawn state (staff) or 404 (technician), at once', async () => {
    const { procedureId, revisionId } = await approvedElsewhere();
    const tom = await t.as('tom');
    const marek = await t.as('marek');
    const tomEtag = (await tom.get(`/api/revisions/${revisionId}`)).headers.etag as string;
    const marekEtag = (await marek.get(`/api/revisions/${revisionId}`)).headers.etag as string;

    const withdrawn = await marek
      .post(`/api/procedures/${procedureId}/withdraw`)
      .send({ password: demo.marek.password, reason: 'Choke rating wrong in step 2.' });
    expect(withdrawn.status).toBe(200);
    // No waiting for the notification: the committing process drops its copy itself.
    const staff = await marek.get(`/api/revisions/${revisionId}`).set('if-none-match', marekEtag);
    expect(staff.status).toBe(200);
    expect(staff.body.revision.state).toBe('withdrawn');
    expect(staff.headers.etag).toBeUndefined();
    expect((await tom.get(`/api/revisions/${revisionId}`).set('if-none-match', tomEtag)).status).toBe(404);
  });

  it('a withdrawal committed by another process: the NOTIFY drops the kept copy', async () => {
    const { procedureId, revisionId } = await approvedElsewhere();
    const tom = await t.as('tom');
    const etag = (await tom.get(`/api/revisions/${revisionId}`)).headers.etag as string;
    expect((await tom.get(`/api/revisions/${revisionId}`).set('if-none-match', etag)).status).toBe(304);

    const [marek] = await t.db.select().from(people).where(eq(people.email, demo.marek.email));
    const heard = t.search!.nextRefreshOf(procedureId);
    // Straight to the database, as another app process would, not through this app.
    await t.db.transaction((tx) =>
      recordWithdrawal(tx, NO_FILES, marek!, procedureId, {
        reason: 'Withdrawn elsewhere.',
        reauthenticated: false,
      }),
    );
    expect(await heard).toBe(true);
    expect((await tom.get(`/api/revisions/${revisionId}`).set('if-none-match', etag)).status).toBe(404);
  });

  it('a superseded revision answers with its new state, not a 304 of the approved one', async () => {
    const { procedureId, revisionId } = await approvedElsewhere();
    const tom = await t.as('tom');
    const etag = (await tom.get(`/api/revisions/${revisionId}`)).headers.etag as string;
    const hal = await t.as('hal');
    const next = await hal.post(`/api/procedures/${procedureId}/drafts`).send({});
    expect(next.status).toBe(201);
    const heard = t.search!.nextRefreshOf(procedureId);
    await approveRevision(t.db, next.body.revision.id as string);
    expect(await heard).toBe(true);
    const res = await tom.get(`/api/revisions/${revisionId}`).set('if-none-match', etag);
    expect(res.status).toBe(200);
    expect(res.body.revision.state).toBe('superseded');
  });
});

describe('list, filter and search answers', () => {
  it('a technician’s list, filters and search follow an approval made elsewhere', async () => {
    const tom = await t.as('tom');
    const family = `Tape recorder ${Date.now()}`;
    const listUrl = `/api/procedures?family=${encodeURIComponent(family)}`;
    const before = await tom.get(listUrl);
    expect(before.body.total).toBe(0);
    expect((await tom.get('/api/procedures/facets')).body.facets.families).not.toContain(family);
    expect((await tom.get('/api/search?q=wobblestat')).body.total).toBe(0);
    // Kept: asking again reads nothing from the database.
    expect(await queriesDuring(() => tom.get(listUrl))).toBe(0);

    const draft = await procedureInState(t.db, 'draft', {
      ...meta(),
      equipmentFamily: family,
      document: textDoc('Set the wobblestat before the HT comes up.'),
    });
    // A draft changes nothing a technician sees.
    expect((await tom.get(listUrl)).body.total).toBe(0);
    const heard = t.search!.nextRefreshOf(draft.procedure.id);
    await approveRevision(t.db, draft.revision.id);
    expect(await heard).toBe(true);
    expect((await tom.get(listUrl)).body.total).toBe(1);
    expect((await tom.get('/api/procedures/facets')).body.facets.families).toContain(family);
    expect((await tom.get('/api/search?q=wobblestat')).body.total).toBe(1);
  });

  it('staff lists are never served from memory: a new draft shows at once', async () => {
    const hal = await t.as('hal');
    const family = `Oscilloscope ${Date.now()}`;
    const listUrl = `/api/procedures?family=${encodeURIComponent(family)}`;
    expect((await hal.get(listUrl)).body.total).toBe(0);
    const created = await hal
      .post('/api/procedures')
      .send({ ...meta(), equipmentFamily: family, document: undefined });
    expect(created.status).toBe(201);
    expect((await hal.get(listUrl)).body.total).toBe(1);
    // And a technician's kept answer is not a staff member's: hal sees the draft, tom does not.
    const tom = await t.as('tom');
    expect((await tom.get(listUrl)).body.total).toBe(0);
  });

  it('another process: its kept list, reader answer and search follow an approval and a withdrawal made here within a second', async () => {
    const other = await startSecondServer(t.databaseUrl);
    try {
      const tom = httpSession(other.url);
      expect((await tom.signIn(demo.tom.email, demo.tom.password)).status).toBe(200);
      const family = `Tuner ${Date.now()}`;
      const listUrl = `/api/procedures?family=${encodeURIComponent(family)}`;
      expect((await tom.get(listUrl)).body.total).toBe(0);
      expect((await tom.get('/api/search?q=glimmerstat')).body.total).toBe(0);
      const draft = await procedureInState(t.db, 'draft', {
        ...meta(),
        equipmentFamily: family,
        document: textDoc('Trim the glimmerstat with the HT off.'),
      });
      await approveRevision(t.db, draft.revision.id);
      const within = async (check: () => Promise<boolean>) => {
        const since = Date.now();
        while (!(await check()) && Date.now() - since < 1_000) await new Promise((r) => setTimeout(r, 50));
        return check();
      };
      expect(await within(async () => (await tom.get(listUrl)).body.total === 1)).toBe(true);
      expect(await within(async () => (await tom.get('/api/search?q=glimmerstat')).body.total === 1)).toBe(
        true,
      );

      // Kept there now; a withdrawal here takes it away there too.
      const reader = `/api/revisions/${draft.revision.id}`;
      expect((await tom.get(reader)).status).toBe(200);
      const [marek] = await t.db.select().from(people).where(eq(people.email, demo.marek.email));
      await t.db.transaction((tx) =>
        recordWithdrawal(tx, NO_FILES, marek!, draft.procedure.id, {
          reason: 'Withdrawn in another process.',
          reauthenticated: false,
        }),
      );
      expect(await within(async () => (await tom.get(reader)).status === 404)).toBe(true);
      expect(await within(async () => (await tom.get(listUrl)).body.total === 0)).toBe(true);
    } finally {
      other.stop();
    }
  });

  it('without a live listener nothing is served from memory', async () => {
    const { revisionId } = await approvedElsewhere();
    const tom = await t.as('tom');
    const etag = (await tom.get(`/api/revisions/${revisionId}`)).headers.etag as string;
    await t.search!.stop();
    expect(t.search!.listening).toBe(false);
    let res: Awaited<ReturnType<typeof tom.get>> | undefined;
    const queries = await queriesDuring(async () => {
      res = await tom.get(`/api/revisions/${revisionId}`).set('if-none-match', etag);
    });
    // Still a 304 (the bytes match), but checked against the database.
    expect(res!.status).toBe(304);
    expect(queries).toBeGreaterThan(0);
  });
});
