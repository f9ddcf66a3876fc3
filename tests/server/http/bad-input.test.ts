// Generated bad input against every write route: arbitrary and near-valid bodies and params get a
// 4xx with a message, never a 5xx, and nothing stored changes.
import fc from 'fast-check';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { routeTable } from '../../../server/routes';
import { createTestApp, type TestApp } from '../../support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const WHO = { technician: 'tom', author: 'hal', reviewer: 'marek', admin: 'admin' } as const;
// Tables that legitimately change while requests are refused (sessions, the audit trail of refusals,
// and the count of refused password tries).
const VOLATILE = new Set(['session', 'audit_log', 'auth_throttle']);

async function fingerprint() {
  const tables = (
    await t.db.execute(sql`select tablename from pg_tables where schemaname = 'public' order by 1`)
  ).rows.map((r) => String(r.tablename));
  const out: Record<string, string> = {};
  for (const table of tables.filter((x) => !VOLATILE.has(x))) {
    const r = await t.db.execute(
      sql.raw(
        `select count(*)::text || ':' || coalesce(md5(string_agg(t::text, '|' order by t::text)), '') as f from "${table}" t`,
      ),
    );
    out[table] = String(r.rows[0]!.f);
  }
  return out;
}

// Strings PostgreSQL or a recursive validator would choke on: NUL, other controls, text-direction overrides.
const hostileString = fc.constantFrom(
  'a\u0000b',
  '\u0000',
  'x\u0007y',
  'Tom\u202Egnp.exe',
  '\u2066x\u2069',
  'line\u000Bfeed',
  '\u009b',
);
const nearValid = fc.oneof(
  fc.anything(),
  fc.dictionary(
    fc.constantFrom(
      'title',
      'email',
      'displayName',
      'password',
      'comment',
      'value',
      'note',
      'reason',
      'serial',
      'owner',
      'tags',
    ),
    hostileString,
  ),
  fc.dictionary(
    fc.constantFrom(
      'title',
      'email',
      'roles',
      'password',
      'document',
      'params',
      'lockVersion',
      'comment',
      'value',
      'measured',
      'state',
      'role',
      'tags',
      'id',
      'to',
      'reason',
      'by',
    ),
    fc.anything(),
  ),
  fc.record({
    lockVersion: fc.oneof(fc.integer(), fc.double(), fc.constant(Number.NaN)),
    document: fc.anything(),
    params: fc.anything(),
  }),
  fc.constantFrom(
    { value: 'NaN' },
    { value: 'Infinity' },
    { value: '-Infinity' },
    { value: '1e309' },
    { measured: '1e309 V' },
    { measured: '3 furlongs' },
  ),
);
const param = fc.oneof(
  fc.uuid(),
  fc.string({ maxLength: 40 }),
  fc.constantFrom('..%2F..%2Fetc%2Fpasswd', '%00', '0', '-1', '../../x'),
);

describe('generated bad input', () => {
  const writeRoutes = routeTable.filter((r) => r.method !== 'get');

  it(`every write route (${writeRoutes.length}) answers arbitrary bodies with a 4xx and a message, never a 5xx, and changes nothing`, async () => {
    const before = await fingerprint();
    const seen: string[] = [];
    for (const route of writeRoutes) {
      const role =
        route.access === 'public' ? null : route.access === 'signed-in' ? 'author' : route.access[0]!;
      const client = role ? await t.as(WHO[role]) : t.client();
      if (!role) await client.refreshToken();
      await fc.assert(
        fc.asyncProperty(nearValid, param, async (body, p) => {
          const url = '/api' + route.path.replace(/:\w+/g, encodeURIComponent(p));
          const req = client[route.method as 'post' | 'put' | 'patch' | 'delete'](url);
          const res =
            typeof body === 'object' && body !== null
              ? await req.send(body as object)
              : await req.set('Content-Type', 'application/json').send(JSON.stringify(body) ?? 'null');
          if (res.status >= 200 && res.status < 300)
            seen.push(
              `${route.method.toUpperCase()} ${route.path} accepted ${JSON.stringify(body).slice(0, 80)}`,
            );
          expect(
            res.status,
            `${route.method.toUpperCase()} ${url} → ${res.status} ${JSON.stringify(res.body).slice(0, 160)}`,
          ).toBeLessThan(500);
          if (res.status >= 400)
            expect(typeof res.body.error, `${route.method.toUpperCase()} ${url} gives a message`).toBe(
              'string',
            );
        }),
        { numRuns: 25 },
      );
    }
    // Sign-out (here, or everywhere) is the one write that may succeed with any body.
    expect(seen.filter((s) => !s.includes('/auth/sign-out'))).toEqual([]);
    expect(await fingerprint()).toEqual(before);
  });
});
