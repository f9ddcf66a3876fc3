import { formatNumber, formatQuantity } from '../units/format';
import type { Output } from './types';

export const SRC = {
  derived: 'derived',
  commonPractice: 'common practice, no source',
  fromMemory: 'from memory',
} as const;

/** A numeric output in SI base units, printed with prefix and unit. */
export function q(value: number, unit: string, label: string, explanation: string, source?: string, sig = 3): Output {
  if (!Number.isFinite(value)) throw new Error(`internal: output "${label}" is not finite (${value})`);
  return { value, unit, label, explanation, source, formatted: formatQuantity(value, unit, sig) };
}

export function n(value: number, label: string, explanation: string, source?: string, sig = 3): Output {
  if (!Number.isFinite(value)) throw new Error(`internal: output "${label}" is not finite (${value})`);
  return { value, label, explanation, source, formatted: formatNumber(value, sig) };
}

export function s(value: string, label: string, explanation: string, source?: string): Output {
  return { value, label, explanation, source, formatted: value };
}

export function b(value: boolean, label: string, explanation: string, source?: string, words: [string, string] = ['yes', 'no']): Output {
  return { value, label, explanation, source, formatted: value ? words[0] : words[1] };
}
