/**
 * The procedure list and its filters on a large library (BENCH_LIBRARY, default 50,000): the
 * listing read model filled straight from SQL (one row per procedure and audience, as the trigger on
 * revisions would keep it; no revisions behind them, since only the list is measured), then the
 * list service's prepared queries, serially, as the app runs them. Not a timed test.
 */
import { projectRoot, prepareDatabase, TEST_SLOT } from '../../server/bootstrap/prepare';
import { recreateDatabase, startCluster, stopCluster } from '../../server/bootstrap/postgres';
import { createDb, createPool } from '../../server/db/client';
import type { SessionUser } from '../../server/http/route';
import { listingFacets, listProcedures } from '../../server/modules/procedures/procedures.service';
import { procedureListQuery } from '../../shared/schemas/procedures';

const LIBRARY = Number(process.env.BENCH_LIBRARY ?? 50_000);
const CALLS = 40;
const cluster = startCluster({ name: 'bench-api', port: 54356 + 20 * TEST_SLOT, projectRoot });
await recreateDatabase(cluster.adminUrl, 'benchwright_bench_list');
const url = await prepareDatabase(cluster, 'benchwright_bench_list');
const owner = createPool(cluster.urlFor('benchwright_bench_list'));
const started = performance.now();
await owner.query(
  `WITH made AS (
     INSERT INTO procedures (title, equipment_family, equipment_model, tags, owner_id)
     SELECT 'TC-' || g || ' ' || (ARRAY['reservoir swap','bleeder retrofit','heater check','HT rail check','fuse upgrade'])[1 + g % 5],
            (ARRAY['Guitar amplifier','Table radio','Organ amplifier','Receiver','Public address'])[1 + g % 5],
            'TC-' || g, ARRAY[(ARRAY['recap','fuse','ht','heater','bleeder'])[1 + g % 5]],
            (SELECT id FROM people ORDER BY email LIMIT 1)
     FROM generate_series(1, $1::int) g
     RETURNING id, title, equipment_family, equipment_model, tags, owner_id)
   INSERT INTO procedure_listing (procedure_id, audience, revision_id, number, state, title, equipment_family,
     equipment_model, tags, updated_at, approved_id, approved_number, owner_id)
   SELECT m.id, a, gen_random_uuid(), 1, 'approved', m.title, m.equipment_family, m.equipment_model, m.tags,
          now() - random() * interval '400 days', gen_random_uuid(), 1, m.owner_id
   FROM made m, unnest(ARRAY['staff','published']) a`,
  [LIBRARY],
);
await owner.query('ANALYZE');
console.log(
  `listing: ${LIBRARY.toLocaleString('en')} procedures added in ${((performance.now() - started) / 1000).toFixed(1)} s`,
);
await owner.end();

const pool = createPool(url);
const db = createDb(pool);
const tech: SessionUser = {
  id: '00000000-0000-0000-0000-000000000000',
  email: '',
  displayName: '',
  roles: ['technician'],
  totp: false,
};
const author: SessionUser = { ...tech, roles: ['author'] };
const pct = (xs: number[], p: number) =>
  [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor((p / 100) * xs.length))]!;
async function time(label: string, call: (i: number) => Promise<unknown>) {
  for (let i = 0; i < 3; i++) await call(i);
  const ms: number[] = [];
  for (let i = 0; i < CALLS; i++) {
    const t0 = performance.now();
    await call(i);
    ms.push(performance.now() - t0);
  }
  console.log(
    `  ${label.padEnd(46)} p50 ${pct(ms, 50).toFixed(2).padStart(6)} ms   p95 ${pct(ms, 95).toFixed(2).padStart(6)} ms`,
  );
}
const q = (o: Record<string, string>) => procedureListQuery.parse(o);
console.log(
  `\nList service on ${LIBRARY.toLocaleString('en')} procedures, ${CALLS} serial calls each (PostgreSQL on loopback)`,
);
await time('technician, page of 50, by title, deep pages', (i) =>
  listProcedures(db, tech, q({ limit: '50', sort: 'title', offset: String((i * 997) % LIBRARY) })),
);
await time('technician, by last change', (i) =>
  listProcedures(db, tech, q({ limit: '50', sort: 'updatedAt', offset: String(i * 50) })),
);
await time('technician, title contains "bleeder"', (i) =>
  listProcedures(db, tech, q({ limit: '50', q: 'bleeder', offset: String(i * 50) })),
);
await time('technician, family filter', (i) =>
  listProcedures(db, tech, q({ limit: '50', family: 'Table radio', offset: String(i * 50) })),
);
await time('author (staff), page of 50', (i) =>
  listProcedures(db, author, q({ limit: '50', offset: String(i * 50) })),
);
await time('filters (facets), technician', () => listingFacets(db, tech));
await pool.end();
stopCluster(cluster.dataDir);
