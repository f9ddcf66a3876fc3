/**
 * A value a technician types at the bench, read once for the browser's live check and the server's
 * verdict alike: in the reading's unit, in its measure ("350 VAC" is not a DC reading), finite and
 * within what a bench meter shows.
 */
import { formatQuantity } from '../units/format';
import { parseQuantity, QuantityParseError } from '../units/parse';
import { measureMismatch } from './measures';
import { readingUnitSpec } from './reading-units';
import { checkReading, parseTolerance, type ReadingCheck, type Tolerance } from './reading-tolerance';
import type { Measure } from './types';

export type MeasuredValue = { ok: true; measured: number; raw: string } | { ok: false; reason: string };

export function readMeasured(value: string | number, unit: string, measure?: Measure): MeasuredValue {
  let measured: number;
  let raw: string;
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) return { ok: false, reason: 'must be a finite number' };
    measured = value;
    raw = `${value} ${unit}`;
  } else {
    raw = value;
    try {
      const parsed = parseQuantity(value, unit);
      const wrong = measureMismatch(value, parsed, measure);
      if (wrong) return { ok: false, reason: wrong.replace('this field', 'this reading') };
      measured = parsed.value;
    } catch (err) {
      if (err instanceof QuantityParseError)
        return {
          ok: false,
          reason: err.reason === 'not a number' ? `"${value}" is not a number` : `"${value}": ${err.reason}`,
        };
      throw err;
    }
  }
  if (!Number.isFinite(measured)) return { ok: false, reason: 'must be a finite number' };
  const max = readingUnitSpec(unit)?.max ?? 1e12;
  if (Math.abs(measured) > max)
    return {
      ok: false,
      reason: `${formatQuantity(measured, unit)} is beyond what a bench meter reads (at most ${formatQuantity(max, unit)})`,
    };
  return { ok: true, measured, raw };
}

interface StepBand {
  expected: number | null;
  low: number | null;
  high: number | null;
  toleranceText: string;
  unit: string;
}

/**
 * The band fixed when the run started is what the technician measures against; a run started
 * before a tolerance rule tightened keeps its stored band rather than failing the entry.
 */
export function stepTolerance(r: StepBand & { expected: number }): Tolerance {
  return r.low !== null && r.high !== null
    ? { kind: 'asymmetric', basis: 'absolute', below: r.expected - r.low, above: r.high - r.expected }
    : parseTolerance(r.toleranceText, r.unit);
}

export function checkStepReading(r: StepBand & { expected: number }, measured: number): ReadingCheck {
  return checkReading({ expected: r.expected, tolerance: stepTolerance(r), measured });
}
