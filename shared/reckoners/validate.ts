import { ReckonerInputError, issuesToFieldErrors } from './errors';
import { OutputOverflow } from './outputs';
import { implausibleInputs, implausibleRawInputs, implausibleResults } from './plausibility';
import { getReckoner } from './registry';
import type { Caution, FieldError, Output } from './types';

export type ValidationResult<I = unknown> = { ok: true; input: I } | { ok: false; errors: FieldError[] };

/** Check raw inputs (numbers or typed strings) against a reckoner's schema. Never throws for bad input. */
export function validateInputs(kind: string, raw: unknown): ValidationResult {
  const def = getReckoner(kind);
  if (!def) return { ok: false, errors: [{ field: 'kind', reason: `unknown reckoner "${kind}"` }] };
  const parsed = def.inputs.safeParse(raw ?? {});
  return parsed.success
    ? { ok: true, input: parsed.data }
    : { ok: false, errors: issuesToFieldErrors(parsed.error.issues) };
}

export type RunResult =
  | { ok: true; outputs: Record<string, Output>; cautions: Caution[]; input: Record<string, unknown> }
  | { ok: false; errors: FieldError[] };

/** Validate, compute and collect cautions. Input errors found during computing come back as field errors. */
export function runReckoner(kind: string, raw: unknown): RunResult {
  const result = computeReckoner(kind, raw);
  if (result.ok) return result;
  // A refused block also names any input outside the shop range: that is usually the slip behind it.
  const def = getReckoner(kind);
  const named = new Set(result.errors.map((e) => e.field));
  const hints = def ? implausibleRawInputs(def.fields, raw).filter((c) => !named.has(c.field!)) : [];
  return {
    ok: false,
    errors: [...result.errors, ...hints.map((c) => ({ field: c.field!, reason: c.message }))],
  };
}

function computeReckoner(kind: string, raw: unknown): RunResult {
  const v = validateInputs(kind, raw);
  if (!v.ok) return v;
  const def = getReckoner(kind)!;
  const input = v.input as Record<string, unknown>;
  try {
    const result = def.compute(input);
    const cautions = [
      ...implausibleInputs(def.fields, input),
      ...def.cautions(input, result),
      ...implausibleResults(result.outputs),
    ];
    return { ok: true, outputs: result.outputs, cautions, input };
  } catch (e) {
    if (e instanceof ReckonerInputError) return { ok: false, errors: [{ field: e.field, reason: e.reason }] };
    // An overflow is the inputs' doing, never an internal fault: say which result it hit.
    if (e instanceof OutputOverflow) return { ok: false, errors: [{ field: 'inputs', reason: e.message }] };
    if (e instanceof RangeError && /not finite/.test(e.message)) {
      return {
        ok: false,
        errors: [
          {
            field: 'inputs',
            reason: 'these inputs give a result too large to compute; check the values and their units',
          },
        ],
      };
    }
    throw e;
  }
}
