/** How the check names things to people: blocks by name and kind, inputs by their registry label. */
import { eachField } from '../../reckoners/field-paths';
import { inputLabel } from '../block-view';
import { withLabel } from '../../schemas/problems';
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

/** A block as people know it: by its kind's label and its section, never by its internal name. */
export function reckonerName(b: { kind: string; label?: string; section?: string }): string {
  const label = getReckoner(b.kind)?.label ?? b.label ?? b.kind;
  return `the ${label} block${b.section?.trim() ? ` in “${clip(b.section, 40)}”` : ''}`;
}

export const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** An input named as a message names it: "Winding 1 voltage" (see inputLabel). */
export function fieldLabel(kind: string, path: string): string {
  return inputLabel(getReckoner(kind)?.fields ?? [], path);
}

/** One input problem as a sentence: "Winding 1 voltage is required". */
export function inputProblem(kind: string, path: string, reason: string): string {
  return withLabel(fieldLabel(kind, path), reason);
}

/** Every declared field of a block with its dotted path and value in the block's input (rows expanded). */
export function fieldsOf(
  kind: string,
  input: Record<string, unknown>,
): { spec: FieldSpec; path: string; value: unknown }[] {
  const out: { spec: FieldSpec; path: string; value: unknown }[] = [];
  eachField(getReckoner(kind)?.fields ?? [], input, (spec, path, value) => out.push({ spec, path, value }));
  return out;
}
