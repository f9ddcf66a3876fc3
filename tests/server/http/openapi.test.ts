import { z } from 'zod';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildOpenApi, openApiPath, requestSchema } from '../../../server/http/openapi';
import type { RouteDef } from '../../../server/http/route';
import { routeTable } from '../../../server/routes';
import { createTestApp, type TestApp } from '../../support/test-app';

type Json = Record<string, unknown>;
interface Parameter {
  name: string;
  in: string;
  required?: boolean;
  schema: unknown;
}

const plain = (value: unknown) => JSON.parse(JSON.stringify(value)) as unknown;

/**
 * Where the document and the route table disagree: a route missing, an operation no route has, or a
 * parameter or body schema that is not what the route's own zod schema converts to.
 */
function differences(doc: Json, routes: readonly RouteDef[]): string[] {
  const found: string[] = [];
  const paths = doc.paths as Record<string, Record<string, Json>>;
  const expectedOps = new Set(routes.map((r) => `${r.method} ${openApiPath(r.path)}`));
  for (const [path, item] of Object.entries(paths))
    for (const method of Object.keys(item))
      if (!expectedOps.has(`${method} ${path}`)) found.push(`${method} ${path}: no such route`);

  for (const route of routes) {
    const name = `${route.method.toUpperCase()} ${route.path}`;
    const op = paths[openApiPath(route.path)]?.[route.method];
    if (!op) {
      found.push(`${name}: missing from the document`);
      continue;
    }
    if (op.summary !== route.summary) found.push(`${name}: summary differs`);
    if (JSON.stringify(op['x-access']) !== JSON.stringify(route.access))
      found.push(`${name}: access differs`);

    const params = (op.parameters ?? []) as Parameter[];
    const expected: Parameter[] = [];
    for (const [where, schema] of [
      ['path', route.params],
      ['query', route.query],
    ] as const) {
      if (!schema) continue;
      const object = plain(requestSchema(schema)) as { properties?: Json; required?: string[] };
      for (const [key, property] of Object.entries(object.properties ?? {}))
        expected.push({ name: key, in: where, required: object.required?.includes(key), schema: property });
    }
    const byKey = (p: Parameter) => `${p.in} ${p.name}`;
    const actual = new Map(params.map((p) => [byKey(p), p]));
    if (params.length !== expected.length)
      found.push(`${name}: ${params.length} parameters, expected ${expected.length}`);
    for (const want of expected) {
      const got = actual.get(byKey(want));
      if (!got) found.push(`${name}: parameter ${byKey(want)} missing`);
      else if (
        JSON.stringify(got.schema) !== JSON.stringify(want.schema) ||
        !!got.required !== !!want.required
      )
        found.push(`${name}: parameter ${byKey(want)} differs from the route's schema`);
    }

    const body = (op.requestBody as { content?: Record<string, { schema: unknown }> } | undefined)?.content?.[
      'application/json'
    ]?.schema;
    if (!route.body) {
      if (body) found.push(`${name}: has a body the route does not take`);
    } else if (JSON.stringify(body) !== JSON.stringify(plain(requestSchema(route.body)))) {
      found.push(`${name}: body differs from the route's schema`);
    }
  }
  return found;
}

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('GET /api/openapi.json', () => {
  it('describes every route in the table, with the schemas the route validates with', async () => {
    const admin = await t.as('admin');
    const res = await admin.get('/api/openapi.json');
    expect(res.status).toBe(200);
    expect(res.body.openapi).toBe('3.1.0');
    expect(differences(res.body, routeTable)).toEqual([]);
    // Spot check against the zod schema read by hand: the unit register's model is required, 1–80 characters.
    const unitBody = res.body.paths['/units'].post.requestBody.content['application/json'].schema;
    expect(unitBody.required).toContain('model');
    expect(unitBody.properties.model).toMatchObject({ type: 'string', minLength: 1, maxLength: 80 });
    expect(res.body.paths['/runs/{id}/entries/{stepId}'].put['x-access']).toEqual(
      routeTable.find((r) => r.path === '/runs/:id/entries/:stepId')!.access,
    );
  });

  it('every route states its path and query parameters as zod objects, so they become parameters', () => {
    for (const r of routeTable)
      for (const schema of [r.params, r.query])
        if (schema) expect(schema, `${r.method} ${r.path}`).toBeInstanceOf(z.ZodObject);
  });

  it('the comparison notices a route left out, a changed body and a changed parameter', () => {
    const doc = plain(buildOpenApi(routeTable)) as Json;
    const units = routeTable.find((r) => r.method === 'post' && r.path === '/units')!;
    const unit = routeTable.find((r) => r.method === 'get' && r.path === '/units/:id')!;
    const changed = routeTable.map((r) =>
      r === units
        ? { ...r, body: z.object({ model: z.string().max(10) }) }
        : r === unit
          ? { ...r, params: z.object({ id: z.string() }) }
          : r,
    );
    const added = [...routeTable, { ...unit, path: '/units/:id/elsewhere' }];
    expect(differences(doc, changed)).toEqual([
      "POST /units: body differs from the route's schema",
      "GET /units/:id: parameter path id differs from the route's schema",
    ]);
    expect(differences(doc, added)).toEqual(['GET /units/:id/elsewhere: missing from the document']);
  });
});
