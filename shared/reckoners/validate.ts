import { ReckonerInputError, issuesToFieldErrors } from './errors';
import { getReckoner } from './registry';
import type { Caution, FieldError, Output } from './types';

export type ValidationResult<I = unknown> = { ok: true; input: I } | { ok: false; errors: FieldError[] };

/** Check raw inputs (numbers or typed strings) against a reckoner's schema. Never throws for bad input. */
export function validateInputs(kind: string, raw: unknown): ValidationResult {
  const def = getReckoner(kind);
  if (!def) return { ok: false, errors: [{ field: 'kind', reason: `unknown reckoner "${kind}"` }] };
  const parsed = def.inputs.safeParse(raw ?? {});
  return parsed.success ? { ok: true, input: parsed.data } : { ok: false, errors: issuesToFieldErrors(parsed.error.issues) };
}

export type RunResult =
  | { ok: true; outputs: Record<string, Output>; cautions: Caution[] }
  | { ok: false; errors: FieldError[] };

/** Validate, compute and collect cautions. Input errors found during computing come back as field errors. */
export function runReckoner(kind: string, raw: unknown): RunResult {
  const v = validateInputs(kind, raw);
  if (!v.ok) return v;
  const def = getReckoner(kind)!;
  try {
    const result = def.compute(v.input);
    return { ok: true, outputs: result.outputs, cautions: def.cautions(v.input, result) };
  } catch (e) {
    if (e instanceof ReckonerInputError) return { ok: false, errors: [{ field: e.field, reason: e.reason }] };
    throw e;
  }
}
