/** Walking a reckoner's field declarations alongside its inputs. */
import type { FieldSpec } from './types';

/** The declaration of the input at a dotted path ("windings.0.volts"), or undefined. */
export function specAt(fields: readonly FieldSpec[], path: readonly string[]): FieldSpec | undefined {
  const [head, ...rest] = path;
  const spec = fields.find((f) => f.key === head);
  if (!spec || rest.length === 0) return spec;
  if (spec.kind === 'rows' && /^\d+$/.test(rest[0]!))
    return rest.length === 1 ? spec : specAt(spec.columns ?? [], rest.slice(1));
  return undefined;
}

/**
 * The one rule for a block's name, which references to its outputs use ("bplus" in "bplus.averageDc"):
 * the document schema and the evaluator both apply it.
 */
export const BLOCK_NAME = /^[A-Za-z][A-Za-z0-9_-]{0,31}$/;
export const BLOCK_NAME_RULE = 'must start with a letter and hold only letters, digits, - or _ (at most 32)';

/** A reference to another block's output: { ref: "block.output" }. */
export function isRef(v: unknown): v is { ref: string } {
  return (
    typeof v === 'object' &&
    v !== null &&
    !Array.isArray(v) &&
    typeof (v as { ref?: unknown }).ref === 'string' &&
    Object.keys(v).length === 1
  );
}

/** A procedure parameter: { param: "mainsVoltage" }. */
export function isParam(v: unknown): v is { param: string } {
  return (
    typeof v === 'object' &&
    v !== null &&
    !Array.isArray(v) &&
    typeof (v as { param?: unknown }).param === 'string' &&
    Object.keys(v).length === 1
  );
}

/** Nothing typed: absent, null or blank. */
export function isEmptyInput(v: unknown): boolean {
  return v === undefined || v === null || (typeof v === 'string' && v.trim() === '');
}

/**
 * The inputs with every empty field that follows a procedure parameter pointed at it, and the
 * paths so filled. This is what makes a block follow the bench's measured mains without the
 * author linking it by hand — decided here, from the declaration, for editor, server and runs alike.
 */
export function withFollowedParams(
  inputs: Record<string, unknown>,
  fields: readonly FieldSpec[],
  prefix = '',
): { inputs: Record<string, unknown>; followed: Set<string> } {
  const out: Record<string, unknown> = { ...inputs };
  const followed = new Set<string>();
  for (const f of fields) {
    const path = prefix ? `${prefix}.${f.key}` : f.key;
    if (f.follows && isEmptyInput(out[f.key])) {
      out[f.key] = { param: f.follows };
      followed.add(path);
    } else if (f.kind === 'rows' && Array.isArray(out[f.key]) && f.columns?.some((c) => c.follows)) {
      out[f.key] = (out[f.key] as unknown[]).map((row, i) => {
        if (!row || typeof row !== 'object' || Array.isArray(row)) return row;
        const r = withFollowedParams(row as Record<string, unknown>, f.columns!, `${path}.${i}`);
        r.followed.forEach((p) => followed.add(p));
        return r.inputs;
      });
    }
  }
  return { inputs: out, followed };
}

/** Every declared field with its dotted path, rows expanded over the given input's rows. */
export function eachField(
  fields: readonly FieldSpec[],
  input: Record<string, unknown>,
  fn: (spec: FieldSpec, path: string, value: unknown) => void,
  prefix = '',
): void {
  for (const f of fields) {
    const path = prefix ? `${prefix}.${f.key}` : f.key;
    const value = input?.[f.key];
    if (f.kind === 'rows') {
      if (Array.isArray(value))
        value.forEach((row, i) =>
          eachField(f.columns ?? [], row as Record<string, unknown>, fn, `${path}.${i}`),
        );
    } else fn(f, path, value);
  }
}
