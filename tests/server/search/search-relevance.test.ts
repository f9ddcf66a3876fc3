import { isNotNull } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { procedures } from '../../../server/db/schema';
import { loadApproved } from '../../../server/search/documents';
import { SearchIndex, type IndexedProcedure } from '../../../server/search/search-index';
import { generateCorpus, PLANTED, shuffled } from '../../support/search-corpus';
import { createTestApp, type TestApp } from '../../support/test-app';
import { LABELLED_QUERIES, NEGATIVE_QUERIES } from './search-queries';

// A new order every run; BW_SEARCH_SEED=<seed> repeats a failing one.
const SEED = Number(process.env.BW_SEARCH_SEED ?? Math.floor(Math.random() * 2 ** 31));
const seedNote = `indexing order seed ${SEED} (repeat with BW_SEARCH_SEED=${SEED})`;

let t: TestApp;
let library: IndexedProcedure[] = [];
const index = new SearchIndex();
const idOfSeed = new Map<string, string>();

beforeAll(async () => {
  t = await createTestApp();
  // The demo procedures as the server indexes them, among 2,000 generated ones and the planted set,
  // in a random order: no group of procedures is indexed first.
  library = shuffled([...(await loadApproved(t.db)), ...generateCorpus(2_000), ...PLANTED], SEED);
  index.replaceAll(library);
  for (const p of await t.db.select().from(procedures).where(isNotNull(procedures.seedKey)))
    idOfSeed.set(p.seedKey!, p.id);
});
afterAll(() => t.close());

const ranking = (ix: SearchIndex, q: string) =>
  ix.search(q, { pageSize: 10 }).results.map((r) => `${r.procedureId} ${r.score}`);

describe('search relevance on the labelled set', () => {
  it('finds the intended procedure first for most queries and in the top three for nearly all', () => {
    expect(LABELLED_QUERIES.length).toBeGreaterThanOrEqual(50);
    const misses: string[] = [];
    let top1 = 0;
    let top3 = 0;
    for (const { q, expect: target } of LABELLED_QUERIES) {
      const want = 'seedKey' in target ? idOfSeed.get(target.seedKey) : target.id;
      expect(want, `labelled target of "${q}" exists`).toBeDefined();
      const ids = index.search(q, { pageSize: 3 }).results.map((r) => r.procedureId);
      if (ids[0] === want) top1++;
      if (ids.includes(want!)) top3++;
      else misses.push(`"${q}" → ${ids.join(', ') || 'nothing'}`);
    }
    const n = LABELLED_QUERIES.length;
    console.log(`search relevance: top-1 ${top1}/${n}, top-3 ${top3}/${n}; ${seedNote}`);
    expect(top3 / n, `${seedNote}\nmisses:\n  ${misses.join('\n  ')}`).toBeGreaterThanOrEqual(0.95);
    expect(top1 / n, seedNote).toBeGreaterThanOrEqual(0.85);
  });

  it('stays quiet on what the library does not cover: no full match, only the labelled partial group', () => {
    expect(NEGATIVE_QUERIES.length).toBeGreaterThanOrEqual(10);
    const loud = NEGATIVE_QUERIES.map((q) => [q, index.search(q)] as const).filter(([, r]) => r.total > 0);
    expect(
      loud.map(([q, r]) => `"${q}" → ${r.results[0]!.title}`),
      seedNote,
    ).toEqual([]);
    const some = index.search('speaker cone repair');
    expect(some.results).toEqual([]);
    expect(some.partial?.label).toBe('Matches some of your words');
    expect(some.partial!.results.every((h) => h.missing.includes('cone'))).toBe(true);
  });

  it('ranks the same library the same in three indexing orders, built at once or one by one', () => {
    const reversed = new SearchIndex();
    reversed.replaceAll([...library].reverse());
    // One by one, with some procedures removed and added again on the way (approvals, withdrawals).
    const stepwise = new SearchIndex();
    const other = shuffled(library, SEED + 1);
    other.forEach((p, i) => {
      stepwise.upsert(p);
      if (i % 7 === 3) stepwise.remove(other[i - 2]!.id);
    });
    other.forEach((p, i) => i % 7 === 3 && stepwise.upsert(other[i - 2]!));
    expect(stepwise.size).toBe(index.size);
    for (const q of [...LABELLED_QUERIES.map((l) => l.q), ...NEGATIVE_QUERIES, 'fuse', 'B+ reservoir']) {
      const first = ranking(index, q);
      expect(ranking(reversed, q), `"${q}", ${seedNote}`).toEqual(first);
      expect(ranking(stepwise, q), `"${q}", ${seedNote}`).toEqual(first);
    }
  });
});
