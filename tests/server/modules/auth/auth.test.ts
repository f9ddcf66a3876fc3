import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditLog } from '../../../../server/db/schema';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ signInLimits: { perAccount: 4, perAddress: 100, windowMs: 60_000 } });
});
afterAll(() => t.close());

const cookieOf = (res: { headers: Record<string, unknown> }) =>
  ((res.headers['set-cookie'] as string[] | undefined) ?? []).find((c) => c.startsWith('bw.sid='));

describe('sign-in', () => {
  it('refuses a wrong password with 401 and records the failure', async () => {
    const c = t.client();
    const res = await c.signIn(demo.hal.email, 'not-the-password');
    expect(res.status).toBe(401);
    expect(res.body.error).toMatch(/do not match/);
    const rows = await t.db.select().from(auditLog).where(eq(auditLog.action, 'sign-in.failed'));
    expect(rows.some((r) => r.subject === demo.hal.email)).toBe(true);
  });

  it('answers an unknown e-mail exactly like a wrong password', async () => {
    const unknown = await t.client().signIn('nobody@tallowcreek.example', 'whatever-password');
    const wrong = await t.client().signIn(demo.ruth.email, 'whatever-password');
    expect(unknown.status).toBe(wrong.status);
    expect(unknown.body).toEqual(wrong.body);
  });

  it('signs in, issues a new session id and a hardened cookie', async () => {
    const c = t.client();
    const before = await c.refreshToken();
    const anonCookie = cookieOf(before);
    const res = await c.signIn(demo.priya.email, demo.priya.password);
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: demo.priya.email, roles: ['technician'] });
    const signedCookie = cookieOf(res)!;
    expect(signedCookie).toBeDefined();
    expect(signedCookie.split(';')[0]).not.toBe(anonCookie?.split(';')[0]);
    expect(signedCookie).toMatch(/HttpOnly/i);
    expect(signedCookie).toMatch(/SameSite=Lax/i);
    expect(res.body.user).not.toHaveProperty('passwordHash');
  });

  it('sign-out ends the session on the server: the old cookie no longer works', async () => {
    const c = t.client();
    const signedIn = await c.signIn(demo.sam.email, demo.sam.password);
    const cookie = cookieOf(signedIn)!.split(';')[0]!;
    const before = await t.client().agent.get('/api/auth/session').set('Cookie', cookie);
    expect(before.body.user.email).toBe(demo.sam.email);
    expect((await c.post('/api/auth/sign-out')).status).toBe(200);
    // Replay the old cookie from a fresh client.
    const after = await t.client().agent.get('/api/auth/session').set('Cookie', cookie);
    expect(after.body.user).toBeNull();
  });

  it('rate-limits repeated failures for one account with a clear message', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 6; i++)
      statuses.push((await t.client().signIn(demo.dee.email, `wrong-${i}-password`)).status);
    expect(statuses.slice(0, 4)).toEqual([401, 401, 401, 401]);
    const blocked = await t.client().signIn(demo.dee.email, demo.dee.password);
    expect(blocked.status).toBe(429);
    expect(blocked.body.error).toMatch(/Too many failed sign-in attempts/);
  });
});

describe('input and CSRF', () => {
  it('a malformed body gets 400 naming the field', async () => {
    const c = t.client();
    await c.refreshToken();
    const res = await c.post('/api/auth/sign-in').send({ email: 42, password: '' });
    expect(res.status).toBe(400);
    const fields = res.body.fields.map((f: { field: string }) => f.field);
    expect(fields).toContain('body.email');
    expect(fields).toContain('body.password');
  });

  it('invalid JSON gets 400, not 500', async () => {
    const c = t.client();
    await c.refreshToken();
    const res = await c.post('/api/auth/sign-in').set('Content-Type', 'application/json').send('{"email":');
    expect(res.status).toBe(400);
    expect(res.body.error).toMatch(/JSON/);
  });

  it('a state-changing request without the CSRF token gets 403', async () => {
    const c = await t.as('admin');
    const res = await c.agent
      .post('/api/people/invitations')
      .send({ email: 'x@tallowcreek.example', displayName: 'X', roles: ['technician'] });
    expect(res.status).toBe(403);
    const sign = await t
      .client()
      .agent.post('/api/auth/sign-in')
      .send({ email: demo.hal.email, password: demo.hal.password });
    expect(sign.status).toBe(403);
  });

  it('a write from a foreign Origin is refused even with the token', async () => {
    const c = await t.as('admin');
    const res = await c
      .post('/api/people/invitations')
      .set('Origin', 'https://evil.example')
      .send({ email: 'y@tallowcreek.example', displayName: 'Y', roles: ['technician'] });
    expect(res.status).toBe(403);
    const site = await c.post('/api/auth/sign-out').set('Sec-Fetch-Site', 'cross-site');
    expect(site.status).toBe(403);
  });

  it('unknown API routes answer 404 as JSON', async () => {
    const res = await t.client().get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error).toMatch(/No API route/);
  });

  it('responses carry a strict Content-Security-Policy and nosniff', async () => {
    const res = await t.client().get('/api/health');
    expect(res.headers['content-security-policy']).toMatch(/object-src 'none'/);
    expect(res.headers['content-security-policy']).toMatch(/frame-ancestors 'none'/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
  });
});
