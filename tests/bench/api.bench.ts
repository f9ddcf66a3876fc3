/**
 * API load benchmark on loopback: the built app with the demo data plus 2,000 generated approved
 * procedures, 50 connections, a read mix (procedure page, list, search) and — when the bench-run
 * API is present — a write mix of bench-run entries; and, in the same run, a bare Express endpoint
 * returning fixed JSON as the ceiling. Prints figures; it is not a timed test.
 * Goals: zero errors; read throughput at least half the bare endpoint's; read p99 under 50 ms;
 * write p99 under 500 ms, and every 2xx entry stored once.
 */
import autocannon from 'autocannon';
import express from 'express';
import { projectRoot, prepareDatabase } from '../../server/bootstrap/prepare';
import { recreateDatabase, startCluster, stopCluster } from '../../server/bootstrap/postgres';
import { createDb, createPool } from '../../server/db/client';
import { people, revisions } from '../../server/db/schema';
import { startServer } from '../../server/index';
import { createLogger } from '../../server/logger';
import { createProcedure } from '../../server/modules/procedures/procedures.service';
import { generateCorpus } from '../support/search-corpus';
import { httpSession } from '../support/http-session';
import { eq } from 'drizzle-orm';
import { randomUUID } from 'node:crypto';

const CONNECTIONS = 50;
const DURATION_S = Number(process.env.BENCH_SECONDS ?? 10);

const cluster = startCluster({ name: 'bench-api', port: 54498, projectRoot });
await recreateDatabase(cluster.adminUrl, 'benchwright_bench_api');
const url = await prepareDatabase(cluster, 'benchwright_bench_api');

// 2,000 generated procedures as approved revisions, each with its text as paragraphs.
// The demo procedures' approved revisions (with readings) are noted first, for the write mix.
let demoRevisionIds: string[] = [];
{
  const pool = createPool(url);
  const db = createDb(pool);
  demoRevisionIds = (await db.select({ id: revisions.id }).from(revisions).where(eq(revisions.state, 'approved'))).map((r) => r.id);
  const [author] = await db.select().from(people).where(eq(people.email, 'hal@tallowcreek.example'));
  const started = Date.now();
  for (const p of generateCorpus(2_000, 7)) {
    await createProcedure(db, author!.id, {
      title: p.title,
      equipmentFamily: p.family,
      equipmentModel: p.model,
      tags: p.tags,
      document: { type: 'doc', content: p.body.split('\n').map((line) => ({ type: 'paragraph', content: [{ type: 'text', text: line }] })) },
    }, 'approved');
  }
  console.log(`library: 2,000 generated procedures added in ${((Date.now() - started) / 1000).toFixed(1)} s`);
  await pool.end();
}

const server = await startServer({ databaseUrl: url, port: 0, logger: createLogger('warn'), config: { sessionSecret: 'bench-api'.padEnd(40, 'x') } });
const tech = httpSession(server.url);
await tech.signIn('tom@tallowcreek.example', 'tallow-bench-demo');
const cookie = tech.cookieHeader();
const list = (await tech.get('/api/procedures')).body as { procedures: { id: string }[] };
const ids = list.procedures.slice(0, 200).map((p) => p.id);

type Result = autocannon.Result;
const run = (title: string, opts: Partial<autocannon.Options>) =>
  new Promise<Result>((resolve, reject) =>
    autocannon({ connections: CONNECTIONS, duration: DURATION_S, title, ...opts } as autocannon.Options, (err, res) => (err ? reject(err) : resolve(res))),
  );

const reads = await run('reads', {
  url: server.url,
  headers: { cookie },
  requests: [
    { method: 'GET', setupRequest: (req) => ({ ...req, path: `/api/procedures/${ids[Math.floor(Math.random() * ids.length)]}` }) },
    { method: 'GET', path: '/api/procedures' },
    { method: 'GET', setupRequest: (req) => ({ ...req, path: `/api/search?q=${encodeURIComponent(['B+ reservoir', 'slow-blow fuse', 'heater 6.3 V', 'bleeder', 'xfmr'][Math.floor(Math.random() * 5)]!)}` }) },
  ],
});

// The write mix: bench-run entries, each with a fresh idempotency key, spread over several runs
// started (and their hazard notes acknowledged) before the load. Each run takes a row lock per
// entry, so more runs means less queueing behind one run.
const WRITE_RUNS = 25;
type Step = { id: string; kind: string; reading?: { expected: number | null } };
const approvedWithReadings: { revisionId: string; readings: Step[]; hazards: Step[] }[] = [];
for (const revisionId of demoRevisionIds) {
  const unit = await tech.post('/api/units', { model: 'TC-30H', serial: `BENCH-${randomUUID().slice(0, 8)}`, owner: 'Bench', jobNumber: 'J-0' });
  const started = await tech.post('/api/runs', { revisionId, unitId: (unit.body.unit as { id: string }).id, mainsVoltage: 230, mainsFrequency: 50 });
  const steps = (started.body.run as { steps?: Step[] } | undefined)?.steps ?? [];
  if (steps.some((s) => s.kind === 'reading')) approvedWithReadings.push({ revisionId, readings: steps.filter((s) => s.kind === 'reading'), hazards: steps.filter((s) => s.kind === 'hazard') });
}
const writeTargets: { runId: string; step: Step }[] = [];
const headers = { 'content-type': 'application/json', cookie, 'x-csrf-token': tech.csrfToken() };
for (let i = 0; i < WRITE_RUNS && approvedWithReadings.length; i++) {
  const proc = approvedWithReadings[i % approvedWithReadings.length]!;
  const unit = await tech.post('/api/units', { model: 'TC-30H', serial: `BENCH-${randomUUID().slice(0, 8)}`, owner: 'Bench', jobNumber: 'J-0' });
  const started = await tech.post('/api/runs', { revisionId: proc.revisionId, unitId: (unit.body.unit as { id: string }).id, mainsVoltage: 230, mainsFrequency: 50 });
  if (started.status !== 201) throw new Error(`bench run did not start: ${started.status}`);
  const runId = (started.body.run as { id: string }).id;
  for (const h of proc.hazards) {
    const ack = await fetch(`${server.url}/api/runs/${runId}/entries/${h.id}`, { method: 'PUT', headers, body: JSON.stringify({ key: randomUUID(), done: true }) });
    if (ack.status !== 200) throw new Error(`hazard note not acknowledged: ${ack.status}`);
  }
  for (const step of proc.readings) writeTargets.push({ runId, step });
}
let writeN = 0;
const writes = writeTargets.length
  ? await run('writes', {
      url: server.url,
      headers,
      requests: [
        {
          method: 'PUT',
          setupRequest: (req) => {
            const t = writeTargets[writeN++ % writeTargets.length]!;
            const value = (t.step.reading?.expected ?? 10) * (1 + (writeN % 13) / 1000);
            return { ...req, path: `/api/runs/${t.runId}/entries/${t.step.id}`, body: JSON.stringify({ key: randomUUID(), value, reason: 'bench: reading taken again' }) };
          },
        },
      ],
    })
  : undefined;

// The ceiling: a bare Express endpoint with fixed JSON, same machine, same connections.
const bare = express();
bare.get('/fixed', (_req, res) => res.json({ ok: true, procedures: 2004 }));
const bareServer = bare.listen(0, '127.0.0.1');
await new Promise((r) => bareServer.once('listening', r));
const bareAddr = bareServer.address() as { port: number };
const ceiling = await run('bare', { url: `http://127.0.0.1:${bareAddr.port}/fixed` });
bareServer.close();

const line = (label: string, r: Result) =>
  console.log(
    `  ${label.padEnd(26)} ${r.requests.average.toFixed(0).padStart(7)} req/s   p50 ${String(r.latency.p50).padStart(4)} ms   p99 ${String(r.latency.p99).padStart(4)} ms   errors ${r.errors + r.timeouts}   non-2xx ${r.non2xx}`,
  );
console.log(`\nAPI benchmark — ${CONNECTIONS} connections, ${DURATION_S} s each, Node ${process.version}, ${cluster.port ? 'PostgreSQL on loopback' : ''}`);
line('read mix (page/list/search)', reads);
if (writes) line(`write mix (entries, ${WRITE_RUNS} runs)`, writes);
else console.log('  write mix: no seeded approved procedure with readings; skipped');
line('bare Express fixed JSON', ceiling);
console.log(`  read throughput / bare: ${(reads.requests.average / ceiling.requests.average).toFixed(2)} (goal ≥ 0.5)`);
console.log(`  read p99 ${reads.latency.p99} ms (goal < 50 ms); errors ${reads.errors + reads.non2xx} (goal 0)`);
if (writes) {
  const pool = createPool(url);
  const stored = await pool.query<{ n: number }>(`SELECT count(*)::int AS n FROM run_entry_history WHERE reason = 'bench: reading taken again'`);
  await pool.end();
  console.log(`  write p99 ${writes.latency.p99} ms (goal < 500 ms); errors ${writes.errors + writes.timeouts + writes.non2xx} (goal 0)`);
  // Answers still on the wire when the timer ends are not counted, though their entries commit.
  const surplus = stored.rows[0]!.n - writes['2xx'];
  console.log(`  entries stored ${stored.rows[0]!.n} for ${writes['2xx']} counted 2xx (${surplus >= 0 && surplus <= CONNECTIONS ? 'consistent' : 'INCONSISTENT'}: surplus ${surplus} ≤ ${CONNECTIONS} cut off at the end)`);
}

await server.close();
stopCluster(cluster.dataDir);
