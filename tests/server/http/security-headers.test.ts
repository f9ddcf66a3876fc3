import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import argon2 from 'argon2';
import { eq, isNotNull, sql } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { people } from '../../../server/db/schema';
import { createTestApp, demo, type TestApp } from '../../support/test-app';
import { setPasswordTokenMailedTo } from '../../support/mailed-link';

let t: TestApp;
let clientDir: string;
beforeAll(async () => {
  clientDir = mkdtempSync(path.join(tmpdir(), 'bw-client-'));
  mkdirSync(path.join(clientDir, 'assets'));
  writeFileSync(
    path.join(clientDir, 'index.html'),
    '<!doctype html><html><head><title>Benchwright</title><script type="module" src="/assets/app.js"></script></head><body><div id="root"></div></body></html>',
  );
  writeFileSync(path.join(clientDir, 'assets', 'app.js'), 'console.log("bench");\n');
  // Generous sign-in limits: this file signs in (and fails to) many times on purpose.
  t = await createTestApp({
    clientDir,
    signInLimits: { perAccount: 1000, perAddress: 1000, windowMs: 60_000 },
  });
});
afterAll(async () => {
  await t.close();
  rmSync(clientDir, { recursive: true, force: true });
});

type Res = { status: number; headers: Record<string, string | string[] | undefined>; text: string };

function expectHardenedHeaders(res: Res, what: string) {
  const csp = String(res.headers['content-security-policy'] ?? '');
  const directive = (name: string) =>
    csp
      .split(';')
      .map((d) => d.trim())
      .find((d) => d.startsWith(name + ' '));
  expect(directive('object-src'), `${what}: CSP object-src`).toBe("object-src 'none'");
  expect(directive('base-uri'), `${what}: CSP base-uri`).toBe("base-uri 'none'");
  expect(directive('frame-ancestors'), `${what}: CSP frame-ancestors`).toBe("frame-ancestors 'none'");
  expect(res.headers['x-content-type-options'], `${what}: nosniff`).toBe('nosniff');
  expect(res.headers['referrer-policy'], `${what}: Referrer-Policy`).toMatch(
    /^(no-referrer|same-origin|strict-origin(-when-cross-origin)?)$/,
  );
  // This app is reached over plain http: HSTS is for TLS only (tests/server/http/headers.test.ts covers TLS).
  expect(res.headers['strict-transport-security'], `${what}: no HSTS over http`).toBeUndefined();
  expect(res.headers['permissions-policy'], `${what}: Permissions-Policy`).toMatch(/camera=\(\)/);
  expect(res.headers['x-powered-by'], `${what}: no X-Powered-By`).toBeUndefined();
}

/** Nothing of a stack trace, a source path or the underlying error reaches the caller. */
function expectNoInternals(res: Res, what: string) {
  expect(res.text, what).not.toMatch(/\n\s+at |node_modules|\.ts:\d+|\bError:|relation|stack/i);
  expect(Object.keys(JSON.parse(res.text)), `${what}: body fields`).toEqual(['error']);
}

describe('response headers (CSP, nosniff, Referrer-Policy, Permissions-Policy, no HSTS over http, no X-Powered-By)', () => {
  it('on the SPA shell, a client route, a static file, JSON and an API 404', async () => {
    const c = t.client();
    const shell = await c.get('/');
    expect(shell.status).toBe(200);
    expect(shell.headers['content-type']).toMatch(/text\/html/);
    expectHardenedHeaders(shell, 'HTML shell');
    const deepLink = await c.get('/procedures/some-client-route');
    expect(deepLink.text).toContain('<div id="root">');
    expectHardenedHeaders(deepLink, 'client route');
    const asset = await c.get('/assets/app.js');
    expect(asset.status).toBe(200);
    expect(asset.headers['content-type']).toMatch(/javascript/);
    expectHardenedHeaders(asset, 'static file');
    const json = await c.get('/api/health');
    expect(json.status).toBe(200);
    expectHardenedHeaders(json, 'JSON');
    const missing = await c.get('/api/no-such-route');
    expect(missing.status).toBe(404);
    expectHardenedHeaders(missing, 'API 404');
    const missingAsset = await c.get('/assets/nothing-here.js');
    expectHardenedHeaders(missingAsset, 'missing static file');
  });

  it('on a 500 from a failing query: a generic message, no stack, same headers', async () => {
    const tom = await t.as('tom');
    // A schema fault the app cannot explain away as "database down": the table vanishes for a moment.
    await t.ownerDb.execute(sql`alter table units rename to units_away`);
    let res: Res;
    try {
      res = await tom.get('/api/units');
    } finally {
      await t.ownerDb.execute(sql`alter table units_away rename to units`);
    }
    expect(res.status).toBe(500);
    expectHardenedHeaders(res, '500');
    expectNoInternals(res, '500');
    expect((await tom.get('/api/units')).status).toBe(200);
  });

  it('on a 503 when the database pool is gone: not a 500, no stack, same headers', async () => {
    const down = await createTestApp({ clientDir });
    await down.pool.end();
    try {
      const c = down.client();
      const health = await c.get('/api/health');
      expect(health.status).toBe(503);
      expectHardenedHeaders(health, 'health 503');
      const lookup = await c.get('/api/auth/invitations/' + 'x'.repeat(43));
      expect(lookup.status).toBe(503);
      expectHardenedHeaders(lookup, 'route 503');
      expectNoInternals(lookup, 'route 503');
      // The shell is still served, so the client can say the server is struggling.
      expectHardenedHeaders(await c.get('/'), 'shell while the database is away');
    } finally {
      down.pool.end = async () => undefined; // ended above; let close() drop the database
      await down.close();
    }
  });
});

const cookieParts = (setCookie: string[] | undefined, name: string) => {
  const raw = (setCookie ?? []).find((c) => c.startsWith(name + '='));
  if (!raw) return undefined;
  const [pair, ...attrs] = raw.split(';').map((s) => s.trim());
  return { value: pair!.slice(name.length + 1), attrs: attrs.map((a) => a.toLowerCase()) };
};

describe('the session cookie', () => {
  it('behind TLS: an anonymous visitor gets only the __Host-bw.csrf cookie; sign-in gives __Host-bw.sid — Secure, HttpOnly, SameSite, Path=/, no Domain', async () => {
    const tls = await createTestApp({ publicUrl: 'https://bench.tallowcreek.example', trustProxy: 1 });
    try {
      const viaProxy = (r: request.Test) =>
        r.set('X-Forwarded-Proto', 'https').set('Host', 'bench.tallowcreek.example');
      const session = await viaProxy(request(tls.app).get('/api/auth/session'));
      const setCookies = session.headers['set-cookie'] as unknown as string[];
      expect(cookieParts(setCookies, '__Host-bw.sid'), 'no session for an anonymous visitor').toBeUndefined();
      const anon = cookieParts(setCookies, '__Host-bw.csrf');
      expect(anon, 'the anonymous CSRF cookie with the __Host- prefix').toBeDefined();
      expect(anon!.attrs).toEqual(
        expect.arrayContaining(['secure', 'httponly', 'samesite=strict', 'path=/']),
      );
      expect(anon!.attrs.some((a) => a.startsWith('domain='))).toBe(false);
      const signIn = await viaProxy(request(tls.app).post('/api/auth/sign-in'))
        .set('Cookie', `__Host-bw.csrf=${anon!.value}`)
        .set('X-CSRF-Token', session.body.csrfToken)
        .send({ email: demo.tom.email, password: demo.tom.password });
      expect(signIn.status).toBe(200);
      const signed = cookieParts(signIn.headers['set-cookie'] as unknown as string[], '__Host-bw.sid');
      expect(signed!.attrs).toEqual(expect.arrayContaining(['secure', 'httponly', 'samesite=lax', 'path=/']));
      expect(signed!.attrs.some((a) => a.startsWith('domain='))).toBe(false);
      expect(signIn.headers['set-cookie']).toHaveLength(1);
      // Reached over plain http (no TLS at the proxy), it never hands out a Secure cookie.
      const plain = await request(tls.app).get('/api/auth/session');
      expect(plain.headers['set-cookie']).toBeUndefined();
    } finally {
      await tls.close();
    }
  });

  it('over plain http: bw.sid at sign-in, HttpOnly, SameSite=Lax, without Secure', async () => {
    const res = await t.client().signIn(demo.ruth.email, demo.ruth.password);
    expect(res.status).toBe(200);
    const c = cookieParts(res.headers['set-cookie'] as unknown as string[], 'bw.sid');
    expect(c).toBeDefined();
    expect(c!.attrs).toEqual(expect.arrayContaining(['httponly', 'samesite=lax', 'path=/']));
    expect(c!.attrs).not.toContain('secure');
    expect(res.headers['set-cookie']!.toString()).not.toMatch(/__Host-/);
  });
});

/** The cost parameters of a PHC string ($argon2id$v=19$m=…,t=…,p=…$salt$hash), in whatever order they come. */
const costOf = (hash: string) => {
  const [, id, , params, salt, digest] = hash.split('$');
  if (id !== 'argon2id' || !params || !salt || !digest) return null;
  const p = Object.fromEntries(params.split(',').map((kv) => kv.split('=') as [string, string]));
  return { m: Number(p.m), t: Number(p.t), p: Number(p.p) };
};
const hashOf = async (email: string) =>
  (await t.db.select({ h: people.passwordHash }).from(people).where(eq(people.email, email)))[0]!.h!;

describe('password storage (argon2id)', () => {
  it('every stored hash is argon2id with m ≥ 19456 KiB and t ≥ 2', async () => {
    const rows = await t.db
      .select({ email: people.email, h: people.passwordHash })
      .from(people)
      .where(isNotNull(people.passwordHash));
    expect(rows.length).toBeGreaterThanOrEqual(8);
    for (const row of rows) {
      const cost = costOf(row.h!);
      expect(cost, `${row.email}: ${row.h!.slice(0, 30)}`).not.toBeNull();
      expect(cost!.m, row.email).toBeGreaterThanOrEqual(19_456);
      expect(cost!.t, row.email).toBeGreaterThanOrEqual(2);
      expect(cost!.p, row.email).toBeGreaterThanOrEqual(1);
    }
  });

  it('a weaker stored hash is replaced by a strong one at sign-in', async () => {
    const weak = await argon2.hash(demo.sam.password, {
      type: argon2.argon2id,
      memoryCost: 4096,
      timeCost: 1,
      parallelism: 1,
    });
    expect(costOf(weak)).toEqual({ m: 4096, t: 1, p: 1 });
    await t.db.update(people).set({ passwordHash: weak }).where(eq(people.email, demo.sam.email));
    expect((await t.client().signIn(demo.sam.email, demo.sam.password)).status).toBe(200);
    const after = await hashOf(demo.sam.email);
    expect(after).not.toBe(weak);
    expect(costOf(after)!.m).toBeGreaterThanOrEqual(19_456);
    expect(costOf(after)!.t).toBeGreaterThanOrEqual(2);
    expect(await argon2.verify(after, demo.sam.password)).toBe(true);
    expect((await t.client().signIn(demo.sam.email, demo.sam.password)).status).toBe(200);
  });
});

/** n characters (code points) of mixed scripts, ending in a lower-case letter with an upper-case form. */
function passphrase(n: number) {
  const pool = [
    ...'Röhrenverstärker brummt leise · ламповый выпрямитель · 真空管の整流器 · ⚡🔌 ∑ŧ€ ﬁlter øre ',
  ];
  const chars = Array.from({ length: n - 1 }, (_, i) => pool[i % pool.length]!);
  return chars.join('') + 'ä';
}

describe('long Unicode passphrases (ASVS 6.2.8, 6.2.9)', () => {
  it.for([64, 200])(
    'a %i-character passphrase is set through an invitation and signs in; changing only its last character fails',
    async (n) => {
      const password = passphrase(n);
      expect([...password]).toHaveLength(n);
      const admin = await t.as('admin');
      const email = `passphrase-${n}@tallowcreek.example`;
      const invite = await admin
        .post('/api/people/invitations')
        .send({ email, displayName: `Passphrase ${n}`, roles: ['technician'] });
      expect(invite.status).toBe(201);
      const token = await setPasswordTokenMailedTo(t.db, email);
      const anon = t.client();
      await anon.refreshToken();
      const set = await anon.post('/api/auth/set-password').send({ token, password });
      expect(set.status, JSON.stringify(set.body)).toBe(200);
      expect((await t.client().signIn(email, password)).status).toBe(200);
      // Truncation would accept the first; case folding the second.
      for (const last of ['b', 'Ä']) {
        expect(
          (await t.client().signIn(email, password.slice(0, -1) + last)).status,
          `ending in ${last}`,
        ).toBe(401);
      }
    },
  );
});

describe('no account enumeration at sign-in (ASVS 6.3.8)', () => {
  it('an unknown e-mail and a wrong password get the same status and body, in about the same time', async () => {
    const c = t.client();
    await c.refreshToken();
    const attempt = async (email: string) => {
      const start = performance.now();
      const res = await c.post('/api/auth/sign-in').send({ email, password: 'not the right passphrase' });
      return { ms: performance.now() - start, status: res.status, body: res.body as unknown };
    };
    const unknownEmail = 'nobody-here@tallowcreek.example';
    // Warm up both paths (the dummy hash is made on first use).
    for (let i = 0; i < 3; i++) {
      await attempt(unknownEmail);
      await attempt(demo.ruth.email);
    }
    const unknown: number[] = [];
    const wrong: number[] = [];
    // Interleaved, so load on the machine hits both series alike.
    for (let i = 0; i < 15; i++) {
      const u = await attempt(unknownEmail);
      const w = await attempt(demo.ruth.email);
      expect(u.status).toBe(401);
      expect(w.status).toBe(401);
      expect(u.body).toEqual(w.body);
      unknown.push(u.ms);
      wrong.push(w.ms);
    }
    const median = (xs: number[]) => {
      const s = [...xs].sort((a, b) => a - b);
      return (s[Math.floor((s.length - 1) / 2)]! + s[Math.ceil((s.length - 1) / 2)]!) / 2;
    };
    const mu = median(unknown);
    const mw = median(wrong);
    const tolerance = Math.max(10, 0.25 * Math.max(mu, mw));
    console.log(
      `sign-in median latency over 15 tries: unknown e-mail ${mu.toFixed(1)} ms, wrong password ${mw.toFixed(1)} ms; difference ${Math.abs(mu - mw).toFixed(1)} ms, allowed ${tolerance.toFixed(1)} ms`,
    );
    expect(Math.abs(mu - mw)).toBeLessThanOrEqual(tolerance);
  });
});
