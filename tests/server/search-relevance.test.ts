import { isNotNull } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { procedures } from '../../server/db/schema';
import { loadApproved } from '../../server/search/documents';
import { SearchIndex } from '../../server/search/search-index';
import { generateCorpus, PLANTED } from '../support/search-corpus';
import { createTestApp, type TestApp } from '../support/test-app';
import { LABELLED_QUERIES } from './search-queries';

let t: TestApp;
const index = new SearchIndex();
const idOfSeed = new Map<string, string>();

beforeAll(async () => {
  t = await createTestApp();
  // The demo procedures as the server indexes them, among 2,000 generated ones and the planted set.
  index.replaceAll([...(await loadApproved(t.db)), ...generateCorpus(2_000), ...PLANTED]);
  for (const p of await t.db.select().from(procedures).where(isNotNull(procedures.seedKey)))
    idOfSeed.set(p.seedKey!, p.id);
});
afterAll(() => t.close());

describe('search relevance on the labelled set', () => {
  it('finds the intended procedure in the top five for at least 80 % of the queries', () => {
    expect(LABELLED_QUERIES.length).toBeGreaterThanOrEqual(30);
    const misses: string[] = [];
    let hits = 0;
    for (const { q, expect: target } of LABELLED_QUERIES) {
      const want = 'seedKey' in target ? idOfSeed.get(target.seedKey) : target.id;
      expect(want, `labelled target of "${q}" exists`).toBeDefined();
      const top5 = index.search(q, { pageSize: 5 }).results.map((r) => r.procedureId);
      if (top5.includes(want!)) hits++;
      else misses.push(`"${q}" → ${top5.slice(0, 3).join(', ') || 'nothing'}`);
    }
    const p5 = hits / LABELLED_QUERIES.length;
    // One relevant procedure per query, so this is the share of queries whose procedure is in the top 5.
    console.log(
      `search relevance: ${hits}/${LABELLED_QUERIES.length} queries found their procedure in the top 5 (precision at 5 as defined in tests: ${p5.toFixed(2)})`,
    );
    if (misses.length) console.log(`misses:\n  ${misses.join('\n  ')}`);
    expect(p5).toBeGreaterThanOrEqual(0.8);
  });
});
