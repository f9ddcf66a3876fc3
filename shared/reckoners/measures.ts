/**
 * Measures of voltages and currents, and the one rule for a value written in the wrong one.
 * For a sine, peak = √2 × rms and peak-to-peak = 2 × peak [derived; docs/references.md §2];
 * no conversion exists between dc and the ac measures.
 */
import { formatQuantity } from '../units/format';
import type { Quantity } from '../units/parse';
import type { Measure } from './types';

export const MEASURE_WORDS: Record<Measure, string> = {
  rms: 'rms',
  peak: 'peak',
  'peak-to-peak': 'peak-to-peak',
  dc: 'DC',
  scalar: '',
};

/** Factor from peak to each ac measure of a sine. */
const PER_PEAK: Partial<Record<Measure, number>> = { peak: 1, rms: Math.SQRT1_2, 'peak-to-peak': 2 };

/** A sine's value in another measure, or null when there is no exact conversion (dc ↔ ac). */
export function convertMeasure(value: number, from: Measure, to: Measure): number | null {
  if (from === to) return value;
  const f = PER_PEAK[from];
  const t = PER_PEAK[to];
  return f === undefined || t === undefined ? null : (value / f) * t;
}

/** "V rms", "A DC", "Ω". */
export function unitWithMeasure(unit: string, measure: Measure | undefined): string {
  const word = measure ? MEASURE_WORDS[measure] : '';
  return word ? `${unit} ${word}` : unit;
}

/**
 * Why a value typed as `raw` does not fit a field that takes `wanted`, or null when it does.
 * A value written without a measure is taken in the field's own.
 */
export function measureMismatch(raw: string, parsed: Quantity, wanted: Measure | undefined): string | null {
  if (!parsed.measure || !wanted || wanted === 'scalar' || parsed.measure === wanted) return null;
  const wantText = unitWithMeasure(parsed.unit, wanted);
  const converted = convertMeasure(parsed.value, parsed.measure, wanted);
  const hint =
    converted === null
      ? ''
      : ` — did you mean ${formatQuantity(converted, parsed.unit, 4)} ${MEASURE_WORDS[wanted]} (for a sine)?`;
  return `"${raw.trim()}" is a ${MEASURE_WORDS[parsed.measure]} value, but this field takes ${wantText}${hint}`;
}
