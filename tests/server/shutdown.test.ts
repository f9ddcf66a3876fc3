import { spawn } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { projectRoot } from '../../server/bootstrap/prepare';
import { createTestDatabase } from '../support/test-db';

let database: Awaited<ReturnType<typeof createTestDatabase>>;
beforeAll(async () => {
  database = await createTestDatabase();
});
afterAll(() => database.drop());

describe('SIGTERM under load', () => {
  it('finishes the requests in flight and exits 0 within 10 s', async () => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'tests/support/server-process.ts'], {
      cwd: projectRoot,
      env: { ...process.env, DATABASE_URL: database.url },
      stdio: ['ignore', 'pipe', 'inherit'],
    });
    const url = await new Promise<string>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error('server did not start')), 30_000);
      child.stdout!.on('data', (c: Buffer) => {
        const m = /READY (\S+)/.exec(c.toString());
        if (m) {
          clearTimeout(timer);
          resolve(m[1]!);
        }
      });
    });
    const exited = new Promise<{ code: number | null; at: number }>((resolve) =>
      child.on('exit', (code) => resolve({ code, at: Date.now() })),
    );

    // Sessions first; then twenty sign-in attempts at once, each an argon2 verification on the
    // server: real work in flight when the signal arrives.
    const sessions = await Promise.all(
      Array.from({ length: 20 }, async () => {
        const s = await fetch(`${url}/api/auth/session`);
        return {
          cookie: (s.headers.getSetCookie()[0] ?? '').split(';')[0]!,
          csrf: ((await s.json()) as { csrfToken: string }).csrfToken,
        };
      }),
    );
    const inFlight = sessions.map((s, i) =>
      fetch(`${url}/api/auth/sign-in`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', cookie: s.cookie, 'x-csrf-token': s.csrf },
        body: JSON.stringify({ email: `visitor${i}@tallowcreek.example`, password: 'not a real password' }),
      }).then(
        (res) => ({ status: res.status }),
        (err: Error) => ({ status: 0, err: err.message }),
      ),
    );
    // Let every request reach the server (argon2 then keeps them in flight for a while).
    await new Promise((r) => setTimeout(r, 300));
    const signalAt = Date.now();
    child.kill('SIGTERM');
    const results = await Promise.all(inFlight);
    const { code, at } = await exited;

    const answered = results.filter((r) => r.status > 0);
    console.log(
      `ledger: sent ${results.length}, answered ${answered.length} (${[...new Set(answered.map((r) => r.status))].join('/')}), failed ${results.length - answered.length}; exit ${code} after ${at - signalAt} ms`,
    );
    expect(code).toBe(0);
    expect(at - signalAt).toBeLessThan(10_000);
    // Every request sent before the signal is answered; none is cut off.
    expect(results.map((r) => r.status)).toEqual(results.map(() => 401));
  });
});
