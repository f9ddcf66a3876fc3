/** Fuse data, held once. Values in amperes and seconds. */

/**
 * Rated currents of IEC 60127-2 miniature fuses: the R10 preferred numbers (ISO 3),
 * 32 mA – 6.3 A, with 8 A and 10 A found on some standard sheets.
 */
export const IEC_60127_RATED_CURRENTS: readonly number[] = [
  0.032, 0.04, 0.05, 0.063, 0.08, 0.1, 0.125, 0.16, 0.2, 0.25, 0.315, 0.4, 0.5, 0.63, 0.8, 1, 1.25, 1.6, 2,
  2.5, 3.15, 4, 5, 6.3, 8, 10,
];

/** North American fractional ratings (common practice, no single source). */
export const NORTH_AMERICAN_RATED_CURRENTS: readonly number[] = [
  0.125, 0.25, 0.5, 0.75, 1, 1.25, 1.5, 2, 2.5, 3, 4, 5, 6, 7, 8, 10,
];

export const FUSE_SERIES = {
  iec: {
    label: 'IEC 60127-2 (R10 series)',
    values: IEC_60127_RATED_CURRENTS,
    source: 'IEC 60127-2; values from the R10 series',
  },
  'north-american': {
    label: 'North American fractional sizes',
    values: NORTH_AMERICAN_RATED_CURRENTS,
    source: 'common practice, no source',
  },
} as const;
export type FuseSeriesName = keyof typeof FUSE_SERIES;

/** Next rating at or above `required`; null when above the series. */
export function nextFuseRating(required: number, series: FuseSeriesName = 'iec'): number | null {
  const values = FUSE_SERIES[series].values;
  return values.find((v) => v >= required * (1 - 1e-9)) ?? null;
}

/** Pre-arcing time gates: at `multiple` × In the fuse must not open before `min` and must open by `max`. */
export interface FuseGate {
  multiple: number;
  min: number;
  max: number;
}

/** IEC 60127-2 standard sheet 3 (time-lag T, low breaking capacity). Recalled, not checked against the text. */
export const TIME_LAG_GATES: readonly FuseGate[] = [
  { multiple: 2.75, min: 0.2, max: 10 },
  { multiple: 4, min: 0.04, max: 3 },
  { multiple: 10, min: 0.01, max: 0.3 },
];
// From memory (docs/references.md §1 marks it so); the note a technician sees cites the sheet only.
export const TIME_LAG_GATES_SOURCE = 'IEC 60127-2, standard sheet 3';

/** IEC 60127-2 sheets 1 and 2 (quick-acting F): at 10 × In it opens within 20 ms (from memory). */
export const QUICK_ACTING_10X_MAX = 0.02;
export const QUICK_ACTING_SOURCE = 'IEC 60127-2, standard sheets 1 and 2';
