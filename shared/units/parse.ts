/**
 * The one parser for values people type: engineering notation with SI prefixes
 * ("47u", "47 µF", "0.47uF", "100 mA"), the IEC 60062 RKM code ("4k7", "R47", "1M0", "4n7"),
 * and units with or without a space ("6.3V", "350 VAC"). Returns the value in the SI base unit.
 */
import { isUnit } from './units';

export class QuantityParseError extends Error {
  readonly input: string;
  readonly reason: string;
  constructor(input: string, reason: string) {
    super(`cannot read "${input}": ${reason}`);
    this.name = 'QuantityParseError';
    this.input = input;
    this.reason = reason;
  }
}

/** How a written voltage or current was qualified: "VAC"/"V rms" → rms, "V pk" → peak, "Vpp" → peak-to-peak, "VDC" → dc. */
export type WrittenMeasure = 'rms' | 'peak' | 'peak-to-peak' | 'dc';

export interface Quantity {
  value: number;
  /** Canonical unit symbol ('V', 'Ω', …) or '' when none was written and none was expected. */
  unit: string;
  /** The measure written after volts or amps, if any; whether it fits is for the caller to decide. */
  measure?: WrittenMeasure;
}

const MEASURE_WORDS: Record<string, WrittenMeasure> = {
  ac: 'rms',
  rms: 'rms',
  pk: 'peak',
  peak: 'peak',
  pp: 'peak-to-peak',
  'p-p': 'peak-to-peak',
  dc: 'dc',
};

const PREFIX_MULTIPLIERS: Record<string, number> = {
  p: 1e-12,
  n: 1e-9,
  u: 1e-6,
  µ: 1e-6,
  m: 1e-3,
  k: 1e3,
  K: 1e3,
  M: 1e6,
  meg: 1e6,
  Meg: 1e6,
  MEG: 1e6,
  G: 1e9,
  T: 1e12,
};
// Longest first so "meg" wins over "m".
const PREFIX_KEYS = Object.keys(PREFIX_MULTIPLIERS).sort((a, b) => b.length - a.length);

const UNIT_ALIASES: Record<string, string> = {
  V: 'V',
  v: 'V',
  volt: 'V',
  volts: 'V',
  A: 'A',
  a: 'A',
  amp: 'A',
  amps: 'A',
  Ω: 'Ω',
  ohm: 'Ω',
  ohms: 'Ω',
  Ohm: 'Ω',
  Ohms: 'Ω',
  F: 'F',
  f: 'F',
  H: 'H',
  h: 'H',
  W: 'W',
  w: 'W',
  watt: 'W',
  watts: 'W',
  VA: 'VA',
  va: 'VA',
  Hz: 'Hz',
  hz: 'Hz',
  HZ: 'Hz',
  s: 's',
  sec: 's',
  J: 'J',
  C: 'C',
  '%': '%',
  // Fuse and diode surge ratings (I²t).
  'A²s': 'A²s',
  A2s: 'A²s',
  'A^2s': 'A²s',
};

/** Qualifiers people add after volts and amps: the measure, reported beside the value. */
const QUALIFIER = /^(.*?)\s*(ac|dc|rms|pk|peak|pp|p-p)$/i;

function normalise(text: string): string {
  return text
    .trim()
    .replace(/[\u2212\u2012\u2013]/g, '-') // minus sign, figure dash, en dash
    .replace(/[\u03bc\u00b5]/g, 'µ') // Greek mu and micro sign → micro sign
    .replace(/\u2126/g, 'Ω') // ohm sign → Greek capital omega
    .replace(/\s+/g, ' ');
}

interface Suffix {
  multiplier: number;
  unit: string | null;
  measure?: WrittenMeasure;
}

function unitOf(s: string): string | null {
  return Object.prototype.hasOwnProperty.call(UNIT_ALIASES, s) ? UNIT_ALIASES[s]! : null;
}

/** A prefix and/or unit, e.g. "", "k", "µF", "mA", "VAC". Returns null when unreadable. */
function readSuffix(raw: string): Suffix | null {
  const s = raw.trim();
  if (s === '') return { multiplier: 1, unit: null };
  const direct = readPrefixedUnit(s);
  if (direct) return direct;
  const q = QUALIFIER.exec(s);
  if (q && q[1]) {
    const inner = readPrefixedUnit(q[1]);
    if (inner && (inner.unit === 'V' || inner.unit === 'A'))
      return { ...inner, measure: MEASURE_WORDS[q[2]!.toLowerCase()] };
  }
  return null;
}

function readPrefixedUnit(s: string): Suffix | null {
  const bare = unitOf(s);
  if (bare) return { multiplier: 1, unit: bare };
  for (const p of PREFIX_KEYS) {
    if (!s.startsWith(p)) continue;
    const rest = s.slice(p.length).trim();
    if (rest === '') return { multiplier: PREFIX_MULTIPLIERS[p]!, unit: null };
    const u = unitOf(rest);
    if (u && u !== '%') return { multiplier: PREFIX_MULTIPLIERS[p]!, unit: u };
  }
  return null;
}

// IEC 60062 RKM: the letter is both decimal point and multiplier. "V" is accepted the same way
// for capacitor voltage markings ("6V3").
const RKM = /^([+-]?)(\d*)(R|r|K|k|M|G|T|p|n|u|µ|m|V)(\d*)(?:\s*(\S.*))?$/;
const RKM_LETTERS: Record<string, { multiplier: number; implies: string | null }> = {
  R: { multiplier: 1, implies: 'Ω' },
  r: { multiplier: 1, implies: 'Ω' },
  K: { multiplier: 1e3, implies: null },
  k: { multiplier: 1e3, implies: null },
  M: { multiplier: 1e6, implies: null },
  G: { multiplier: 1e9, implies: null },
  T: { multiplier: 1e12, implies: null },
  p: { multiplier: 1e-12, implies: 'F' },
  n: { multiplier: 1e-9, implies: 'F' },
  u: { multiplier: 1e-6, implies: 'F' },
  µ: { multiplier: 1e-6, implies: 'F' },
  m: { multiplier: 1e-3, implies: null },
  V: { multiplier: 1, implies: 'V' },
};
// Without a stated unit, k/M/G/T in RKM form mean resistance (the code's home ground).
const RKM_DEFAULT_UNIT: Record<string, string> = { K: 'Ω', k: 'Ω', M: 'Ω', G: 'Ω', T: 'Ω' };

const NUMBER = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)(.*)$/;

function settleUnit(
  input: string,
  written: string | null,
  implied: string | null,
  fallback: string | null,
  expectedUnit: string | undefined,
): string {
  if (written && implied && written !== implied) {
    throw new QuantityParseError(
      input,
      `the code letter means ${implied} but the unit written is ${written}`,
    );
  }
  const unit = written ?? implied ?? expectedUnit ?? fallback;
  if (unit === null) {
    throw new QuantityParseError(input, 'add a unit; the letter could be milli of several units');
  }
  if (expectedUnit !== undefined && unit !== expectedUnit) {
    // A bare number is always read in the expected unit; a written one must match.
    throw new QuantityParseError(
      input,
      `expected a value in ${expectedUnit || 'plain numbers'}, got ${unit || 'a plain number'}`,
    );
  }
  return unit;
}

/**
 * Parse a quantity as people write it. With `expectedUnit`, a bare number or bare prefix is read
 * in that unit and any other written unit is an error. Throws QuantityParseError.
 */
export function parseQuantity(text: string, expectedUnit?: string): Quantity {
  if (typeof text !== 'string') throw new QuantityParseError(String(text), 'not text');
  if (expectedUnit !== undefined && expectedUnit !== '' && !isUnit(expectedUnit)) {
    throw new Error(`parseQuantity: unknown expected unit "${expectedUnit}"`);
  }
  const s = normalise(text);
  if (s === '') throw new QuantityParseError(text, 'empty');
  if (/,/.test(s)) throw new QuantityParseError(text, 'use a decimal point, not a comma');

  let value: number;
  let unit: string;
  let measure: WrittenMeasure | undefined;
  const rkm = RKM.exec(s);
  const rkmUsable =
    rkm !== null &&
    ((rkm[2] !== '' && rkm[4] !== '') ||
      ((rkm[3] === 'R' || rkm[3] === 'r') && (rkm[2] !== '' || rkm[4] !== '')));
  if (rkm && rkmUsable) {
    const [, sign, whole, letter, frac, rest] = rkm;
    const info = RKM_LETTERS[letter!]!;
    let written: string | null = null;
    if (rest !== undefined && rest !== '') {
      written = unitOf(rest.trim());
      if (written === null || written === '%')
        throw new QuantityParseError(text, `unknown unit "${rest.trim()}"`);
    }
    value = Number(`${sign}${whole || '0'}.${frac || '0'}`) * info.multiplier;
    unit = settleUnit(text, written, info.implies, RKM_DEFAULT_UNIT[letter!] ?? null, expectedUnit);
  } else {
    const m = NUMBER.exec(s);
    if (!m) throw new QuantityParseError(text, 'not a number');
    const suffix = readSuffix(m[2]!);
    if (!suffix) throw new QuantityParseError(text, `unknown unit or prefix "${m[2]!.trim()}"`);
    if (suffix.unit === '%' && suffix.multiplier !== 1)
      throw new QuantityParseError(text, 'a percentage takes no prefix');
    value = Number(m[1]) * suffix.multiplier;
    unit = settleUnit(text, suffix.unit, null, '', expectedUnit);
    measure = suffix.measure;
  }
  if (!Number.isFinite(value)) throw new QuantityParseError(text, 'too large to hold');
  // Tidy binary noise from the multiply ("4.7 * 1e-6") to 15 significant figures.
  value = Number(value.toPrecision(15));
  return measure ? { value, unit, measure } : { value, unit };
}

/** Like parseQuantity, but also accepts numbers (already in base units). */
export function toQuantityValue(input: number | string, expectedUnit: string): number {
  if (typeof input === 'number') {
    if (!Number.isFinite(input)) throw new QuantityParseError(String(input), 'not a finite number');
    return input;
  }
  return parseQuantity(input, expectedUnit).value;
}
