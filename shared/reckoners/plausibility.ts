/**
 * Values inside a field's hard limits but outside the range met in shop work are nearly always a
 * slipped prefix or unit (mV for V, nF for µF, k for M). They are not clamped or dropped: the block
 * raises a named caution that says what was read and what was probably meant.
 */
import { formatQuantity } from '../units/format';
import { parseQuantity } from '../units/parse';
import { eachField } from './field-paths';
import { unitWithMeasure } from './measures';
import type { Caution, FieldSpec, Output } from './types';

const SLIP_FACTORS = [1e3, 1e-3, 1e6, 1e-6];

function show(value: number, spec: FieldSpec): string {
  return spec.unit ? formatQuantity(value, spec.unit, 4) : String(value);
}

/** A likely intended value: the typed one off by a factor of a thousand or a million. */
function likelySlip(value: number, range: { min: number; max: number }): number | null {
  for (const f of SLIP_FACTORS) {
    const v = value * f;
    if (v >= range.min && v <= range.max) return v;
  }
  return null;
}

/** Read a raw (typed) value in the field's unit, or undefined when it does not read. */
function readRaw(spec: FieldSpec, value: unknown): number | undefined {
  if (typeof value === 'number') return Number.isFinite(value) ? value : undefined;
  if (typeof value !== 'string' || spec.unit === undefined) return undefined;
  try {
    return parseQuantity(value, spec.unit).value;
  } catch {
    return undefined;
  }
}

/** The caution for one value outside its field's shop range, or null when it is inside. */
function outOfRange(spec: FieldSpec, path: string, value: unknown): Caution | null {
  const range = spec.plausible;
  if (
    !range ||
    typeof value !== 'number' ||
    !Number.isFinite(value) ||
    (value >= range.min && value <= range.max)
  )
    return null;
  const slip = likelySlip(value, range);
  return {
    level: 'warning',
    code: 'implausible-input',
    field: path,
    message:
      `${spec.label}: ${show(value, spec)} is outside the range met in shop work (${show(range.min, spec)} to ${show(range.max, spec)}` +
      `${spec.measure ? `, ${unitWithMeasure('', spec.measure).trim()}` : ''}). ` +
      (slip !== null
        ? `Check the prefix or unit — did you mean ${show(slip, spec)}?`
        : 'Check the value, its prefix and its unit.'),
  };
}

/** Every validated input outside its field's shop range. */
export function implausibleInputs(fields: readonly FieldSpec[], input: Record<string, unknown>): Caution[] {
  const out: Caution[] = [];
  eachField(fields, input, (spec, path, value) => {
    const c = outOfRange(spec, path, value);
    if (c) out.push(c);
  });
  return out;
}

/**
 * The same check on raw inputs, for a block that was refused: the slip that caused the refusal is
 * usually elsewhere than the field the refusal names (a 47 nF reservoir makes the load "too high").
 */
export function implausibleRawInputs(fields: readonly FieldSpec[], raw: unknown): Caution[] {
  if (!raw || typeof raw !== 'object') return [];
  const out: Caution[] = [];
  eachField(fields, raw as Record<string, unknown>, (spec, path, value) => {
    const c = spec.kind === 'quantity' ? outOfRange(spec, path, readRaw(spec, value)) : null;
    if (c) out.push(c);
  });
  return out;
}

/** Results no part on a shop bench carries; beyond them a figure points at an input slip. */
const RESULT_LIMITS: Record<string, { max: number; what: string }> = {
  W: { max: 100, what: 'a resistor dissipating more than this is not a part for a valve power supply' },
  V: { max: 5000, what: 'beyond the voltages of valve equipment' },
  A: { max: 50, what: 'beyond the currents of a valve power supply' },
};

export function implausibleResults(outputs: Record<string, Output>): Caution[] {
  const out: Caution[] = [];
  for (const o of Object.values(outputs)) {
    const limit = RESULT_LIMITS[o.unit];
    if (!limit || typeof o.value !== 'number' || Math.abs(o.value) <= limit.max) continue;
    out.push({
      level: 'warning',
      code: 'implausible-result',
      message: `${o.label}: ${o.formatted} is ${limit.what} (${formatQuantity(limit.max, o.unit)}). Check the inputs for a slipped prefix or unit.`,
    });
  }
  return out;
}
