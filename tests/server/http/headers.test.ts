/**
 * Response headers: HSTS only over TLS; no API answer kept by a cache; powerful browser features
 * off; a request for a host name the app does not serve is answered 421 before anything runs.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../support/test-app';

let plain: TestApp;
let tls: TestApp;
beforeAll(async () => {
  plain = await createTestApp();
  tls = await createTestApp({
    publicUrl: 'https://bench.tallowcreek.example',
    trustProxy: 1,
    allowedHosts: ['bench.tallowcreek.example'],
  });
});
afterAll(async () => {
  await plain.close();
  await tls.close();
});

describe('headers', () => {
  it('over plain http there is no Strict-Transport-Security; behind TLS there is', async () => {
    const r = await plain.client().get('/api/health');
    expect(r.headers['strict-transport-security']).toBeUndefined();
    const s = await tls
      .client()
      .get('/api/health')
      .set('X-Forwarded-Proto', 'https')
      .set('Host', 'bench.tallowcreek.example');
    expect(s.headers['strict-transport-security']).toMatch(/max-age=\d+/);
  });

  it('API answers carrying personal data are not stored by caches; a Permissions-Policy switches off unused features', async () => {
    const tom = await plain.as('tom');
    for (const path of ['/api/auth/session', '/api/units', '/api/runs']) {
      const r = await tom.get(path);
      expect(r.status, path).toBe(200);
      expect(r.headers['cache-control'], path).toBe('no-store');
      expect(r.headers['permissions-policy'], path).toMatch(/camera=\(\)/);
    }
  });

  it('a request naming another host is 421 (DNS rebinding, a misrouted proxy); configured and loopback names are served', async () => {
    const evil = await plain.client().get('/api/health').set('Host', 'attacker.example');
    expect(evil.status).toBe(421);
    expect((await plain.client().get('/api/health').set('Host', 'localhost')).status).toBe(200);
    expect((await tls.client().get('/api/health').set('Host', 'bench.tallowcreek.example')).status).toBe(200);
    expect((await tls.client().get('/api/health').set('Host', 'other.tallowcreek.example')).status).toBe(421);
  });
});
