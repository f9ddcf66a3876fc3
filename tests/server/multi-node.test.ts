// Three app processes behind nginx (round-robin) on one PostgreSQL and one object store (S3 API): what one
// process does, every other sees, and one process killed under a write load loses nothing and
// doubles nothing.
import { createHash, randomUUID } from 'node:crypto';
import { readdirSync } from 'node:fs';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, createPool } from '../../server/db/client';
import { httpSession } from '../support/http-session';
import { startMultiNode, type MultiNode } from '../support/multi-node';
import { tinyPng } from '../support/png';
import { approveRevision } from '../support/review-path';
import { demo } from '../support/test-app';
import { createTestBucket, type TestBucket } from '../support/test-bucket';
import { createTestDatabase } from '../support/test-db';

let database: Awaited<ReturnType<typeof createTestDatabase>>;
let pool: ReturnType<typeof createPool>;
let db: ReturnType<typeof createDb>;
let cluster: MultiNode;
let bucket: TestBucket;

beforeAll(async () => {
  database = await createTestDatabase();
  pool = createPool(database.url);
  db = createDb(pool);
  bucket = await createTestBucket();
  cluster = await startMultiNode(database.url, 3, { s3: bucket.settings });
}, 90_000);
afterAll(async () => {
  await cluster?.stop();
  await bucket?.drop();
  await pool?.end();
  await database?.drop();
});

type Session = ReturnType<typeof httpSession>;
type Answer = { status: number; body: Record<string, unknown> };

/** A request with a session made elsewhere (its cookie and CSRF token), to any base URL. */
function call(
  s: Session,
  base: string,
  method: string,
  path: string,
  body?: unknown,
  headers: Record<string, string> = {},
): Promise<Answer> {
  return fetch(base + path, {
    method,
    headers: {
      'content-type': 'application/json',
      cookie: s.cookieHeader(),
      'x-csrf-token': s.csrfToken(),
      ...headers,
    },
    body: body === undefined ? undefined : JSON.stringify(body),
    signal: AbortSignal.timeout(10_000),
  }).then(
    async (r) => ({ status: r.status, body: (await r.json().catch(() => ({}))) as Record<string, unknown> }),
    () => ({ status: 0, body: {} }),
  );
}

async function signedIn(who: keyof typeof demo, base = cluster.url) {
  const s = httpSession(base);
  expect((await s.signIn(demo[who].email, demo[who].password)).status).toBe(200);
  return s;
}

describe('three app processes behind nginx', () => {
  it('signed in through one process, a person works through the others', async () => {
    const tom = await signedIn('tom', cluster.nodes[0]!.url);
    for (const [i, node] of cluster.nodes.entries()) {
      const session = await call(tom, node.url, 'GET', '/api/auth/session');
      expect((session.body.user as { email: string }).email).toBe(demo.tom.email);
      // A write, with the token given at sign-in by another process.
      const unit = await call(tom, node.url, 'POST', '/api/units', {
        model: 'TC-30H',
        serial: `MN-${i}-${randomUUID().slice(0, 6)}`,
        owner: 'Multi-node drill',
        jobNumber: 'J-3',
      });
      expect(unit.status).toBe(201);
    }
    // …and through nginx, which hands each request to the next process.
    const answers = await Promise.all(
      Array.from({ length: 6 }, () => call(tom, cluster.url, 'GET', '/api/units')),
    );
    expect(answers.map((a) => a.status)).toEqual(Array(6).fill(200));
    // Signed out through one process: no other honours the session after the session read cache (2 s).
    const signOut = await call(tom, cluster.nodes[1]!.url, 'POST', '/api/auth/sign-out');
    expect(signOut.status).toBeLessThan(300);
    await new Promise((r) => setTimeout(r, 2_100));
    for (const node of cluster.nodes)
      expect((await call(tom, node.url, 'GET', '/api/units')).status).toBe(401);
  });

  it('an approval made through one process is found by a search on every process within a second', async () => {
    const hal = await signedIn('hal', cluster.nodes[0]!.url);
    const meta = {
      title: 'TC-5R dial lamp and rectifier check',
      equipmentFamily: 'Table radio',
      equipmentModel: 'TC-5R',
      tags: ['rectifier'],
    };
    const created = await call(hal, cluster.nodes[0]!.url, 'POST', '/api/procedures', meta);
    const rev = created.body.revision as { id: string };
    const saved = await call(hal, cluster.nodes[0]!.url, 'PUT', `/api/revisions/${rev.id}`, {
      ...meta,
      params: { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 },
      lockVersion: 1,
      document: {
        type: 'doc',
        content: [{ type: 'paragraph', content: [{ type: 'text', text: 'The quillometer lamp flickers.' }] }],
      },
    });
    expect(saved.status).toBe(200);
    const tom = await signedIn('tom');
    const found = (node: string) =>
      call(tom, node, 'GET', '/api/search?q=quillometer').then((a) => a.body.total as number);
    for (const node of cluster.nodes) expect(await found(node.url)).toBe(0);

    await approveRevision(db, rev.id);
    const approvedAt = Date.now();
    const elapsed = await Promise.all(
      cluster.nodes.map(async (node) => {
        while (Date.now() - approvedAt < 3_000) {
          if ((await found(node.url)) === 1) return Date.now() - approvedAt;
          await new Promise((r) => setTimeout(r, 25));
        }
        return Infinity;
      }),
    );
    console.log(`the approval was found by each process after ${elapsed.join(', ')} ms`);
    for (const ms of elapsed) expect(ms).toBeLessThan(1_000);
  });

  it('the sign-in limit is counted across processes', async () => {
    // Ten free wrong tries for the account, whichever process checks them…
    const statuses: number[] = [];
    for (let i = 0; i < 10; i++) {
      const s = httpSession(cluster.nodes[i % 3]!.url);
      statuses.push((await s.signIn(demo.priya.email, 'not her password')).status);
    }
    expect(statuses).toEqual(Array(10).fill(401));
    // …then every process makes the next tries wait (429). Each process saw only three or four
    // tries, so a limit kept per process would check them all. The first wait is a second: on a
    // slow machine one try may come after it (and the wait then doubles).
    const next = await Promise.all(
      [0, 1, 2, 0, 1, 2].map((i) =>
        httpSession(cluster.nodes[i]!.url)
          .signIn(demo.priya.email, 'not her password')
          .then((r) => r.status),
      ),
    );
    expect(next.filter((s) => s !== 401 && s !== 429)).toEqual([]);
    expect(next.filter((s) => s === 429).length).toBeGreaterThanOrEqual(5);
  });

  it('an upload through one process lands in the object store and is read back through the others', async () => {
    const hal = await signedIn('hal', cluster.nodes[0]!.url);
    const bytes = tinyPng();
    const form = new FormData();
    form.append('file', new Blob([bytes], { type: 'image/png' }), 'reservoir.png');
    const up = await fetch(`${cluster.nodes[0]!.url}/api/attachments`, {
      method: 'POST',
      headers: { cookie: hal.cookieHeader(), 'x-csrf-token': hal.csrfToken() },
      body: form,
    });
    expect(up.status).toBe(201);
    const { attachment } = (await up.json()) as { attachment: { url: string } };
    // The bytes went to the shared bucket under their SHA-256, not to a process's disk.
    expect(await bucket.store.exists(createHash('sha256').update(bytes).digest('hex'))).toBe(true);
    expect(readdirSync(cluster.uploadDir)).toEqual([]);
    for (const node of cluster.nodes.slice(1)) {
      const res = await fetch(node.url + attachment.url, { headers: { cookie: hal.cookieHeader() } });
      expect(res.status).toBe(200);
      expect(Buffer.from(await res.arrayBuffer()).equals(bytes)).toBe(true);
    }
  });

  it('one process killed in the middle of a write load: no entry lost, none stored twice, the others keep answering', async () => {
    const RUNS = 3;
    const ENTRIES = 120;
    const IN_FLIGHT = 6;
    const KILL_AFTER_ACKS = 30;
    const tom = await signedIn('tom');
    const list = await call(tom, cluster.url, 'GET', '/api/procedures');
    const approved = (list.body.procedures as { approved: { id: string } | null }[]).filter(
      (p) => p.approved,
    );
    type Step = { id: string; kind: string; reading?: { expected: number | null } };
    const newRun = async (revisionId: string) => {
      const unit = await call(tom, cluster.url, 'POST', '/api/units', {
        model: 'TC-30H',
        serial: `MN-K-${randomUUID().slice(0, 8)}`,
        owner: 'Multi-node drill',
        jobNumber: 'J-9',
      });
      const run = await call(tom, cluster.url, 'POST', '/api/runs', {
        revisionId,
        unitId: (unit.body.unit as { id: string }).id,
        mainsVoltage: 230,
        mainsFrequency: 50,
      });
      expect(run.status).toBe(201);
      return run.body.run as { id: string; steps: Step[] };
    };
    let runs: { id: string; steps: Step[] }[] = [];
    for (const p of approved) {
      const first = await newRun(p.approved!.id);
      if (!first.steps.some((s) => s.kind === 'reading')) continue;
      runs = [first];
      for (let i = 1; i < RUNS; i++) runs.push(await newRun(p.approved!.id));
      break;
    }
    expect(runs, 'a seeded approved procedure with readings').toHaveLength(RUNS);
    const readings = runs[0]!.steps.filter((s) => s.kind === 'reading');
    for (const run of runs)
      for (const h of run.steps.filter((s) => s.kind === 'hazard'))
        expect(
          (
            await call(
              tom,
              cluster.url,
              'PUT',
              `/api/runs/${run.id}/entries/${h.id}`,
              { done: true },
              {
                'idempotency-key': randomUUID(),
              },
            )
          ).status,
        ).toBe(200);

    const planned = Array.from({ length: ENTRIES }, (_, i) => {
      const step = readings[i % readings.length]!;
      return {
        key: randomUUID(),
        runId: runs[i % RUNS]!.id,
        stepId: step.id,
        value: (step.reading?.expected ?? 10) * (1 + (i % 7) / 1000),
      };
    });
    // Each client sends its entry until it is acknowledged, always with the same key, as the
    // browser's entry queue does; nginx passes a PUT that met a dead process to the next one.
    const victim = cluster.nodes[1]!;
    let next = 0;
    let acks = 0;
    let refusedOrDropped = 0;
    let replayed = 0;
    const duringKill: number[] = [];
    await Promise.all(
      Array.from({ length: IN_FLIGHT }, async () => {
        while (next < planned.length) {
          const p = planned[next++]!;
          for (let attempt = 0; ; attempt++) {
            const a = await call(
              tom,
              cluster.url,
              'PUT',
              `/api/runs/${p.runId}/entries/${p.stepId}`,
              { value: p.value, reason: 'multi-node drill: reading taken again' },
              { 'idempotency-key': p.key },
            );
            if (victim.child.killed) duringKill.push(a.status);
            if (a.status === 200) {
              if (a.body.replayed) replayed++;
              break;
            }
            refusedOrDropped++;
            expect([0, 502, 503, 504], `entry answered ${a.status}: ${JSON.stringify(a.body)}`).toContain(
              a.status,
            );
            expect(attempt).toBeLessThan(20);
            await new Promise((r) => setTimeout(r, 100));
          }
          if (++acks === KILL_AFTER_ACKS) victim.child.kill('SIGKILL');
        }
      }),
    );
    await victim.exited;
    expect(victim.child.signalCode).toBe('SIGKILL');
    // nginx met the dead process (a request cut off or a refused connection) and went on to the others.
    const victimPort = new URL(victim.url).port;
    expect(cluster.errorLog()).toMatch(
      new RegExp(`upstream: "http://127\\.0\\.0\\.1:${victimPort}/api/runs/`),
    );
    expect(duringKill.filter((s) => s === 200).length, 'entries acknowledged after the kill').toBeGreaterThan(
      ENTRIES - KILL_AFTER_ACKS - 2 * IN_FLIGHT,
    );

    const perKey = await db.execute<{ key: string; n: number }>(sql`
      select idempotency_key::text as key, count(*)::int as n from run_entry_history
      where run_id in (${sql.join(
        runs.map((r) => sql`${r.id}::uuid`),
        sql`, `,
      )}) and step_id in (${sql.join(
        readings.map((s) => sql`${s.id}`),
        sql`, `,
      )}) group by idempotency_key`);
    const counts = new Map(perKey.rows.map((r) => [r.key, r.n]));
    console.log(
      `write load with a kill -9: ${ENTRIES} entries, ${refusedOrDropped} answers not 200 (sent again), ` +
        `${replayed} answered from the stored result (stored before the answer was lost), ` +
        `${perKey.rows.length} keys stored`,
    );
    expect(planned.filter((p) => counts.get(p.key) !== 1)).toEqual([]);
    expect(perKey.rows.length).toBe(ENTRIES);

    // The other processes keep answering, directly and through nginx.
    for (const node of cluster.nodes.filter((n) => n !== victim))
      expect((await call(tom, node.url, 'GET', '/api/units')).status).toBe(200);
    const through = await Promise.all(
      Array.from({ length: 6 }, () => call(tom, cluster.url, 'GET', '/api/units')),
    );
    expect(through.map((a) => a.status)).toEqual(Array(6).fill(200));
  }, 120_000);
});
