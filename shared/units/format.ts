/** The one formatter: SI prefix + unit, to a chosen number of significant figures ("47 µF"). */
import { PREFIXES, UNPREFIXED_UNITS } from './units';

function trimZeros(s: string): string {
  return s.includes('.') ? s.replace(/\.?0+$/, '') : s;
}

function fixedSig(m: number, sig: number): string {
  const intDigits = m === 0 ? 1 : Math.floor(Math.log10(Math.abs(m))) + 1;
  return trimZeros(m.toFixed(Math.min(20, Math.max(0, sig - intDigits))));
}

/** Number without prefix, for '%' and plain numbers. */
export function formatNumber(value: number, sig = 3): string {
  if (!Number.isFinite(value)) throw new RangeError(`formatNumber: ${value} is not finite`);
  if (value === 0) return '0';
  const abs = Math.abs(value);
  if (abs >= 1e-4 && abs < 1e15) {
    const rounded = Number(value.toPrecision(sig));
    return fixedSig(rounded, sig);
  }
  const [mant, exp] = value.toExponential(sig - 1).split('e');
  return `${trimZeros(mant!)}e${exp}`;
}

export function formatQuantity(value: number, unit: string, sig = 3): string {
  if (!Number.isFinite(value)) throw new RangeError(`formatQuantity: ${value} is not finite`);
  if (!Number.isInteger(sig) || sig < 1 || sig > 15) throw new RangeError('formatQuantity: sig must be 1–15');
  if (UNPREFIXED_UNITS.has(unit)) {
    const n = formatNumber(value, sig);
    return unit ? `${n} ${unit}` : n;
  }
  if (value === 0) return `0 ${unit}`;
  const rounded = Number(value.toPrecision(sig));
  const abs = Math.abs(rounded);
  const first = PREFIXES[0]!;
  const last = PREFIXES[PREFIXES.length - 1]!;
  let exp3 = Math.floor(Math.log10(abs) / 3) * 3;
  exp3 = Math.max(first.exponent, Math.min(last.exponent, exp3));
  const prefix = PREFIXES.find((p) => p.exponent === exp3)!;
  const mantissa = rounded / 10 ** exp3;
  // Below the smallest prefix, keep significant figures rather than printing "0 pF".
  const text =
    Math.abs(mantissa) < 1 ? formatNumber(Number(mantissa.toPrecision(sig)), sig) : fixedSig(mantissa, sig);
  return `${text} ${prefix.symbol}${unit}`;
}
