/**
 * IEC 60063 preferred-number series. E6/E12/E24 are copied literally from the standard's tables:
 * they are not the rounded formula 10^(i/24) (eight E24 values differ). E96 follows the formula
 * rounded to three figures, and E48 is every second E96 value.
 */
export const E6: readonly number[] = [1.0, 1.5, 2.2, 3.3, 4.7, 6.8];
export const E12: readonly number[] = [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2];
export const E24: readonly number[] = [
  1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8,
  7.5, 8.2, 9.1,
];
export const E96: readonly number[] = Array.from(
  { length: 96 },
  (_, i) => Math.round(10 ** (i / 96) * 100) / 100,
);
export const E48: readonly number[] = E96.filter((_, i) => i % 2 === 0);

export const E_SERIES = { E6, E12, E24, E48, E96 } as const;
export type ESeriesName = keyof typeof E_SERIES;

function decadeValues(series: readonly number[], exponent: number): number[] {
  // Build exact decimal values (2.7e3, not 2.7 * 1000 = 2700.0000000000005).
  return series.map((m) => Number(`${m}e${exponent}`));
}

/** Standard values bracketing `value` (value > 0): the largest ≤ value and the smallest ≥ value. */
export function bracketESeries(value: number, name: ESeriesName): { below: number; above: number } {
  if (!(value > 0) || !Number.isFinite(value))
    throw new RangeError(`E-series lookup needs a positive finite value, got ${value}`);
  const series = E_SERIES[name];
  const exponent = Math.floor(Math.log10(value));
  const candidates = [
    ...decadeValues(series, exponent - 1),
    ...decadeValues(series, exponent),
    ...decadeValues(series, exponent + 1),
  ];
  let below = candidates[0]!;
  let above = candidates[candidates.length - 1]!;
  for (const c of candidates) {
    if (c <= value * (1 + 1e-12) && c > below) below = c;
    if (c >= value * (1 - 1e-12) && c < above) above = c;
  }
  return { below, above };
}

/** Nearest standard value on a logarithmic scale (the series is geometric). */
export function nearestESeries(value: number, name: ESeriesName): number {
  const { below, above } = bracketESeries(value, name);
  return Math.log(value / below) <= Math.log(above / value) ? below : above;
}

/** Largest standard value not above `value` (e.g. a bleeder that still meets its time). */
export function floorESeries(value: number, name: ESeriesName): number {
  return bracketESeries(value, name).below;
}
