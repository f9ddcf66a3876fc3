import { formatNumber, formatQuantity } from '../units/format';
import type { Measure, Output } from './types';

/**
 * Source notes shown beside results. A figure recalled rather than re-read is marked so in
 * docs/references.md and in its test, not on screen: a technician sees the citation.
 */
export const SRC = {
  derived: 'derived',
  commonPractice: 'common practice, no source',
} as const;

/**
 * The unit of a numeric output, with the measure written beside volts and amps so that no voltage
 * or current can leave a reckoner without saying whether it is rms, peak, peak-to-peak or dc.
 */
export type OutputUnit =
  | `${'V' | 'A'} ${Exclude<Measure, 'scalar'>}`
  | 'Ω'
  | 'F'
  | 'H'
  | 'W'
  | 'VA'
  | 'Hz'
  | 's'
  | 'J'
  | 'C'
  | '%'
  | 'A²s';

export function splitUnit(u: OutputUnit): { unit: string; measure: Measure } {
  const [unit, measure] = u.split(' ') as [string, Measure | undefined];
  return { unit, measure: measure ?? 'scalar' };
}

/** A numeric output in SI base units, printed with prefix and unit. */
export function q(
  value: number,
  unit: OutputUnit,
  label: string,
  explanation: string,
  source?: string,
  sig = 3,
): Output {
  if (!Number.isFinite(value)) throw new OutputOverflow(label, value);
  const u = splitUnit(unit);
  return { value, ...u, label, explanation, source, formatted: formatQuantity(value, u.unit, sig) };
}

export function n(value: number, label: string, explanation: string, source?: string, sig = 3): Output {
  if (!Number.isFinite(value)) throw new OutputOverflow(label, value);
  return {
    value,
    unit: '',
    measure: 'scalar',
    label,
    explanation,
    source,
    formatted: formatNumber(value, sig),
  };
}

export function s(value: string, label: string, explanation: string, source?: string): Output {
  return { value, unit: '', measure: 'scalar', label, explanation, source, formatted: value };
}

export function b(
  value: boolean,
  label: string,
  explanation: string,
  source?: string,
  words: [string, string] = ['yes', 'no'],
): Output {
  return {
    value,
    unit: '',
    measure: 'scalar',
    label,
    explanation,
    source,
    formatted: value ? words[0] : words[1],
  };
}

/** A result too large (or undefined) to hold: the inputs are out of any sensible range. */
export class OutputOverflow extends Error {
  readonly label: string;
  constructor(label: string, value: number) {
    super(`${label} cannot be computed from these inputs (${value})`);
    this.name = 'OutputOverflow';
    this.label = label;
  }
}
