/**
 * Reading tolerance: the one place that decides whether a measured value is within tolerance.
 * Bench runs, the editor and the server all call checkReading / toleranceBand.
 */
import { z } from 'zod';
import { parseQuantity, QuantityParseError } from '../units/parse';
import { formatNumber, formatQuantity } from '../units/format';
import { measureMismatch, MEASURE_WORDS } from './measures';
import { namedInputs } from './fields';
import { READING_MEASURES, READING_UNITS, readingUnitSpec, type ReadingUnit } from './reading-units';
import { LOCAL_CODES } from './cautions';
import { ReckonerInputError } from './errors';
import { b, q, s, SRC, type OutputUnit } from './outputs';
import type { Caution, FieldSpec, Measure, ReckonerDefinition, ReckonerResult } from './types';

export type { ReadingUnit };

/** The output unit of a reading's value: the unit, with its measure for volts and amps. */
export function outputUnit(unit: string, measure: Measure): OutputUnit {
  return (measure === 'scalar' ? unit : `${unit} ${measure}`) as OutputUnit;
}

export type Tolerance =
  | { kind: 'percent'; percent: number }
  | { kind: 'absolute'; amount: number }
  /** `below` and `above` are both ≥ 0: the band is expected − below … expected + above. */
  | { kind: 'asymmetric'; below: number; above: number; basis: 'percent' | 'absolute' };

export interface ReadingCheck {
  within: boolean;
  /** measured − expected, in the reading's unit. */
  deviation: number;
  /** deviation ÷ |expected| × 100; null when the expected value is zero. */
  deviationPercent: number | null;
  low: number;
  high: number;
}

function finite(field: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v))
    throw new ReckonerInputError(field, 'must be a finite number');
  return v;
}
function nonNegative(field: string, v: unknown): number {
  const x = finite(field, v);
  if (x < 0) throw new ReckonerInputError(field, 'must not be negative');
  return x;
}

// Round away binary noise (230 × 0.1 = 23.000000000000004) so bands print and compare cleanly.
const tidy = (x: number) => Number(x.toPrecision(12));

export function toleranceBand(expected: number, tolerance: Tolerance): { low: number; high: number } {
  const e = finite('expected', expected);
  if (!tolerance || typeof tolerance !== 'object') throw new ReckonerInputError('tolerance', 'is required');
  const pct = (p: number) => (Math.abs(e) * p) / 100;
  let below: number;
  let above: number;
  switch (tolerance.kind) {
    case 'percent':
      below = above = pct(nonNegative('tolerance.percent', tolerance.percent));
      break;
    case 'absolute':
      below = above = nonNegative('tolerance.amount', tolerance.amount);
      break;
    case 'asymmetric': {
      const lo = nonNegative('tolerance.below', tolerance.below);
      const hi = nonNegative('tolerance.above', tolerance.above);
      if (tolerance.basis === 'percent') {
        below = pct(lo);
        above = pct(hi);
      } else if (tolerance.basis === 'absolute') {
        below = lo;
        above = hi;
      } else {
        throw new ReckonerInputError('tolerance.basis', 'must be percent or absolute');
      }
      break;
    }
    default:
      throw new ReckonerInputError('tolerance.kind', 'must be percent, absolute or asymmetric');
  }
  const usesPercent =
    tolerance.kind === 'percent' || (tolerance.kind === 'asymmetric' && tolerance.basis === 'percent');
  if (usesPercent && e === 0)
    throw new ReckonerInputError(
      'tolerance',
      'a percentage tolerance needs a non-zero expected value; use an absolute one',
    );
  const low = tidy(e - below);
  const high = tidy(e + above);
  if (!Number.isFinite(low) || !Number.isFinite(high))
    throw new ReckonerInputError('expected', 'is too large to give a tolerance band');
  // A band reaching past zero would accept a reading of the wrong polarity (or none at all).
  if ((e > 0 && low < 0) || (e < 0 && high > 0)) {
    throw new ReckonerInputError(
      'tolerance',
      'reaches past zero: the tolerance below the expected value must be no larger than the value itself (at most 100 %)',
    );
  }
  return { low, high };
}

export function checkReading(args: {
  expected: number;
  tolerance: Tolerance;
  measured: number;
}): ReadingCheck {
  const { low, high } = toleranceBand(args.expected, args.tolerance);
  const m = finite('measured', args.measured);
  const eps = 1e-12 * Math.max(Math.abs(low), Math.abs(high), Math.abs(m), 1e-300);
  const deviation = m - args.expected;
  const percent = (deviation / Math.abs(args.expected)) * 100;
  return {
    within: m >= low - eps && m <= high + eps,
    deviation,
    deviationPercent: args.expected === 0 || !Number.isFinite(percent) ? null : percent,
    low,
    high,
  };
}

/**
 * Read a tolerance as people write it: "±5 %", "5%", "± 2 V", "+/-0.5V", "+10/-5 %", "-5 % / +10 %".
 * `unit` is the reading's unit, used for absolute amounts.
 */
export function parseTolerance(text: string, unit: string): Tolerance {
  const t = text.trim().replace(/[\u2212\u2013]/g, '-');
  const fail = (reason: string): never => {
    throw new QuantityParseError(text, reason);
  };
  if (t === '') fail('empty');
  const part = (p: string, forced?: '%'): { value: number; percent: boolean; bare: boolean } => {
    const qn = parseQuantity(p, forced);
    if (qn.unit === '%') return { value: qn.value, percent: true, bare: false };
    if (qn.unit !== '' && qn.unit !== unit) fail(`expected % or ${unit}, got ${qn.unit}`);
    return { value: qn.value, percent: false, bare: qn.unit === '' };
  };
  if (t.includes('/') && !/^\+\s*\/\s*-/.test(t)) {
    const pieces = t.split('/').map((x) => x.trim());
    if (pieces.length !== 2) fail('write an asymmetric tolerance as "+10 % / -5 %"');
    let above: number | undefined;
    let below: number | undefined;
    const parsed = pieces.map((p) => {
      const sign = p[0];
      if (sign !== '+' && sign !== '-') fail('each side of an asymmetric tolerance needs a + or − sign');
      const r = part(p.slice(1).trim());
      return { sign, ...r, unitless: r.bare };
    });
    if (parsed.every((p) => p.unitless)) fail(`add % or ${unit}: a bare number could mean either`);
    // "+10/-5 %": a unit written once applies to both sides.
    const anyPercent = parsed.some((p) => p.percent);
    const anyAbsoluteWithUnit = parsed.some((p) => !p.percent && !p.unitless);
    if (anyPercent && anyAbsoluteWithUnit) fail('mixes percent and absolute amounts');
    for (const p of parsed) {
      if (p.sign === '+') above = p.value;
      else below = p.value;
    }
    if (above === undefined || below === undefined) fail('needs one + side and one − side');
    return { kind: 'asymmetric', above: above!, below: below!, basis: anyPercent ? 'percent' : 'absolute' };
  }
  const body = t.replace(/^(±|\+\/-|\+-)\s*/, '');
  const p = part(body);
  if (p.bare) fail(`add % or ${unit}: a bare number could mean ±${body} % or ±${body} ${unit}`);
  if (p.value < 0) fail('must not be negative');
  return p.percent ? { kind: 'percent', percent: p.value } : { kind: 'absolute', amount: p.value };
}

export interface ReadingToleranceInput {
  unit: ReadingUnit;
  /** For volts and amps; 'scalar' otherwise. */
  measure: Measure;
  expected: number;
  tolerance: Tolerance;
  measured?: number;
}

const INPUT_KEYS = ['unit', 'measure', 'expected', 'tolerance', 'measured'] as const;

const rawSchema = namedInputs(
  Object.fromEntries(INPUT_KEYS.map((k) => [k, z.unknown().optional()])) as Record<
    (typeof INPUT_KEYS)[number],
    z.ZodOptional<z.ZodUnknown>
  >,
);

const inputs = rawSchema.transform((raw, ctx): ReadingToleranceInput => {
  let failed = false;
  const issue = (path: string[], message: string) => {
    failed = true;
    ctx.addIssue({ code: 'custom', path, message });
  };
  const rawUnit = raw.unit === undefined || raw.unit === '' ? 'V' : raw.unit;
  const spec = typeof rawUnit === 'string' ? readingUnitSpec(rawUnit) : undefined;
  if (!spec) {
    issue(['unit'], `must be one of: ${READING_UNITS.join(', ')}`);
    return z.NEVER;
  }
  const unit = rawUnit as ReadingUnit;
  let measure: Measure = 'scalar';
  if (spec.measures.length) {
    const m = raw.measure === undefined || raw.measure === '' ? 'dc' : raw.measure;
    if (typeof m !== 'string' || !(spec.measures as readonly string[]).includes(m)) {
      issue(['measure'], `must be one of: ${spec.measures.join(', ')}`);
      return z.NEVER;
    }
    measure = m as Measure;
  } else if (raw.measure !== undefined && raw.measure !== '' && raw.measure !== 'scalar') {
    issue(['measure'], `a value in ${unit} takes no measure`);
    return z.NEVER;
  }
  const quantityOf = (key: 'expected' | 'measured', v: unknown, required: boolean): number | undefined => {
    if (v === undefined || v === null || (typeof v === 'string' && v.trim() === '')) {
      if (required) issue([key], 'is required');
      return undefined;
    }
    if (typeof v === 'number') {
      if (!Number.isFinite(v)) issue([key], 'must be a finite number');
      else if (Math.abs(v) > spec.max)
        issue([key], `is beyond what a bench meter reads (at most ${formatQuantity(spec.max, unit)})`);
      else return v;
      return undefined;
    }
    if (typeof v !== 'string') {
      issue([key], `must be a number or a quantity such as "${formatQuantity(6.3, unit)}"`);
      return undefined;
    }
    try {
      const parsed = parseQuantity(v, unit);
      const wrong = measureMismatch(v, parsed, measure);
      if (wrong) {
        issue([key], wrong);
        return undefined;
      }
      if (Math.abs(parsed.value) > spec.max) {
        issue([key], `is beyond what a bench meter reads (at most ${formatQuantity(spec.max, unit)})`);
        return undefined;
      }
      return parsed.value;
    } catch (e) {
      if (e instanceof QuantityParseError) issue([key], e.message);
      else throw e;
      return undefined;
    }
  };
  const expected = quantityOf('expected', raw.expected, true);
  const measured = quantityOf('measured', raw.measured, false);
  let tolerance: Tolerance | undefined;
  const t = raw.tolerance;
  if (t === undefined || t === null || t === '') issue(['tolerance'], 'is required');
  else if (typeof t === 'string') {
    try {
      tolerance = parseTolerance(t, unit);
    } catch (e) {
      if (e instanceof QuantityParseError) issue(['tolerance'], e.message);
      else throw e;
    }
  } else if (typeof t === 'object') {
    tolerance = readToleranceObject(t as Record<string, unknown>, unit, issue);
  } else issue(['tolerance'], 'must be a tolerance such as "±5 %" or "+10 % / -5 %"');
  if (expected === undefined || tolerance === undefined || failed) return z.NEVER;
  try {
    toleranceBand(expected, tolerance);
  } catch (e) {
    if (e instanceof ReckonerInputError) issue(e.field.split('.'), e.reason);
    else throw e;
    return z.NEVER;
  }
  return { unit, measure, expected, tolerance, measured };
});

function readToleranceObject(
  t: Record<string, unknown>,
  unit: string,
  issue: (path: string[], message: string) => void,
): Tolerance | undefined {
  const amount = (key: string, u: string): number | undefined => {
    const v = t[key];
    let x: number | undefined;
    if (typeof v === 'number') x = v;
    else if (typeof v === 'string' && v.trim() !== '') {
      try {
        x = parseQuantity(v, u).value;
      } catch (e) {
        if (e instanceof QuantityParseError) {
          issue(['tolerance', key], e.message);
          return undefined;
        }
        throw e;
      }
    } else {
      issue(['tolerance', key], 'is required');
      return undefined;
    }
    if (!Number.isFinite(x)) issue(['tolerance', key], 'must be a finite number');
    else if (x < 0) issue(['tolerance', key], 'must not be negative');
    else return x;
    return undefined;
  };
  switch (t.kind) {
    case 'percent': {
      const p = amount('percent', '%');
      return p === undefined ? undefined : { kind: 'percent', percent: p };
    }
    case 'absolute': {
      const a = amount('amount', unit);
      return a === undefined ? undefined : { kind: 'absolute', amount: a };
    }
    case 'asymmetric': {
      const basis = t.basis ?? 'percent';
      if (basis !== 'percent' && basis !== 'absolute') {
        issue(['tolerance', 'basis'], 'must be percent or absolute');
        return undefined;
      }
      const u = basis === 'percent' ? '%' : unit;
      const below = amount('below', u);
      const above = amount('above', u);
      return below === undefined || above === undefined
        ? undefined
        : { kind: 'asymmetric', below, above, basis };
    }
    default:
      issue(['tolerance', 'kind'], 'must be percent, absolute or asymmetric');
      return undefined;
  }
}

const fields: FieldSpec[] = [
  {
    key: 'unit',
    label: 'Reading in',
    kind: 'select',
    default: 'V',
    options: READING_UNITS.map((u) => ({ value: u, label: u })),
  },
  {
    key: 'measure',
    label: 'Measure (volts and amps)',
    kind: 'select',
    default: 'dc',
    optional: true,
    options: READING_MEASURES.map((m) => ({ value: m, label: MEASURE_WORDS[m] })),
  },
  {
    key: 'expected',
    label: 'Expected',
    kind: 'quantity',
    help: 'A number, or a reckoner output by reference.',
  },
  {
    key: 'tolerance',
    label: 'Tolerance',
    kind: 'tolerance',
    help: '± percent, ± an absolute amount, or different amounts below and above ("+10 % / -5 %").',
  },
  { key: 'measured', label: 'Measured', kind: 'quantity', optional: true, help: 'Entered at the bench.' },
];

function toleranceText(t: Tolerance, unit: string): string {
  switch (t.kind) {
    case 'percent':
      return `± ${formatNumber(t.percent)} %`;
    case 'absolute':
      return `± ${formatQuantity(t.amount, unit)}`;
    case 'asymmetric':
      return t.basis === 'percent'
        ? `+${formatNumber(t.above)} % / −${formatNumber(t.below)} %`
        : `+${formatQuantity(t.above, unit)} / −${formatQuantity(t.below, unit)}`;
  }
}

function compute(input: ReadingToleranceInput): ReckonerResult {
  const { low, high } = toleranceBand(input.expected, input.tolerance);
  const tolText = toleranceText(input.tolerance, input.unit);
  const u = outputUnit(input.unit, input.measure);
  const outputs: ReckonerResult['outputs'] = {
    expected: q(input.expected, u, 'Expected', `Tolerance ${tolText}.`, undefined, 4),
    low: q(low, u, 'Lowest accepted', `Expected ${tolText}.`, SRC.derived, 4),
    high: q(high, u, 'Highest accepted', `Expected ${tolText}.`, SRC.derived, 4),
  };
  if (input.measured !== undefined) {
    const r = checkReading({
      expected: input.expected,
      tolerance: input.tolerance,
      measured: input.measured,
    });
    outputs.within = b(
      r.within,
      'Within tolerance',
      `Accepted from ${formatQuantity(low, input.unit)} to ${formatQuantity(high, input.unit)}, limits included.`,
      undefined,
      ['within', 'out of tolerance'],
    );
    outputs.deviation = q(r.deviation, u, 'Deviation', 'Measured − expected.', SRC.derived, 4);
    if (r.deviationPercent !== null) {
      outputs.deviationPercent = q(
        r.deviationPercent,
        '%',
        'Deviation (%)',
        '(measured − expected) ÷ |expected| × 100.',
        SRC.derived,
      );
    }
    outputs.verdict = s(
      r.within ? 'within' : 'out',
      'Verdict',
      r.within ? 'The reading is within tolerance.' : 'The reading is outside tolerance.',
    );
  }
  return { outputs };
}

function cautions(): Caution[] {
  return [LOCAL_CODES];
}

export const readingTolerance: ReckonerDefinition<ReadingToleranceInput> = {
  kind: 'reading-tolerance',
  label: 'Reading tolerance',
  summary: 'Expected value and tolerance band for a reading, and whether a measured value falls inside it.',
  inputs,
  fields,
  compute,
  cautions,
  keyOutputs: ['expected', 'low', 'high'],
};
