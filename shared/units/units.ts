/** Units the reckoners speak. Values are always held in the SI base unit. */
export const UNITS = ['V', 'A', 'Ω', 'F', 'H', 'W', 'VA', 'Hz', 's', 'J', 'C', '%', 'A²s'] as const;
export type Unit = (typeof UNITS)[number];

/** SI prefixes used for both parsing and printing (engineering steps only, plus none). */
export const PREFIXES: readonly { symbol: string; exponent: number }[] = [
  { symbol: 'p', exponent: -12 },
  { symbol: 'n', exponent: -9 },
  { symbol: 'µ', exponent: -6 },
  { symbol: 'm', exponent: -3 },
  { symbol: '', exponent: 0 },
  { symbol: 'k', exponent: 3 },
  { symbol: 'M', exponent: 6 },
  { symbol: 'G', exponent: 9 },
  { symbol: 'T', exponent: 12 },
];

/** Units that never take an SI prefix when printed. */
export const UNPREFIXED_UNITS: ReadonlySet<string> = new Set(['%', '', 'A²s']);

export function isUnit(u: string): u is Unit {
  return (UNITS as readonly string[]).includes(u);
}
