/**
 * The one list of units a reading can be taken in: which measures each takes, the largest
 * magnitude a bench instrument sensibly shows (beyond it a typed value is a slip, refused), and
 * whether a reading in it is live work by default.
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
  /** Read on a powered unit (live work) unless the reading says otherwise. */
  live: boolean;
}

const ALL_MEASURES: readonly AcMeasure[] = ['dc', 'rms', 'peak', 'peak-to-peak'];

export const READING_UNIT_SPECS = {
  V: { label: 'volts', measures: ALL_MEASURES, max: 1e5, live: true },
  A: { label: 'amperes', measures: ALL_MEASURES, max: 1e3, live: true },
  Ω: { label: 'ohms', measures: [], max: 1e12, live: false },
  W: { label: 'watts', measures: [], max: 1e5, live: true },
  Hz: { label: 'hertz', measures: [], max: 1e9, live: true },
  F: { label: 'farads', measures: [], max: 10, live: false },
  s: { label: 'seconds', measures: [], max: 1e6, live: false },
  '%': { label: 'percent', measures: [], max: 1e4, live: false },
} as const satisfies Record<string, ReadingUnitSpec>;

export type ReadingUnit = keyof typeof READING_UNIT_SPECS;
export const READING_UNITS = Object.keys(READING_UNIT_SPECS) as [ReadingUnit, ...ReadingUnit[]];
export const READING_MEASURES = ALL_MEASURES as readonly [AcMeasure, ...AcMeasure[]];

export function readingUnitSpec(unit: string): ReadingUnitSpec | undefined {
  return Object.prototype.hasOwnProperty.call(READING_UNIT_SPECS, unit)
    ? READING_UNIT_SPECS[unit as ReadingUnit]
    : undefined;
}

/** Units whose readings are live work unless marked otherwise. */
export const LIVE_READING_UNITS: readonly ReadingUnit[] = READING_UNITS.filter(
  (u) => READING_UNIT_SPECS[u].live,
);

/** Whether a reading in `unit` must state a measure. */
export function takesMeasure(unit: string): boolean {
  return (readingUnitSpec(unit)?.measures.length ?? 0) > 0;
}
