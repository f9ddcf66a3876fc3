import type { InputValue } from '../document/nodes/reckoner';
import type { FieldSpec } from './types';

/**
 * A new block's starting inputs for a field list: defaults as text, one empty row in row tables
 * (or as many as the table needs), declared parameters followed. The editor inserts blocks with
 * these; the browser tests build a document with every reckoner kind from them.
 */
export function initialInputs(fields: FieldSpec[]): Record<string, InputValue> {
  const inputs: Record<string, InputValue> = {};
  for (const f of fields) {
    if (f.kind === 'rows') {
      const row = initialInputs(f.columns ?? []);
      inputs[f.key] = Array.from({ length: Math.max(1, f.minRows ?? 0) }, () => ({ ...row }));
    } else if (f.follows) {
      inputs[f.key] = { param: f.follows };
    } else if (f.default !== undefined && (typeof f.default === 'string' || typeof f.default === 'number')) {
      inputs[f.key] = typeof f.default === 'string' ? f.default : String(f.default);
    } else {
      inputs[f.key] = '';
    }
  }
  return inputs;
}

/** A short block name not yet used in the document ("fuse", "fuse2", …). */
export function freshName(kind: string, taken: Set<string>): string {
  const base = kind
    .split('-')
    .map((w, i) => (i ? w[0]!.toUpperCase() + w.slice(1) : w))
    .join('')
    .slice(0, 28);
  if (!taken.has(base)) return base;
  for (let i = 2; ; i++) if (!taken.has(`${base}${i}`)) return `${base}${i}`;
}
