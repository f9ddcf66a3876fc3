// Drill A: PostgreSQL stopped and started again under a steady stream of reads and bench-run entry
// writes. The server must stay up, answer 503 (never 500, never hang) while the database is away,
// serve normally within 5 s of its return, and hold every acknowledged write exactly once.
import { execFile } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import { promisify } from 'node:util';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PORTS, prepareDatabase, projectRoot, testClusterName } from '../../server/bootstrap/prepare';
import {
  pgBinDir,
  recreateDatabase,
  startCluster,
  stopCluster,
  type Cluster,
} from '../../server/bootstrap/postgres';
import { startServer, type RunningServer } from '../../server/index';
import { createLogger } from '../../server/logger';
import { httpSession } from '../support/http-session';
import { demo } from '../support/test-app';

// A cluster of its own (the port after health's and restore's): this test stops it under load.
const options = { name: testClusterName('faultdb'), port: PORTS.healthDb + 2, projectRoot };
const CONNECT_TIMEOUT_MS = 3_000; // the pool's connectionTimeoutMillis (server/db/client.ts)
const WORKERS = 6;
const HEALTHY_MS = 3_000;
const DOWN_MS = 4_000;
const AFTER_MS = 9_000;

let cluster: Cluster;
let server: RunningServer | undefined;
let url: string;
beforeAll(async () => {
  cluster = startCluster(options);
  await recreateDatabase(cluster.adminUrl, 'benchwright_faultdb');
  url = await prepareDatabase(cluster, 'benchwright_faultdb');
  server = await startServer({
    databaseUrl: url,
    port: 0,
    logger: createLogger(process.env.FAULT_LOG ?? 'silent'),
    config: { sessionSecret: 'fault-db'.padEnd(40, 'x') },
  });
});
afterAll(async () => {
  await server?.close();
  stopCluster(cluster.dataDir);
});

// pg_ctl without blocking the event loop: the server under test shares this process, and the
// synchronous stopCluster/startCluster would freeze it for the length of the stop or start.
const run = promisify(execFile);
const pgCtl = (args: string[]) => {
  const bin = path.join(pgBinDir(), 'pg_ctl');
  return process.getuid?.() === 0 ? run('runuser', ['-u', 'postgres', '--', bin, ...args]) : run(bin, args);
};

type Sample = {
  at: number;
  kind: 'read' | 'write';
  status: number;
  ms: number;
  key?: string;
  error?: string;
};

describe('PostgreSQL restart under a stream of reads and writes', () => {
  it('answers 503 while the database is away, recovers within 5 s and keeps every acknowledged write once', async () => {
    const base = server!.url;
    const tom = httpSession(base);
    expect((await tom.signIn(demo.tom.email, demo.tom.password)).status).toBe(200);
    const headers = () => ({
      'content-type': 'application/json',
      cookie: tom.cookieHeader(),
      'x-csrf-token': tom.csrfToken(),
    });

    // Bench runs on a seeded approved procedure; hazard notes acknowledged so no reading is gated.
    const list = (await tom.get('/api/procedures')).body as {
      procedures: { id: string; approved: { id: string } | null }[];
    };
    type Step = { id: string; kind: string; reading?: { expected: number | null } };
    const runs: { id: string; readings: Step[] }[] = [];
    for (const p of list.procedures.filter((x) => x.approved)) {
      const unit = await tom.post('/api/units', {
        model: 'TC-30H',
        serial: `PG-${randomUUID().slice(0, 8)}`,
        owner: 'Drill',
        jobNumber: 'J-7',
      });
      expect(unit.status).toBe(201);
      const res = await tom.post('/api/runs', {
        revisionId: p.approved!.id,
        unitId: (unit.body.unit as { id: string }).id,
        mainsVoltage: 230,
        mainsFrequency: 50,
      });
      expect(res.status).toBe(201);
      const r = res.body.run as { id: string; steps: Step[] };
      for (const h of r.steps.filter((s) => s.kind === 'hazard')) {
        const ack = await fetch(`${base}/api/runs/${r.id}/entries/${h.id}`, {
          method: 'PUT',
          headers: headers(),
          body: JSON.stringify({ key: randomUUID(), done: true }),
        });
        expect(ack.status).toBe(200);
      }
      if (r.steps.some((s) => s.kind === 'reading'))
        runs.push({ id: r.id, readings: r.steps.filter((s) => s.kind === 'reading') });
    }
    expect(runs.length).toBeGreaterThan(0);
    const procedureIds = list.procedures.map((p) => p.id);

    const t0 = Date.now();
    const samples: Sample[] = [];
    const writes = new Map<string, { runId: string; stepId: string; value: number }>();
    let n = 0;
    let stopAt = Infinity;
    const timeLimit = t0 + HEALTHY_MS + DOWN_MS + AFTER_MS + 30_000; // hard bound whatever happens

    const oneRequest = async () => {
      const i = n++;
      const at = Date.now() - t0;
      const started = performance.now();
      let kind: Sample['kind'] = 'read';
      let key: string | undefined;
      let req: Promise<Response>;
      const signal = AbortSignal.timeout(CONNECT_TIMEOUT_MS + 6_000);
      if (i % 2 === 0) {
        kind = 'write';
        key = randomUUID();
        const r = runs[i % runs.length]!;
        const step = r.readings[(i >> 1) % r.readings.length]!;
        const w = {
          runId: r.id,
          stepId: step.id,
          value: (step.reading?.expected ?? 10) * (1 + (i % 11) / 1000),
        };
        writes.set(key, w);
        req = fetch(`${base}/api/runs/${w.runId}/entries/${w.stepId}`, {
          method: 'PUT',
          headers: headers(),
          body: JSON.stringify({ key, value: w.value, reason: 'fault drill: reading taken again' }),
          signal,
        });
      } else {
        const path = [
          `/api/procedures/${procedureIds[i % procedureIds.length]}`,
          `/api/runs/${runs[i % runs.length]!.id}`,
          '/api/procedures',
          '/api/health',
        ][(i >> 1) % 4]!;
        req = fetch(base + path, { headers: headers(), signal });
      }
      const sample: Sample = await req.then(
        async (res) => {
          await res.arrayBuffer();
          return { at, kind, key, status: res.status, ms: performance.now() - started };
        },
        (err: Error) => ({
          at,
          kind,
          key,
          status: 0,
          ms: performance.now() - started,
          error: `${err.message} ${(err.cause as Error | undefined)?.message ?? ''}`.trim(),
        }),
      );
      samples.push(sample);
    };
    const load = Promise.all(
      Array.from({ length: WORKERS }, async () => {
        while (Date.now() < stopAt && Date.now() < timeLimit) {
          await oneRequest();
          // A short pause keeps the pace steady while the database is away and answers are instant.
          await new Promise((r) => setTimeout(r, 10));
        }
      }),
    );

    await new Promise((r) => setTimeout(r, HEALTHY_MS));
    const stopBegan = Date.now() - t0;
    await pgCtl(['stop', '-D', cluster.dataDir, '-m', 'fast', '-w']);
    const stopped = Date.now() - t0;
    await new Promise((r) => setTimeout(r, DOWN_MS));
    const startBegan = Date.now() - t0;
    await pgCtl([
      'start',
      '-D',
      cluster.dataDir,
      '-w',
      '-t',
      '60',
      '-l',
      path.join(cluster.dataDir, 'server.log'),
      '-o',
      `-p ${options.port}`,
    ]);
    const recovered = Date.now() - t0;
    stopAt = Date.now() + AFTER_MS;
    await load;

    // Ledger: statuses per second, with the database's phases marked.
    const seconds = Math.ceil(Math.max(...samples.map((s) => s.at)) / 1000);
    const lines = [
      `ledger (PostgreSQL restart): stop ${stopBegan}–${stopped} ms, down until ${startBegan} ms, back at ${recovered} ms`,
    ];
    for (let s = 0; s < seconds; s++) {
      const inSecond = samples.filter((x) => Math.floor(x.at / 1000) === s);
      const byStatus = new Map<number, number>();
      for (const x of inSecond) byStatus.set(x.status, (byStatus.get(x.status) ?? 0) + 1);
      const phase =
        (s + 1) * 1000 <= stopBegan
          ? 'up'
          : s * 1000 >= stopped && (s + 1) * 1000 <= startBegan
            ? 'down'
            : s * 1000 >= recovered
              ? 'back'
              : 'edge';
      const worst = Math.max(0, ...inSecond.map((x) => x.ms));
      lines.push(
        `  ${String(s).padStart(2)} s ${phase.padEnd(4)} ${[...byStatus]
          .sort(([a], [b]) => a - b)
          .map(([k, v]) => `${k}×${v}`)
          .join(' ')
          .padEnd(22)} slowest ${worst.toFixed(0)} ms`,
      );
    }

    // Like the client's outbox: resend every write that was not acknowledged, with its own key.
    const unacked = samples.filter((s) => s.kind === 'write' && s.status !== 200);
    const resent: { status: number; replayed?: boolean }[] = [];
    let cursor = 0;
    await Promise.all(
      Array.from({ length: WORKERS }, async () => {
        while (cursor < unacked.length) {
          const key = unacked[cursor++]!.key!;
          const w = writes.get(key)!;
          const res = await fetch(`${base}/api/runs/${w.runId}/entries/${w.stepId}`, {
            method: 'PUT',
            headers: headers(),
            body: JSON.stringify({ key, value: w.value, reason: 'fault drill: reading taken again' }),
            signal: AbortSignal.timeout(10_000),
          });
          resent.push({
            status: res.status,
            replayed: ((await res.json()) as { replayed?: boolean }).replayed,
          });
        }
      }),
    );

    const db = new pg.Client({ connectionString: url });
    await db.connect();
    let counts: Map<string, number>;
    try {
      const { rows } = await db.query<{ key: string; n: number }>(
        `SELECT idempotency_key::text AS key, count(*)::int AS n FROM run_entry_history WHERE run_id = ANY($1::uuid[]) AND step_id = ANY($2::text[]) GROUP BY idempotency_key`,
        [runs.map((r) => r.id), [...new Set(runs.flatMap((r) => r.readings.map((s) => s.id)))]],
      );
      counts = new Map(rows.map((r) => [r.key, r.n]));
    } finally {
      await db.end();
    }
    const acked = samples.filter((s) => s.kind === 'write' && s.status === 200);
    const byStatus = (xs: Sample[]) =>
      [...new Set(xs.map((x) => x.status))]
        .sort()
        .map((st) => `${st}×${xs.filter((x) => x.status === st).length}`)
        .join(' ');
    lines.push(
      `  totals: ${samples.length} requests (${byStatus(samples)}); writes acknowledged ${acked.length}, not acknowledged ${unacked.length} ` +
        `(resent ${resent.length}: ${resent.filter((r) => r.replayed).length} had been committed); keys in database ${counts.size}, duplicated ${[...counts.values()].filter((v) => v > 1).length}`,
    );
    console.log(lines.join('\n'));

    // The process stayed up and kept answering: no dropped connections, no 500s, nothing slow.
    expect(samples.filter((s) => s.status === 0)).toEqual([]);
    expect(samples.filter((s) => s.status >= 500 && s.status !== 503)).toEqual([]);
    expect(samples.filter((s) => s.ms > CONNECT_TIMEOUT_MS + 1_000)).toEqual([]);
    // While the database was fully away, every request that reached it was a 503.
    const duringOutage = samples.filter(
      (s) => s.at >= stopped && s.at + s.ms < startBegan && s.kind === 'write',
    );
    expect(duringOutage.length).toBeGreaterThan(0);
    expect(duringOutage.every((s) => s.status === 503)).toBe(true);
    // From 5 s after the database is back, everything succeeds; the last 4 s have no 5xx at all.
    const late = samples.filter((s) => s.at >= recovered + 5_000);
    expect(late.length).toBeGreaterThan(20);
    expect(late.filter((s) => s.status !== 200)).toEqual([]);
    // Every acknowledged write is stored exactly once; resends of the rest land once too.
    for (const s of acked) expect(counts.get(s.key!), s.key).toBe(1);
    expect(resent.every((r) => r.status === 200)).toBe(true);
    for (const s of unacked) expect(counts.get(s.key!), s.key).toBe(1);
    expect(counts.size).toBe(writes.size);
  }, 90_000);
});
