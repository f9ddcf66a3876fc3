import type { z } from 'zod';
import type { FieldError } from './types';

/** Invalid input for a reckoner: names the field (dotted path, e.g. "windings.1.amps") and the reason. */
export class ReckonerInputError extends Error {
  readonly field: string;
  readonly reason: string;
  constructor(field: string, reason: string) {
    super(`${field || '(inputs)'}: ${reason}`);
    this.name = 'ReckonerInputError';
    this.field = field;
    this.reason = reason;
  }
}

export function issuesToFieldErrors(issues: readonly z.core.$ZodIssue[]): FieldError[] {
  return issues.map((i) => ({
    field: i.path.map(String).join('.'),
    reason: friendlyReason(i),
  }));
}

function friendlyReason(i: z.core.$ZodIssue): string {
  if (i.code === 'invalid_type' && i.expected === 'object') return 'must be a set of named inputs';
  if (i.code === 'invalid_type' && i.expected === 'array') return 'must be a list of rows';
  return i.message;
}
