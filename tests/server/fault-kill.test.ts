// Drill B: kill -9 the server in the middle of a stream of bench-run entries, start it again on the
// same database, resend what was not acknowledged (and some that were) with the same keys, and prove
// from the database that every acknowledged entry is stored exactly once and nothing is doubled.
import { spawn, type ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { projectRoot } from '../../server/bootstrap/prepare';
import { httpSession } from '../support/http-session';
import { demo } from '../support/test-app';
import { createTestDatabase } from '../support/test-db';

const RUNS = 4;
const ENTRIES = 240;
const IN_FLIGHT = 8;
const KILL_AFTER_ACKS = 60;
const RESEND_ACKED = 25;

let database: Awaited<ReturnType<typeof createTestDatabase>>;
const children: ChildProcess[] = [];
beforeAll(async () => {
  database = await createTestDatabase();
});
afterAll(async () => {
  for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill('SIGKILL');
  await database.drop();
});

async function startChild() {
  const child = spawn(process.execPath, ['--import', 'tsx', 'tests/support/server-process.ts'], {
    cwd: projectRoot,
    env: { ...process.env, DATABASE_URL: database.url },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  children.push(child);
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const url = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error('server did not start within 30 s')), 30_000);
    child.once('exit', (code) => reject(new Error(`server exited early with ${code}`)));
    child.stdout!.on('data', (c: Buffer) => {
      const m = /READY (\S+)/.exec(c.toString());
      if (m) {
        clearTimeout(timer);
        resolve(m[1]!);
      }
    });
  });
  return { child, url, exited };
}

type Planned = { key: string; runId: string; stepId: string; value: number };
type Outcome = { status: number; replayed?: boolean };

describe('kill -9 of the server mid-stream of bench-run entries', () => {
  it('keeps every acknowledged entry exactly once after a restart and resend with the same keys', async () => {
    let server = await startChild();
    // Sessions live in PostgreSQL, so the cookie and CSRF token survive the restart.
    const tom = httpSession(server.url);
    expect((await tom.signIn(demo.tom.email, demo.tom.password)).status).toBe(200);
    const put = (base: string, p: Planned) =>
      fetch(`${base}/api/runs/${p.runId}/entries/${p.stepId}`, {
        method: 'PUT',
        headers: {
          'content-type': 'application/json',
          cookie: tom.cookieHeader(),
          'x-csrf-token': tom.csrfToken(),
        },
        body: JSON.stringify({ key: p.key, value: p.value, reason: 'fault drill: reading taken again' }),
        signal: AbortSignal.timeout(10_000),
      }).then(
        async (res): Promise<Outcome> => ({
          status: res.status,
          replayed: ((await res.json().catch(() => ({}))) as { replayed?: boolean }).replayed,
        }),
        (): Outcome => ({ status: 0 }),
      );

    // A seeded approved procedure with readings; a few runs on it, hazard notes acknowledged up front
    // so no reading is gated.
    const list = (await tom.get('/api/procedures')).body as {
      procedures: { id: string; approved: { id: string } | null }[];
    };
    const approved = list.procedures.filter((p) => p.approved);
    expect(approved.length).toBeGreaterThan(0);
    type Step = { id: string; kind: string; reading?: { expected: number | null } };
    let revisionId = '';
    let steps: Step[] = [];
    for (const p of approved) {
      const unit = await tom.post('/api/units', {
        model: 'TC-30H',
        serial: `K9-${randomUUID().slice(0, 8)}`,
        owner: 'Drill',
        jobNumber: 'J-9',
      });
      expect(unit.status).toBe(201);
      const res = await tom.post('/api/runs', {
        revisionId: p.approved!.id,
        unitId: (unit.body.unit as { id: string }).id,
        mainsVoltage: 230,
        mainsFrequency: 50,
      });
      expect(res.status).toBe(201);
      steps = (res.body.run as { steps: Step[] }).steps;
      if (steps.some((s) => s.kind === 'reading')) {
        revisionId = p.approved!.id;
        break;
      }
    }
    expect(revisionId, 'a seeded approved procedure with readings').not.toBe('');
    const readings = steps.filter((s) => s.kind === 'reading');
    const runIds: string[] = [];
    for (let i = 0; i < RUNS; i++) {
      const unit = await tom.post('/api/units', {
        model: 'TC-30H',
        serial: `K9-${randomUUID().slice(0, 8)}`,
        owner: 'Drill',
        jobNumber: 'J-9',
      });
      const res = await tom.post('/api/runs', {
        revisionId,
        unitId: (unit.body.unit as { id: string }).id,
        mainsVoltage: 230,
        mainsFrequency: 50,
      });
      expect(res.status).toBe(201);
      const runId = (res.body.run as { id: string }).id;
      runIds.push(runId);
      for (const h of steps.filter((s) => s.kind === 'hazard')) {
        const ack = await fetch(`${server.url}/api/runs/${runId}/entries/${h.id}`, {
          method: 'PUT',
          headers: {
            'content-type': 'application/json',
            cookie: tom.cookieHeader(),
            'x-csrf-token': tom.csrfToken(),
          },
          body: JSON.stringify({ key: randomUUID(), done: true }),
        });
        expect(ack.status).toBe(200);
      }
    }

    const planned: Planned[] = Array.from({ length: ENTRIES }, (_, i) => {
      const step = readings[i % readings.length]!;
      // Distinct values, so each entry is a new version of the step's reading.
      return {
        key: randomUUID(),
        runId: runIds[i % RUNS]!,
        stepId: step.id,
        value: (step.reading?.expected ?? 10) * (1 + (i % 7) / 1000),
      };
    });
    const first = new Map<string, Outcome>();

    // The stream: IN_FLIGHT workers; the kill lands when KILL_AFTER_ACKS answers are in, with
    // requests still on the wire. After it, nothing new is sent to the dead server.
    let next = 0;
    let acks = 0;
    let killed = false;
    const killedServer = server;
    await Promise.all(
      Array.from({ length: IN_FLIGHT }, async () => {
        while (!killed && next < planned.length) {
          const p = planned[next++]!;
          const out = await put(killedServer.url, p);
          first.set(p.key, out);
          if (out.status === 200 && ++acks >= KILL_AFTER_ACKS && !killed) {
            killed = true;
            killedServer.child.kill('SIGKILL');
          }
        }
      }),
    );
    await killedServer.exited;
    expect(killedServer.child.signalCode).toBe('SIGKILL');

    const acked = planned.filter((p) => first.get(p.key)?.status === 200);
    const failed = planned.filter((p) => first.has(p.key) && first.get(p.key)!.status !== 200);
    const unsent = planned.filter((p) => !first.has(p.key));
    // Nothing but 200 or a dropped connection: no 4xx/5xx from the live server before the kill.
    expect(failed.every((p) => first.get(p.key)!.status === 0)).toBe(true);
    expect(failed.length, 'requests were still in flight when the kill landed').toBeGreaterThan(0);

    server = await startChild();
    const resend = [...failed, ...unsent, ...acked.slice(0, RESEND_ACKED)];
    const second = new Map<string, Outcome>();
    let cursor = 0;
    await Promise.all(
      Array.from({ length: IN_FLIGHT }, async () => {
        while (cursor < resend.length) {
          const p = resend[cursor++]!;
          second.set(p.key, await put(server.url, p));
        }
      }),
    );
    expect([...second.values()].every((o) => o.status === 200)).toBe(true);
    // An acknowledged entry sent again is a replay, never a second row.
    for (const p of acked.slice(0, RESEND_ACKED)) expect(second.get(p.key)!.replayed).toBe(true);
    const committedUnacked = failed.filter((p) => second.get(p.key)!.replayed).length;

    // The database, read directly.
    const db = new pg.Client({ connectionString: database.url });
    await db.connect();
    try {
      const { rows: perKey } = await db.query<{ key: string; n: number }>(
        `SELECT idempotency_key::text AS key, count(*)::int AS n FROM run_entry_history
          WHERE run_id = ANY($1::uuid[]) AND step_id = ANY($2::text[]) GROUP BY idempotency_key`,
        [runIds, readings.map((s) => s.id)],
      );
      const counts = new Map(perKey.map((r) => [r.key, r.n]));
      const plannedKeys = new Set(planned.map((p) => p.key));
      const found = planned.filter((p) => counts.get(p.key) === 1).length;
      const duplicated = perKey.filter((r) => r.n > 1).length;
      const strangers = perKey.filter((r) => !plannedKeys.has(r.key)).length;
      // Each entry's version equals its number of history rows, numbered 1..n: no torn writes.
      const { rows: torn } = await db.query(
        `SELECT e.id FROM run_entries e JOIN run_entry_history h ON h.entry_id = e.id
          WHERE e.run_id = ANY($1::uuid[])
          GROUP BY e.id, e.version
         HAVING count(*) <> e.version OR count(DISTINCT h.version) <> e.version OR max(h.version) <> e.version`,
        [runIds],
      );

      console.log(
        `ledger (kill -9): planned ${planned.length}; sent before kill ${first.size}; acknowledged before kill ${acked.length}; ` +
          `failed (in flight at kill) ${failed.length}, of which committed but unacknowledged ${committedUnacked}; not yet sent ${unsent.length}; ` +
          `resent ${resend.length} (${failed.length + unsent.length} unacknowledged + ${Math.min(RESEND_ACKED, acked.length)} acknowledged); ` +
          `found in database exactly once ${found}; duplicated keys ${duplicated}; unknown keys ${strangers}; torn entries ${torn.length}`,
      );
      for (const p of acked) expect(counts.get(p.key), p.key).toBe(1);
      expect(found).toBe(planned.length);
      expect(duplicated).toBe(0);
      expect(strangers).toBe(0);
      expect(torn).toEqual([]);
    } finally {
      await db.end();
    }

    server.child.kill('SIGTERM');
    await server.exited;
  }, 120_000);
});
