import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES } from '../../../shared/schemas/roles';
import { routeTable } from '../../../server/routes';
import { createTestApp, type TestApp } from '../../support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const key = (method: string, path: string) => `${method.toUpperCase()} ${path}`;
const fillParams = (path: string) =>
  path.replace(/:(\w+)/g, (_m, name: string) =>
    name === 'token' ? 'x'.repeat(43) : '00000000-0000-4000-8000-000000000000',
  );

describe('the route table', () => {
  it('every route declares who may call it', () => {
    for (const r of routeTable) {
      const ok =
        r.access === 'public' ||
        r.access === 'signed-in' ||
        (Array.isArray(r.access) &&
          r.access.length > 0 &&
          r.access.every((a) => (ROLES as readonly string[]).includes(a)));
      expect(ok, `${key(r.method, r.path)} has access ${JSON.stringify(r.access)}`).toBe(true);
      expect(r.summary.length, `${key(r.method, r.path)} needs a summary`).toBeGreaterThan(5);
    }
  });

  it('every route mounted on the API router is in the table, and nothing else is', () => {
    const router = t.app.apiRouter;
    const mounted = router.stack
      .filter((layer) => layer.route)
      .flatMap((layer) =>
        Object.keys((layer.route as unknown as { methods: Record<string, boolean> }).methods).map((m) =>
          key(m, layer.route!.path as string),
        ),
      );
    expect(mounted.sort()).toEqual(routeTable.map((r) => key(r.method, r.path)).sort());
  });

  it('every non-public route answers 401 JSON to an anonymous caller', async () => {
    const anon = t.client();
    await anon.refreshToken();
    for (const r of routeTable.filter((x) => x.access !== 'public')) {
      const url = '/api' + fillParams(r.path);
      const res = r.method === 'get' ? await anon.get(url) : await anon[r.method](url).send({});
      expect(res.status, key(r.method, r.path)).toBe(401);
      expect(typeof res.body.error, key(r.method, r.path)).toBe('string');
    }
  });

  it('every role-restricted route answers 403 to a signed-in person without the role', async () => {
    const tech = await t.as('tom');
    for (const r of routeTable.filter((x) => Array.isArray(x.access) && !x.access.includes('technician'))) {
      const url = '/api' + fillParams(r.path);
      const res = r.method === 'get' ? await tech.get(url) : await tech[r.method](url).send({});
      expect(res.status, key(r.method, r.path)).toBe(403);
    }
  });
});
