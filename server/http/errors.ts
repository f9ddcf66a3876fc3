import type { ErrorRequestHandler } from 'express';
import { ZodError, type ZodType } from 'zod';
import { labelAt, problemsMessage, problemsOf, withLabel } from '../../shared/schemas/problems';

export { problemsMessage };

/** One refused field: `field` is the path for machines, `label` and `reason` are for people. */
export interface FieldProblem {
  field: string;
  /** The field as its form labels it ("Model"). */
  label?: string;
  /** A sentence naming the field: "Model is required". */
  reason: string;
}

/** An error with an HTTP status and a message meant for people; thrown anywhere in a handler. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly extra: Record<string, unknown> = {},
  ) {
    super(message);
  }
}

/**
 * A 400 with its field problems. A problem written as a predicate ("is one of the most common
 * passwords") is made a sentence naming the field, as zod's problems are.
 */
export const badRequest = (message: string, fields: FieldProblem[] = []) =>
  new HttpError(400, message, { fields: fields.map(named) });

/** A 400 whose message is its problems, each a sentence naming its field. */
export function refuse(...fields: FieldProblem[]) {
  const problems = fields.map(named);
  return new HttpError(400, problemsMessage(problems), { fields: problems });
}
export const notFound = (what = 'Not found') => new HttpError(404, what);
export const conflict = (message: string, extra: Record<string, unknown> = {}) =>
  new HttpError(409, message, extra);

/**
 * Turns zod issues into field problems, prefixed with where they came from (body, query, params),
 * each field named by the schema's labels (shared/schemas/problems.ts).
 */
export function zodProblems(error: ZodError, where: string, schema?: ZodType): FieldProblem[] {
  return problemsOf(schema, error.issues, where);
}

/** A problem found outside zod, at a dotted path below `where` ("body.password"): worded the same way. */
export function pathProblem(field: string, reason: string, label?: string): FieldProblem {
  const name = label ?? labelAt(undefined, field.split('.').slice(1));
  return { field, label: name, reason: /^[A-Z]/.test(reason) ? reason : withLabel(name, reason) };
}

const named = (f: FieldProblem) => pathProblem(f.field, f.reason, f.label);

const DB_DOWN_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  '57P01',
  '57P02',
  '57P03',
  '08000',
  '08001',
  '08003',
  '08006',
]);

export function isDatabaseUnavailable(err: unknown): boolean {
  if (!err || typeof err !== 'object') return false;
  const e = err as { code?: string; message?: string; cause?: unknown };
  if (e.code && DB_DOWN_CODES.has(e.code)) return true;
  // "Cannot use a pool after calling end": pg-pool's answer once the pool has been ended (shutting down).
  // "not queryable": pg's answer when a transaction's ROLLBACK runs on a connection the restart already cut.
  if (
    /Connection terminated|timeout exceeded when trying to connect|connect ECONNREFUSED|Cannot use a pool after calling end|not queryable/i.test(
      e.message ?? '',
    )
  )
    return true;
  return e.cause ? isDatabaseUnavailable(e.cause) : false;
}

/** The one error handler: JSON with a message for people, never a stack trace. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (res.headersSent) return;
  if (err instanceof HttpError) {
    res.status(err.status).json({ error: err.message, ...err.extra });
    return;
  }
  if (err instanceof ZodError) {
    const fields = zodProblems(err, 'input');
    res.status(400).json({ error: problemsMessage(fields), fields });
    return;
  }
  const e = err as { type?: string; status?: number; code?: string; message?: string };
  if (e.type === 'entity.parse.failed') {
    res.status(400).json({
      error: 'The request body is not valid JSON.',
      fields: [{ field: 'body', reason: 'invalid JSON' }],
    });
    return;
  }
  if (e.type === 'entity.too.large') {
    res.status(413).json({ error: 'The request body is too large.' });
    return;
  }
  if (e.code === 'EBADCSRFTOKEN') {
    req.log?.warn({ path: req.path }, 'refused: missing or wrong CSRF token');
    res.status(403).json({
      error: 'This form has expired or did not come from Benchwright; reload the page and try again.',
      code: 'csrf',
    });
    return;
  }
  if (isDatabaseUnavailable(err)) {
    res.status(503).json({ error: 'The database is not reachable right now; try again in a moment.' });
    return;
  }
  if (typeof e.status === 'number' && e.status >= 400 && e.status < 500) {
    res.status(e.status).json({ error: e.message ?? 'Bad request' });
    return;
  }
  req.log?.error({ err }, 'unhandled error');
  res.status(500).json({ error: 'Something went wrong on the server; the error has been logged.' });
};
