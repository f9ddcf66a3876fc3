/**
 * The one list of units a reading can be taken in: which measures each takes, and the largest
 * magnitude a bench instrument sensibly shows (beyond it a typed value is a slip, refused).
 * The document schema, the reading-tolerance reckoner, the editor and bench-run entries read it.
 */
import type { Measure } from './types';

type AcMeasure = Exclude<Measure, 'scalar'>;

interface ReadingUnitSpec {
  label: string;
  /** Measures a meter reading of this unit is stated in; empty for quantities without one. */
  measures: readonly AcMeasure[];
  /** Largest magnitude accepted as an expected or measured value. */
  max: number;
}

const ALL_MEASURES: readonly AcMeasure[] = ['dc', 'rms', 'peak', 'peak-to-peak'];

export const READING_UNIT_SPECS = {
  V: { label: 'volts', measures: ALL_MEASURES, max: 1e5 },
  A: { label: 'amperes', measures: ALL_MEASURES, max: 1e3 },
  Ω: { label: 'ohms', measures: [], max: 1e12 },
  W: { label: 'watts', measures: [], max: 1e5 },
  Hz: { label: 'hertz', measures: [], max: 1e9 },
  F: { label: 'farads', measures: [], max: 10 },
  s: { label: 'seconds', measures: [], max: 1e6 },
  '%': { label: 'percent', measures: [], max: 1e4 },
} as const satisfies Record<string, ReadingUnitSpec>;

export type ReadingUnit = keyof typeof READING_UNIT_SPECS;
export const READING_UNITS = Object.keys(READING_UNIT_SPECS) as [ReadingUnit, ...ReadingUnit[]];
export const READING_MEASURES = ALL_MEASURES as readonly [AcMeasure, ...AcMeasure[]];

export function readingUnitSpec(unit: string): ReadingUnitSpec | undefined {
  return Object.prototype.hasOwnProperty.call(READING_UNIT_SPECS, unit)
    ? READING_UNIT_SPECS[unit as ReadingUnit]
    : undefined;
}

/** Whether a reading in `unit` must state a measure. */
export function takesMeasure(unit: string): boolean {
  return (readingUnitSpec(unit)?.measures.length ?? 0) > 0;
}
