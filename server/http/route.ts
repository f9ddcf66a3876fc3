import type { Request, RequestHandler, Response, Router } from 'express';
import type { ZodType } from 'zod';
import type { Role } from '../db/schema';
import type { AppDeps } from '../deps';
import { enrolmentRequired } from '../auth/second-factor';
import { HttpError, problemsMessage, zodProblems, type FieldProblem } from './errors';
import { findInputProblem } from './input-guard';

/** Who may call a route. Declared once, on the route itself. */
export type Access = 'public' | 'signed-in' | readonly Role[];

export interface SessionUser {
  id: string;
  email: string;
  displayName: string;
  roles: Role[];
  /** Has an authenticator set up (signs in with a code as well as the password). */
  totp: boolean;
}

export interface RouteContext<P, Q, B> {
  req: Request;
  res: Response;
  params: P;
  query: Q;
  body: B;
  /** The signed-in person; null only on public routes. */
  user: SessionUser | null;
  deps: AppDeps;
}

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface RouteDef<P = unknown, Q = unknown, B = unknown> {
  method: Method;
  /** Path below /api, Express syntax. */
  path: string;
  access: Access;
  summary: string;
  params?: ZodType<P>;
  query?: ZodType<Q>;
  body?: ZodType<B>;
  /**
   * Reachable by a signed-in person who must still set up an authenticator (the shop requires one
   * for their role): their session, account page and sign-out. Every other route refuses them.
   */
  beforeEnrolment?: true;
  /** Extra middleware run after the access check (rate limits, uploads). */
  before?: (deps: AppDeps) => RequestHandler[];
  handler: (ctx: RouteContext<P, Q, B>) => unknown | Promise<unknown>;
}

/** Declares a route; the generic parameters are inferred from the zod schemas. */
export function defineRoute<P = Record<string, never>, Q = Record<string, never>, B = undefined>(
  def: RouteDef<P, Q, B>,
): RouteDef {
  return def as unknown as RouteDef;
}

export function checkAccess(access: Access, user: SessionUser | null) {
  if (access === 'public') return;
  if (!user) throw new HttpError(401, 'Sign in to continue.');
  if (access === 'signed-in') return;
  if (!access.some((role) => user.roles.includes(role))) {
    throw new HttpError(403, `This needs the ${access.join(' or ')} role.`);
  }
}

function parsePart<T>(
  schema: ZodType<T> | undefined,
  value: unknown,
  where: string,
  problems: FieldProblem[],
): T {
  if (!schema) return value as T;
  // With the input in each issue, a missing field reads as missing, not as the wrong type.
  const result = schema.safeParse(value, { reportInput: true });
  if (result.success) return result.data;
  problems.push(...zodProblems(result.error, where, schema));
  return undefined as T;
}

export function mountRoutes(router: Router, routes: readonly RouteDef[], deps: AppDeps) {
  for (const def of routes) {
    const guard: RequestHandler = async (req, _res, next) => {
      const user = (req.user as SessionUser | undefined) ?? null;
      checkAccess(def.access, user);
      if (
        user &&
        def.access !== 'public' &&
        !def.beforeEnrolment &&
        (await enrolmentRequired(deps.db, user))
      ) {
        throw new HttpError(
          403,
          'The shop requires an authenticator code for your role. Set one up on your account page first.',
          { code: 'second-factor-enrolment' },
        );
      }
      next();
    };
    const run: RequestHandler = async (req, res) => {
      const problems: FieldProblem[] = [];
      const badParam = findInputProblem(req.params, 'params');
      if (badParam) throw new HttpError(400, problemsMessage([badParam]), { fields: [badParam] });
      const params = parsePart(def.params, req.params, 'params', problems);
      const query = parsePart(def.query, req.query, 'query', problems);
      const body = parsePart(def.body, req.body ?? {}, 'body', problems);
      if (problems.length) throw new HttpError(400, problemsMessage(problems), { fields: problems });
      const user = (req.user as SessionUser | undefined) ?? null;
      const result = await def.handler({ req, res, params, query, body, user, deps });
      if (!res.headersSent) {
        if (result === undefined) res.status(204).end();
        else res.json(result);
      }
    };
    router[def.method](def.path, guard, ...(def.before?.(deps) ?? []), run);
  }
}
