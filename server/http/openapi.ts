import type { ZodObject } from 'zod';
import {
  createDocument,
  createSchema,
  type ZodOpenApiOperationObject,
  type ZodOpenApiPathsObject,
} from 'zod-openapi';
import { defineRoute, type Access, type RouteDef } from './route';

/** Express's `/runs/:runId` as OpenAPI writes it: `/runs/{runId}`. */
export const openApiPath = (expressPath: string) => expressPath.replace(/:(\w+)/g, '{$1}');

/** One converter for the document and for anyone checking it: a request schema as OpenAPI 3.1 renders it. */
export const requestSchema = (schema: NonNullable<RouteDef['body']>) =>
  createSchema(schema, { io: 'input' }).schema;

const problem = {
  description:
    'Refused: `error` is a message for people; on 400, `fields` names each field and why ' +
    '(401 not signed in, 403 wrong role or CSRF token, 404 not found, 409 conflict).',
  content: {
    'application/json': {
      schema: {
        type: 'object' as const,
        required: ['error'],
        properties: {
          error: { type: 'string' as const },
          fields: {
            type: 'array' as const,
            items: {
              type: 'object' as const,
              required: ['field', 'reason'],
              properties: { field: { type: 'string' as const }, reason: { type: 'string' as const } },
            },
          },
        },
      },
    },
  },
};

const accessText = (access: Access) =>
  access === 'public'
    ? 'Anyone.'
    : access === 'signed-in'
      ? 'Anyone signed in.'
      : `Signed in with the ${access.join(' or ')} role.`;

function operation(route: RouteDef): ZodOpenApiOperationObject {
  const writes = route.method !== 'get';
  return {
    operationId: `${route.method}${openApiPath(route.path)}`,
    summary: route.summary,
    description: accessText(route.access),
    'x-access': route.access,
    security: route.access === 'public' ? [] : writes ? [{ session: [], csrf: [] }] : [{ session: [] }],
    // Every route's params and query schemas are zod objects (checked by the OpenAPI test).
    requestParams: {
      ...(route.params && { path: route.params as ZodObject }),
      ...(route.query && { query: route.query as ZodObject }),
    },
    requestBody: route.body
      ? { required: true, content: { 'application/json': { schema: route.body } } }
      : undefined,
    responses: {
      '2XX': { description: 'Done: JSON, or no content (204).' },
      '4XX': problem,
    },
  };
}

/** The OpenAPI 3.1 description of the route table, from the zod schemas the routes validate with. */
export function buildOpenApi(routes: readonly RouteDef[]) {
  const paths: ZodOpenApiPathsObject = {};
  for (const route of routes) {
    const path = openApiPath(route.path);
    paths[path] = { ...paths[path], [route.method]: operation(route) };
  }
  return createDocument({
    openapi: '3.1.0',
    info: {
      title: 'Benchwright API',
      version: '1',
      description:
        'Every write needs the session cookie and the CSRF token from GET /auth/session in the X-CSRF-Token header.',
    },
    servers: [{ url: '/api' }],
    paths,
    components: {
      securitySchemes: {
        session: { type: 'apiKey', in: 'cookie', name: 'bw.sid', description: '__Host-bw.sid behind https' },
        csrf: { type: 'apiKey', in: 'header', name: 'X-CSRF-Token' },
      },
    },
  });
}

/** GET /openapi.json; takes the table lazily because it is itself a row of it. */
export function openApiRoute(table: () => readonly RouteDef[]) {
  let document: ReturnType<typeof buildOpenApi> | undefined;
  return defineRoute({
    method: 'get',
    path: '/openapi.json',
    access: ['admin'],
    summary: 'The OpenAPI 3.1 description of every route: parameters, bodies and who may call it',
    handler: () => (document ??= buildOpenApi(table())),
  });
}
