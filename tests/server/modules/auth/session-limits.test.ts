// Session lifetime (ASVS 5.0 7.3.1 idle and 7.3.2 absolute timeouts; 7.4.1 logout ends the session
// server-side): with the limits shortened to seconds so the test can wait them out.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { session as sessionTable } from '../../../../server/db/schema';
import { createTestApp, type TestApp } from '../../../support/test-app';

const IDLE_MS = 3_000; // renewal interval: IDLE_MS / 10
const ABSOLUTE_MS = 7_000;
const READ_CACHE_MS = 2_000; // SESSION_READ_CACHE_MS in server/auth/session.ts

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ sessionIdleMs: IDLE_MS, sessionAbsoluteMs: ABSOLUTE_MS });
});
afterAll(() => t.close());

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const signedIn = async (c: Awaited<ReturnType<TestApp['as']>>) =>
  (await c.get('/api/auth/session')).body.user !== null;
const setCookie = (res: { headers: Record<string, unknown> }) =>
  (res.headers['set-cookie'] as string[] | undefined) ?? [];

describe('session limits', () => {
  it('activity keeps a session past the idle limit; the cookie is re-sent only when the limit moves', async () => {
    const c = await t.as('tom');
    const started = Date.now();
    let renewals = 0;
    let quiet = 0;
    while (Date.now() - started < IDLE_MS + 1_500) {
      const res = await c.get('/api/procedures');
      expect(res.status).toBe(200);
      const cookies = setCookie(res);
      if (cookies.length) {
        renewals++;
        // A renewed cookie carries the new idle limit as its expiry.
        const expires = Date.parse(/Expires=([^;]+)/.exec(cookies[0]!)![1]!);
        expect(expires).toBeGreaterThan(Date.now() + IDLE_MS - 2_000);
      } else quiet++;
      await sleep(100);
    }
    expect(renewals).toBeGreaterThan(0);
    // Most requests write nothing: no Set-Cookie (and no database write) between renewals.
    expect(quiet).toBeGreaterThan(renewals);
    expect(await signedIn(c)).toBe(true);
  });

  it('an idle session ends at the idle limit', async () => {
    const c = await t.as('tom');
    expect(await signedIn(c)).toBe(true);
    await sleep(IDLE_MS + 300);
    expect(await signedIn(c)).toBe(false);
    expect((await c.get('/api/procedures')).status).toBe(401);
  });

  it('an active session ends at the absolute limit', async () => {
    const c = await t.as('tom');
    const started = Date.now();
    while (Date.now() - started < ABSOLUTE_MS - 1_000) {
      expect((await c.get('/api/procedures')).status).toBe(200);
      await sleep(250);
    }
    await sleep(1_500);
    expect((await c.get('/api/procedures')).status).toBe(401);
  }, 15_000);

  it('a save still in flight when the session is signed out does not bring it back', async () => {
    const c = await t.as('tom');
    const sid = decodeURIComponent(
      c.agent.jar.getCookie('bw.sid', { path: '/', domain: '127.0.0.1', secure: false, script: false })!
        .value,
    )
      .slice(2)
      .split('.')[0]!;
    const store = t.app.deps.auth.sessions.store;
    // A request loaded the session (as express-session does, through load → createSession)…
    const loaded = await new Promise<import('express-session').Session & Record<string, unknown>>(
      (resolve, reject) =>
        store.load(sid, (err, s) =>
          err || !s ? reject(err ?? new Error('no session')) : resolve(s as never),
        ),
    );
    // …the person signs out meanwhile…
    await new Promise<void>((resolve) => store.destroy(sid, () => resolve()));
    // …and that request then saves its copy (an idle-limit renewal, say).
    loaded.renewedAt = Date.now();
    await new Promise<void>((resolve, reject) =>
      store.set(sid, loaded as never, (err) => (err ? reject(err) : resolve())),
    );
    const rows = await t.ownerDb.select().from(sessionTable).where(eq(sessionTable.sid, sid));
    expect(rows).toEqual([]);
    expect((await c.get('/api/procedures')).status).toBe(401);
  });

  it('sign-out ends the session at once; a session removed by another process ends within the read cache time', async () => {
    const c = await t.as('tom');
    expect(await signedIn(c)).toBe(true);
    expect((await c.post('/api/auth/sign-out').send({})).status).toBe(200);
    expect((await c.get('/api/procedures')).status).toBe(401);

    const other = await t.as('priya');
    expect(await signedIn(other)).toBe(true);
    // What another server process's sign-out does: the row goes from PostgreSQL.
    await t.db.delete(sessionTable);
    await sleep(READ_CACHE_MS + 100);
    expect((await other.get('/api/procedures')).status).toBe(401);
  });
});
