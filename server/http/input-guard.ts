/**
 * Every request's JSON body, query and route parameters are read once before any handler: strings
 * with NUL or other control characters (tab, line feed and carriage return apart — single-line
 * fields refuse those in their own schemas) or bidirectional override and isolate characters are
 * refused with 400 naming the field, as are bodies nested deeper than any document needs. Nothing
 * reaches PostgreSQL (which refuses NUL in text with a 500) or a recursive validator unchecked.
 */
import type { NextFunction, Request, Response } from 'express';
import { badRequest, pathProblem, problemsMessage, type FieldProblem } from './errors';

// C0 controls except \t \n \r, DEL, C1 controls; LRE RLE PDF LRO RLO and LRI RLI FSI PDI.
// eslint-disable-next-line no-control-regex -- control characters are what this matches
const FORBIDDEN = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F\u202A-\u202E\u2066-\u2069]/;
export const MAX_JSON_DEPTH = 64;

const describe = (ch: string) => `U+${ch.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`;

/** The first problem in a parsed value, walked without recursion (a hostile body may be very deep). */
export function findInputProblem(value: unknown, root: string): FieldProblem | null {
  const stack: { v: unknown; path: string; depth: number }[] = [{ v: value, path: root, depth: 0 }];
  while (stack.length) {
    const { v, path, depth } = stack.pop()!;
    if (typeof v === 'string') {
      const m = FORBIDDEN.exec(v);
      if (m)
        return pathProblem(
          path,
          `contains a control or text-direction character (${describe(m[0])}); remove it`,
        );
    } else if (v && typeof v === 'object') {
      if (depth >= MAX_JSON_DEPTH)
        return pathProblem(path, `is nested more than ${MAX_JSON_DEPTH} levels deep`);
      for (const [k, child] of Object.entries(v)) {
        const m = FORBIDDEN.exec(k);
        if (m)
          return pathProblem(
            `${path}.${k.replace(FORBIDDEN, '?')}`,
            `has a name with a control character (${describe(m[0])})`,
          );
        stack.push({ v: child, path: `${path}.${k}`, depth: depth + 1 });
      }
    }
  }
  return null;
}

export function inputGuard(req: Request, _res: Response, next: NextFunction) {
  for (const [where, value] of [
    ['body', req.body],
    ['query', req.query],
    ['params', req.params],
  ] as const) {
    const problem = findInputProblem(value, where);
    if (problem) return next(badRequest(problemsMessage([problem]), [problem]));
  }
  next();
}
