/** How the check names things to people: blocks by name and kind, inputs by their registry label. */
import { eachField } from '../../reckoners/field-paths';
import { getReckoner, type FieldSpec } from '../../reckoners';
import { formatQuantity } from '../../units/format';
import type { CheckedReading, CheckedStep } from './types';

const clip = (text: string, max = 70) => {
  const t = text.trim().replace(/\s+/g, ' ');
  return t.length > max ? `${t.slice(0, max - 1)}…` : t;
};

export const volts = (v: number) => formatQuantity(v, 'V');

export function checkStepName(c: Pick<CheckedStep, 'text'>): string {
  return `check step “${clip(c.text) || 'untitled'}”`;
}

export function readingName(r: Pick<CheckedReading, 'label'>): string {
  return `reading “${clip(r.label) || 'untitled'}”`;
}

export function reckonerName(b: { name: string; kind: string; label?: string }): string {
  return `${b.label ?? getReckoner(b.kind)?.label ?? b.kind} “${b.name}”`;
}

export const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/**
 * An input's label from the registry for a dotted path: "windings.0.volts" → "Windings, row 1:
 * Winding voltage". Falls back to the path in quotes when the registry does not know it (a
 * misspelt key, say); '' when the problem is about the block as a whole.
 */
export function fieldLabel(kind: string, path: string, input?: Record<string, unknown>): string {
  if (!path || path === 'inputs') return '';
  if (path === 'name') return 'Block name';
  if (path === 'kind') return 'Reckoner kind';
  const parts = path.split('.');
  let fields: FieldSpec[] | undefined = getReckoner(kind)?.fields;
  const words: string[] = [];
  let value = input;
  for (let i = 0; i < parts.length; i++) {
    const spec = fields?.find((f) => f.key === parts[i]);
    if (!spec) return `“${path}”`;
    if (spec.kind === 'rows' && i + 1 < parts.length && /^\d+$/.test(parts[i + 1]!)) {
      const index = Number(parts[++i]);
      // A row's own label, where it has one, says which node or winding far better than its number.
      const rows = value?.[spec.key];
      const own = Array.isArray(rows) ? (rows[index] as { label?: unknown } | undefined)?.label : undefined;
      value = Array.isArray(rows) ? (rows[index] as Record<string, unknown> | undefined) : undefined;
      const row = `${spec.label}, row ${index + 1}${typeof own === 'string' && own.trim() ? ` (${clip(own, 40)})` : ''}`;
      words.push(i + 1 < parts.length ? `${row}:` : row);
      fields = spec.columns;
    } else {
      words.push(spec.label);
      fields = spec.columns;
    }
  }
  return words.join(' ');
}

/** Every declared field of a block with its dotted path and value in the block's input (rows expanded). */
export function fieldsOf(kind: string, input: Record<string, unknown>): { spec: FieldSpec; path: string; value: unknown }[] {
  const out: { spec: FieldSpec; path: string; value: unknown }[] = [];
  eachField(getReckoner(kind)?.fields ?? [], input, (spec, path, value) => out.push({ spec, path, value }));
  return out;
}
