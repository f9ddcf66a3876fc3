/**
 * API load benchmark on loopback. The app runs in its own process (as `npm start` runs it) on the
 * demo data plus generated approved procedures (BENCH_LIBRARY, default 2,000); autocannon drives it
 * from this process. First, each request alone (median of serial calls) shows what each costs
 * without queueing. Then a closed loop with 50 connections: a read mix (procedure reader page, a
 * page of the procedure list, search) and a write mix of bench-run entries, beside a bare Express
 * endpoint returning fixed JSON in its own process, the ceiling, in the same run. Then an open loop
 * at fixed rates (20, 100 and 400 requests/s: a shop, a group of shops, ten times that) per route,
 * with p50/p99 and the server's CPU per request against the bare endpoint's at the same rate.
 * Prints figures and the CPU each process used; not a timed test.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import os from 'node:os';
import autocannon from 'autocannon';
import { eq } from 'drizzle-orm';
import { projectRoot, prepareDatabase, TEST_SLOT } from '../../server/bootstrap/prepare';
import { recreateDatabase, startCluster, stopCluster } from '../../server/bootstrap/postgres';
import { createDb, createPool } from '../../server/db/client';
import { revisions } from '../../server/db/schema';
import { procedureInState } from '../support/review-path';
import { generateCorpus } from '../support/search-corpus';
import { httpSession } from '../support/http-session';
import { clusterPids, cpuMeter, cpuSeconds, residentMb } from './process-cpu';

const CONNECTIONS = 50;
const DURATION_S = Number(process.env.BENCH_SECONDS ?? 10);
const SERIAL_CALLS = 60;
const LIBRARY = Number(process.env.BENCH_LIBRARY ?? 2_000);
const RATES = (process.env.BENCH_RATES ?? '20,100,400').split(',').map(Number);

// Inside this test slot's range of ports (BW_TEST_SLOT), so two checkouts can measure at once.
const cluster = startCluster({ name: 'bench-api', port: 54356 + 20 * TEST_SLOT, projectRoot });
await recreateDatabase(cluster.adminUrl, 'benchwright_bench_api');
const url = await prepareDatabase(cluster, 'benchwright_bench_api');

// 2,000 generated procedures as approved revisions, each with its text as paragraphs.
// The demo procedures' approved revisions (with readings) are noted first, for the write mix.
let demoRevisionIds: string[];
{
  // Set-up as the owner (ANALYZE needs it); the app itself connects as the application role.
  const pool = createPool(cluster.urlFor('benchwright_bench_api'));
  const db = createDb(pool);
  demoRevisionIds = (
    await db.select({ id: revisions.id }).from(revisions).where(eq(revisions.state, 'approved'))
  ).map((r) => r.id);
  const started = Date.now();
  // A few at a time: each is its own transaction (draft, submission, signed approval).
  const corpus = generateCorpus(LIBRARY, 7);
  const add = async () => {
    for (let p = corpus.pop(); p; p = corpus.pop()) await addOne(p);
  };
  const addOne = (p: ReturnType<typeof generateCorpus>[number]) =>
    procedureInState(db, 'approved', {
      title: p.title,
      equipmentFamily: p.family,
      equipmentModel: p.model,
      tags: p.tags,
      document: {
        type: 'doc',
        content: p.body
          .split('\n')
          .map((line) => ({ type: 'paragraph', content: [{ type: 'text', text: line }] })),
      },
    });
  await Promise.all([add(), add(), add(), add()]);
  await pool.query('ANALYZE');
  console.log(
    `library: ${LIBRARY.toLocaleString('en')} generated procedures added in ${((Date.now() - started) / 1000).toFixed(1)} s`,
  );
  await pool.end();
}

/** Starts a script in its own Node process and waits for its "READY <url>" line. */
function startProcess(script: string, env: Record<string, string> = {}, nodeArgs: string[] = []) {
  const child = spawn(process.execPath, [...nodeArgs, '--import', 'tsx', script], {
    cwd: projectRoot,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  return new Promise<{ child: ChildProcess; url: string; startup: () => string }>((resolve, reject) => {
    let out = '';
    let ready = false;
    const onData = (chunk: Buffer) => {
      out += chunk.toString();
      // Past its first 256 kB the output (the app's request log) is read and dropped.
      if (out.length > 256 * 1024) child.stdout!.off('data', onData).resume();
      const m = !ready && /READY (\S+)/.exec(out);
      if (!m) return;
      ready = true;
      resolve({ child, url: m[1]!, startup: () => out });
    };
    child.stdout!.on('data', onData);
    child.once('exit', (code) => reject(new Error(`${script} exited with ${code} before it was ready`)));
  });
}
const stopProcess = (child: ChildProcess) =>
  new Promise<void>((resolve) => {
    child.once('exit', () => resolve());
    child.kill('SIGTERM');
  });

// BENCH_PROFILE=<dir> writes a V8 CPU profile of the app process there, for finding what to fix.
const profile = process.env.BENCH_PROFILE
  ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_PROFILE}`]
  : [];
// The app logs each request at info, as in production; the lines are read and dropped here.
const app = await startProcess(
  'tests/support/server-process.ts',
  { DATABASE_URL: url, LOG_LEVEL: 'info' },
  profile,
);
const bare = await startProcess('tests/bench/bare-server.ts');
// The app logs its index build (JSON lines) before it listens.
const built = /"procedures":(\d+),"ms":(\d+)[^\n]*search index built/.exec(app.startup());
console.log(
  `app process: search index of ${built?.[1] ?? '?'} procedures built in ${built?.[2] ?? '?'} ms; resident ${residentMb(app.child.pid!).toFixed(0)} MB after start`,
);
const tech = httpSession(app.url);
await tech.signIn('tom@tallowcreek.example', 'tallow-bench-demo');
const cookie = tech.cookieHeader();
const list = (await tech.get('/api/procedures?limit=200')).body as {
  procedures: { approved: { id: string } | null }[];
};
const readerIds = list.procedures.flatMap((p) => (p.approved ? [p.approved.id] : []));
const pick = <T>(xs: T[]) => xs[Math.floor(Math.random() * xs.length)]!;
const QUERIES = ['B+ reservoir', 'slow-blow fuse', 'heater 6.3 V', 'bleeder', 'xfmr'];

// What the client asks for on each screen of the read mix.
const readPaths = {
  'procedure reader page': () => `/api/revisions/${pick(readerIds)}`,
  'procedure list page': () => `/api/procedures?limit=50&offset=${50 * Math.floor(Math.random() * 40)}`,
  search: () => `/api/search?q=${encodeURIComponent(pick(QUERIES))}`,
};

// The write mix: bench-run entries, each with a fresh idempotency key, spread over several runs
// started (and their hazard notes acknowledged) before the load. Each run takes a row lock per
// entry, so more runs means less queueing behind one run.
const WRITE_RUNS = 25;
type Step = { id: string; kind: string; reading?: { expected: number | null } };
const headers = { 'content-type': 'application/json', cookie, 'x-csrf-token': tech.csrfToken() };
const approvedWithReadings: { revisionId: string; readings: Step[]; hazards: Step[] }[] = [];
async function startRunOn(revisionId: string) {
  const unit = await tech.post('/api/units', {
    model: 'TC-30H',
    serial: `BENCH-${randomUUID().slice(0, 8)}`,
    owner: 'Bench',
    jobNumber: 'J-0',
  });
  const started = await tech.post('/api/runs', {
    revisionId,
    unitId: (unit.body.unit as { id: string }).id,
    mainsVoltage: 230,
    mainsFrequency: 50,
  });
  if (started.status !== 201) throw new Error(`bench run did not start: ${started.status}`);
  return started.body.run as { id: string; steps: Step[] };
}
for (const revisionId of demoRevisionIds) {
  const steps = (await startRunOn(revisionId)).steps;
  if (steps.some((s) => s.kind === 'reading'))
    approvedWithReadings.push({
      revisionId,
      readings: steps.filter((s) => s.kind === 'reading'),
      hazards: steps.filter((s) => s.kind === 'hazard'),
    });
}
const writeTargets: { runId: string; step: Step }[] = [];
for (let i = 0; i < WRITE_RUNS && approvedWithReadings.length; i++) {
  const proc = approvedWithReadings[i % approvedWithReadings.length]!;
  const run = await startRunOn(proc.revisionId);
  for (const h of proc.hazards) {
    const ack = await fetch(`${app.url}/api/runs/${run.id}/entries/${h.id}`, {
      method: 'PUT',
      headers,
      body: JSON.stringify({ key: randomUUID(), done: true }),
    });
    if (ack.status !== 200) throw new Error(`hazard note not acknowledged: ${ack.status}`);
  }
  for (const step of proc.readings) writeTargets.push({ runId: run.id, step });
}
let writeN = 0;
const nextWrite = () => {
  const t = writeTargets[writeN++ % writeTargets.length]!;
  const value = (t.step.reading?.expected ?? 10) * (1 + (writeN % 13) / 1000);
  return {
    path: `/api/runs/${t.runId}/entries/${t.step.id}`,
    body: JSON.stringify({ key: randomUUID(), value, reason: 'bench: reading taken again' }),
  };
};

// Each request alone: the median of serial calls, after a few to warm up.
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
async function serial(label: string, call: () => Promise<Response>) {
  const times: number[] = [];
  let bytes = 0;
  for (let i = 0; i < SERIAL_CALLS + 5; i++) {
    const t0 = performance.now();
    const res = await call();
    const body = await res.arrayBuffer();
    if (!res.ok) throw new Error(`${label}: ${res.status}`);
    if (i >= 5) times.push(performance.now() - t0);
    bytes = body.byteLength;
  }
  console.log(
    `  ${label.padEnd(28)} ${median(times).toFixed(2).padStart(6)} ms   ${(bytes / 1024).toFixed(1).padStart(6)} kB`,
  );
}
console.log(`\nEach request alone — median of ${SERIAL_CALLS} serial calls, response size`);
for (const [label, path] of Object.entries(readPaths))
  await serial(label, () => fetch(app.url + path(), { headers: { cookie } }));
await serial('list filters (facets)', () =>
  fetch(`${app.url}/api/procedures/facets`, { headers: { cookie } }),
);
if (writeTargets.length)
  await serial('bench-run entry write', () => {
    const w = nextWrite();
    return fetch(app.url + w.path, { method: 'PUT', headers, body: w.body });
  });
// The floor of every signed-in request: security headers, request log, session, person, CSRF.
await serial('signed-in floor (session)', () =>
  fetch(`${app.url}/api/auth/session`, { headers: { cookie } }),
);
await serial('bare Express fixed JSON', () => fetch(`${bare.url}/fixed`));

type Result = autocannon.Result;
const pgPids = () => clusterPids(cluster.dataDir);
async function load(title: string, target: string, opts: Partial<autocannon.Options>) {
  const meter = cpuMeter({
    server: () => [target === bare.url ? bare.child.pid! : app.child.pid!],
    postgres: pgPids,
    generator: () => [process.pid],
  });
  const result = await new Promise<Result>((resolve, reject) =>
    autocannon(
      { url: target, connections: CONNECTIONS, duration: DURATION_S, title, ...opts } as autocannon.Options,
      (err, res) => (err ? reject(err) : resolve(res)),
    ),
  );
  return { result, cpu: meter.stop() };
}

const reads = await load('reads', app.url, {
  headers: { cookie },
  requests: Object.values(readPaths).map((path) => ({
    method: 'GET' as const,
    setupRequest: (req: autocannon.Request) => ({ ...req, path: path() }),
  })),
});
// BENCH_EACH=1 also loads each read alone, to see which one holds the mix back.
const each: [string, Awaited<ReturnType<typeof load>>][] = [];
for (const [label, path] of process.env.BENCH_EACH
  ? [...Object.entries(readPaths), ['signed-in floor (session)', () => '/api/auth/session'] as const]
  : []) {
  each.push([
    label,
    await load(label, app.url, {
      headers: { cookie },
      requests: [{ method: 'GET', setupRequest: (req) => ({ ...req, path: path() }) }],
    }),
  ]);
}
const writes = writeTargets.length
  ? await load('writes', app.url, {
      headers,
      requests: [{ method: 'PUT', setupRequest: (req) => ({ ...req, ...nextWrite() }) }],
    })
  : undefined;
const ceiling = await load('bare', bare.url, { url: `${bare.url}/fixed` });

const line = (label: string, { result: r, cpu }: { result: Result; cpu: Record<string, number> }) =>
  console.log(
    `  ${label.padEnd(30)} ${r.requests.average.toFixed(0).padStart(6)} req/s   p50 ${String(r.latency.p50).padStart(4)} ms   p99 ${String(r.latency.p99).padStart(4)} ms   errors ${r.errors + r.timeouts}   non-2xx ${r.non2xx}   CPU server ${cpu.server!.toFixed(0)} %, PostgreSQL ${cpu.postgres!.toFixed(0)} %, generator ${cpu.generator!.toFixed(0)} %`,
  );
console.log(
  `\nUnder load — ${CONNECTIONS} connections, ${DURATION_S} s each; Node ${process.version}, ${os.cpus().length} cores, PostgreSQL on loopback (CPU: % of one core)`,
);
line('read mix (reader/list/search)', reads);
for (const [label, r] of each) line(`  ${label} alone`, r);
if (writes) line(`write mix (entries, ${WRITE_RUNS} runs)`, writes);
else console.log('  write mix: no seeded approved procedure with readings; skipped');
line('bare Express fixed JSON', ceiling);
const ratio = reads.result.requests.average / ceiling.result.requests.average;
console.log(
  `  read throughput / bare: ${ratio.toFixed(2)} (goal ≥ 0.5) — ${ratio >= 0.5 ? 'met' : 'NOT met'}`,
);
console.log(
  `  read p99 ${reads.result.latency.p99} ms (goal < 50 ms) — ${reads.result.latency.p99 < 50 ? 'met' : 'NOT met'}; errors ${reads.result.errors + reads.result.non2xx} (goal 0)`,
);
if (writes) {
  const pool = createPool(url);
  const stored = await pool.query<{ n: number }>(
    `SELECT count(*)::int AS n FROM run_entry_history WHERE reason = 'bench: reading taken again'`,
  );
  await pool.end();
  const w = writes.result;
  console.log(
    `  write p99 ${w.latency.p99} ms (goal < 500 ms) — ${w.latency.p99 < 500 ? 'met' : 'NOT met'}; errors ${w.errors + w.timeouts + w.non2xx} (goal 0)`,
  );
  // Stored = serial probe writes + load 2xx + answers still on the wire when the timer ended.
  const surplus = stored.rows[0]!.n - SERIAL_CALLS - 5 - w['2xx'];
  console.log(
    `  entries stored ${stored.rows[0]!.n} for ${w['2xx']} counted 2xx + ${SERIAL_CALLS + 5} serial (${surplus >= 0 && surplus <= CONNECTIONS ? 'consistent' : 'INCONSISTENT'}: surplus ${surplus} ≤ ${CONNECTIONS} cut off at the end)`,
  );
}

// Open loop: requests at a fixed rate, whatever the answers' pace (autocannon's overallRate), per
// route; the server's CPU per request from /proc, against the bare endpoint's at the same rate.
async function openLoop(target: ChildProcess, url: string, rate: number, req: Partial<autocannon.Options>) {
  const pid = target.pid!;
  const cpu0 = cpuSeconds(pid);
  const result = await new Promise<Result>((resolve, reject) =>
    autocannon(
      {
        url,
        connections: Math.min(CONNECTIONS, rate),
        overallRate: rate,
        duration: DURATION_S,
        ...req,
      } as autocannon.Options,
      (err, res) => (err ? reject(err) : resolve(res)),
    ),
  );
  const cpuMsPerRequest = ((cpuSeconds(pid) - cpu0) * 1000) / Math.max(1, result.requests.total);
  return { result, cpuMsPerRequest };
}
const openRoutes: [string, Partial<autocannon.Options>][] = [
  ...Object.entries(readPaths).map(
    ([label, path]) =>
      [
        label,
        { headers: { cookie }, requests: [{ method: 'GET', setupRequest: (r) => ({ ...r, path: path() }) }] },
      ] as [string, Partial<autocannon.Options>],
  ),
  ['signed-in floor (session)', { url: `${app.url}/api/auth/session`, headers: { cookie } }],
];
console.log(
  `\nOpen loop — fixed rates, ${DURATION_S} s each; server CPU per request (ms, /proc utime+stime, 10 ms ticks)`,
);
for (const rate of RATES) {
  const floor = await openLoop(bare.child, `${bare.url}/fixed`, rate, {});
  const show = (label: string, r: Awaited<ReturnType<typeof openLoop>>) =>
    console.log(
      `  ${String(rate).padStart(4)}/s ${label.padEnd(28)} p50 ${String(r.result.latency.p50).padStart(3)} ms   p99 ${String(r.result.latency.p99).padStart(4)} ms   ${(r.result.requests.total / DURATION_S).toFixed(0).padStart(4)} req/s done   CPU ${r.cpuMsPerRequest.toFixed(2)} ms/req (${(r.cpuMsPerRequest / floor.cpuMsPerRequest).toFixed(1)} × bare)   non-2xx ${r.result.non2xx + r.result.errors}`,
    );
  for (const [label, req] of openRoutes) show(label, await openLoop(app.child, app.url, rate, req));
  show('bare Express fixed JSON', floor);
}
if (writeTargets.length) {
  const w = await openLoop(app.child, app.url, 50, {
    headers,
    requests: [{ method: 'PUT', setupRequest: (req) => ({ ...req, ...nextWrite() }) }],
  });
  console.log(
    `    50/s bench-run entry write          p50 ${w.result.latency.p50} ms   p99 ${w.result.latency.p99} ms (goal < 30 ms)   CPU ${w.cpuMsPerRequest.toFixed(2)} ms/req (goal ≤ 2 ms)   non-2xx ${w.result.non2xx + w.result.errors}`,
  );
}
console.log(`  app process resident at the end: ${residentMb(app.child.pid!).toFixed(0)} MB`);

await Promise.all([stopProcess(app.child), stopProcess(bare.child)]);
stopCluster(cluster.dataDir);
