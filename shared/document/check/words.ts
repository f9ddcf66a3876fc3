/** How the check names things to people: blocks by name and kind, inputs by their registry label. */
import { eachField } from '../../reckoners/field-paths';
import { fieldLabel as labelFromFields } from '../block-view';
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

/** An input's label from the registry, with its row's own name: "Secondary windings, row 1 (HT): Winding voltage". */
export function fieldLabel(kind: string, path: string, input?: Record<string, unknown>): string {
  return labelFromFields(getReckoner(kind)?.fields ?? [], path, input);
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
