/**
 * Search benchmark: a deterministic corpus of 10,000 generated procedures (BENCH_LIBRARY=n for another size), indexed in process
 * (minisearch vocabulary tree + BM25 postings, trade vocabulary) and in PostgreSQL full-text search (tsvector + GIN), the
 * same fixed query set against both in one run. Prints figures; it is not a timed test.
 * Then relevance on the same corpus in a shuffled order: top-1 / top-3 of the labelled queries that
 * target planted procedures, and the share of negative queries that stay quiet (no full match).
 * Goals on this machine: in-process p95 under 2 ms, index build under 3 s.
 */
import pg from 'pg';
import { projectRoot, TEST_SLOT } from '../../server/bootstrap/prepare';
import { recreateDatabase, startCluster, stopCluster } from '../../server/bootstrap/postgres';
import { SearchIndex } from '../../server/search/search-index';
import { canonicalText } from '../../server/search/vocabulary';
import { generateCorpus, PLANTED, shuffled } from '../support/search-corpus';
import { LABELLED_QUERIES, NEGATIVE_QUERIES } from '../server/search/search-queries';

// BENCH_LIBRARY=50000 for a large library (index build, memory, query latency).
const CORPUS_SIZE = Number(process.env.BENCH_LIBRARY ?? 10_000);
const ROUNDS = 20;
const QUERIES = [
  'B+ reservoir',
  'HT rail check',
  'plate supply',
  'heater 6.3 V',
  'filament winding',
  'slow-blow fuse',
  'T fuse 1.6 A',
  'time-delay fuse inrush',
  '47uF cap',
  '100 µF capacitor',
  'xfmr overheating',
  'transformer varnish',
  'bleeder retrofit',
  'dropping resistor 4.7 kΩ',
  'ripple first filter node',
  'series lamp first power-up',
  'rectifier valve flashover',
  'bias check output stage',
  'hum and ripple',
  'recap reservoir',
  'guitar amplifier fuse',
  'table radio rectifier',
  'communications receiver heater',
  'organ amplifier B+',
  'discharge below 60 V',
  'AB-1234',
  'QX-555 bleeder',
  'mains inlet',
  'output xfmr squeal',
  'restuff can capacitor',
  'transfromer rewind',
  'reservior capacitor',
  'bleder',
  'heatr winding',
  'soft start thermistor',
  'primary current',
  'dropper ladder B+2',
  'loaded B+ 410 V',
  'fuse 800 mA',
  'public address recap',
  'TC18 fuse',
  'tc 30h rail check',
  '5AR4 rectifier',
  'how do I check the heater winding on my AB-1234',
  'speaker cone repair',
  'phantom power 48V',
];

const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor((p / 100) * s.length))]!;
};
const mb = (bytes: number) => (bytes / 1024 / 1024).toFixed(1);
const gc = () => (globalThis as { gc?: () => void }).gc?.();

const SEED = Number(process.env.BW_SEARCH_SEED ?? 20261203);
const corpus = shuffled([...generateCorpus(CORPUS_SIZE - PLANTED.length), ...PLANTED], SEED);
console.log(
  `Search benchmark — ${corpus.length} procedures, ${QUERIES.length} queries × ${ROUNDS} rounds, Node ${process.version}`,
);

// ── in-process index ────────────────────────────────────────────────────────
gc();
const heapBefore = process.memoryUsage().heapUsed;
const t0 = performance.now();
const index = new SearchIndex();
index.replaceAll(corpus);
const buildMs = performance.now() - t0;
gc();
const heapAfter = process.memoryUsage().heapUsed;
const rssAfter = process.memoryUsage().rss;

for (const q of QUERIES) index.search(q); // warm up
const memLat: number[] = [];
let memHits = 0;
for (let round = 0; round < ROUNDS; round++) {
  for (const q of QUERIES) {
    const s = performance.now();
    const page = index.search(q, { pageSize: 10 });
    memLat.push(performance.now() - s);
    if (round === 0 && page.total > 0) memHits++;
  }
}

// ── PostgreSQL full-text search on the same corpus ─────────────────────────
// Inside this test slot's range of ports (BW_TEST_SLOT), so it never meets another slot's test cluster.
const cluster = startCluster({ name: 'bench', port: 54354 + 20 * TEST_SLOT, projectRoot });
await recreateDatabase(cluster.adminUrl, 'benchwright_bench');
const client = new pg.Client({ connectionString: cluster.urlFor('benchwright_bench') });
await client.connect();
await client.query(`
  CREATE TABLE docs (id text primary key, title text, family text, model text, tags text, body text,
    tsv tsvector GENERATED ALWAYS AS (
      setweight(to_tsvector('english', coalesce(title, '') || ' ' || coalesce(model, '')), 'A') ||
      setweight(to_tsvector('english', coalesce(tags, '') || ' ' || coalesce(family, '')), 'B') ||
      setweight(to_tsvector('english', coalesce(body, '')), 'C')) STORED)`);
const pgStart = performance.now();
for (let i = 0; i < corpus.length; i += 1_000) {
  const batch = corpus.slice(i, i + 1_000);
  // The same canonical text as the in-process index, so both match the same trade words.
  await client.query(
    `INSERT INTO docs (id, title, family, model, tags, body)
     SELECT * FROM unnest($1::text[], $2::text[], $3::text[], $4::text[], $5::text[], $6::text[])`,
    [
      batch.map((d) => d.id),
      batch.map((d) => canonicalText(d.title)),
      batch.map((d) => d.family),
      batch.map((d) => d.model),
      batch.map((d) => canonicalText(d.tags.join(' '))),
      batch.map((d) => canonicalText([d.body, d.readings, d.reckoners].join('\n'))),
    ],
  );
}
await client.query('CREATE INDEX docs_tsv_idx ON docs USING gin (tsv)');
await client.query('ANALYZE docs');
const pgBuildMs = performance.now() - pgStart;
const sql = `SELECT id, ts_rank(tsv, q) AS rank FROM docs, websearch_to_tsquery('english', $1) q WHERE tsv @@ q ORDER BY rank DESC LIMIT 10`;
for (const q of QUERIES) await client.query(sql, [canonicalText(q)]);
const pgLat: number[] = [];
let pgHits = 0;
for (let round = 0; round < ROUNDS; round++) {
  for (const q of QUERIES) {
    const s = performance.now();
    const res = await client.query(sql, [canonicalText(q)]);
    pgLat.push(performance.now() - s);
    if (round === 0 && res.rowCount) pgHits++;
  }
}
await client.end();
stopCluster(cluster.dataDir);

// ── report ──────────────────────────────────────────────────────────────────
const row = (label: string, a: string, b: string) =>
  console.log(`  ${label.padEnd(28)} ${a.padStart(14)} ${b.padStart(16)}`);
console.log('');
row('', 'in-process', 'PostgreSQL FTS');
row('index build', `${buildMs.toFixed(0)} ms`, `${pgBuildMs.toFixed(0)} ms`);
row('index memory (JS heap)', `${mb(heapAfter - heapBefore)} MB`, 'in server');
row('process resident (RSS)', `${mb(rssAfter)} MB`, '');
row('query p50', `${pct(memLat, 50).toFixed(3)} ms`, `${pct(pgLat, 50).toFixed(3)} ms`);
row('query p95', `${pct(memLat, 95).toFixed(3)} ms`, `${pct(pgLat, 95).toFixed(3)} ms`);
row('queries with any result', `${memHits}/${QUERIES.length}`, `${pgHits}/${QUERIES.length}`);
console.log('');
console.log(`  p50 ratio PostgreSQL / in-process: ${(pct(pgLat, 50) / pct(memLat, 50)).toFixed(1)} ×`);
console.log(`  p95 ratio PostgreSQL / in-process: ${(pct(pgLat, 95) / pct(memLat, 95)).toFixed(1)} ×`);
console.log(
  `  goals: in-process p95 < 2 ms: ${pct(memLat, 95) < 2 ? 'met' : 'NOT MET'}; build < 3 s: ${buildMs < 3000 ? 'met' : 'NOT MET'}`,
);
console.log(
  '  (PostgreSQL times include the loopback round trip; typo-tolerant matching exists only in-process.)',
);

// ── relevance on the same corpus (demo procedures live in the database; the planted ones are here) ──
const planted = LABELLED_QUERIES.flatMap((l) => ('id' in l.expect ? [{ q: l.q, id: l.expect.id }] : []));
let top1 = 0;
let top3 = 0;
for (const { q, id } of planted) {
  const ids = index.search(q, { pageSize: 3 }).results.map((r) => r.procedureId);
  if (ids[0] === id) top1++;
  if (ids.includes(id)) top3++;
}
const quiet = NEGATIVE_QUERIES.filter((q) => index.search(q).total === 0).length;
console.log('');
console.log(`  relevance over ${corpus.length} procedures (indexing order seed ${SEED}):`);
console.log(`    top-1 ${top1}/${planted.length} (${((100 * top1) / planted.length).toFixed(0)} %)`);
console.log(`    top-3 ${top3}/${planted.length} (${((100 * top3) / planted.length).toFixed(0)} %)`);
console.log(
  `    negatives quiet (no full match) ${quiet}/${NEGATIVE_QUERIES.length} (${((100 * quiet) / NEGATIVE_QUERIES.length).toFixed(0)} %)`,
);
