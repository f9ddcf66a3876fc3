import { measureMismatch } from '../../../shared/reckoners/measures';
import { readingUnitSpec } from '../../../shared/reckoners/reading-units';
import { checkReading, parseTolerance } from '../../../shared/reckoners/reading-tolerance';
import { parseQuantity, QuantityParseError } from '../../../shared/units';
import { formatQuantity } from '../../../shared/units/format';
import type { EntryBody, RunStep } from '../../../shared/schemas/runs';
import { badRequest } from '../../http/errors';


export interface DecidedReading {
  raw: string;
  measured: number;
  unit: string;
  expected: number | null;
  low: number | null;
  high: number | null;
  within: boolean | null;
  deviation: number | null;
  deviationPercent: number | null;
}

/** Reads a measurement as typed, in the reading's unit, and refuses anything not finite or not plausible. */
export function readMeasurement(step: RunStep, value: string | number): { raw: string; measured: number } {
  const unit = step.reading!.unit;
  const field = [{ field: 'body.value', reason: '' }];
  const fail = (reason: string) => {
    field[0]!.reason = reason;
    return badRequest(`body.value: ${reason}`, field);
  };
  let measured: number;
  let raw: string;
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw fail('must be a finite number');
    measured = value;
    raw = `${value} ${unit}`;
  } else {
    raw = value;
    try {
      const parsed = parseQuantity(value, unit);
      // "350 VAC" typed against a DC reading is a different measurement, not a number to accept.
      const wrong = measureMismatch(value, parsed, step.reading!.measure);
      if (wrong) throw fail(wrong.replace('this field', 'this reading'));
      measured = parsed.value;
    } catch (err) {
      if (err instanceof QuantityParseError) throw fail(err.reason === 'not a number' ? `"${value}" is not a number` : `"${value}": ${err.reason}`);
      throw err;
    }
  }
  if (!Number.isFinite(measured)) throw fail('must be a finite number');
  const max = readingUnitSpec(unit)?.max ?? 1e12;
  if (Math.abs(measured) > max) throw fail(`${formatQuantity(measured, unit)} is beyond what a bench meter reads (at most ${formatQuantity(max, unit)})`);
  return { raw, measured };
}

/** The server's own verdict, from the shared checkReading and the band at the run's mains. */
export function decideReading(step: RunStep, value: string | number): DecidedReading {
  const r = step.reading!;
  const { raw, measured } = readMeasurement(step, value);
  const base = { raw, measured, unit: r.unit, expected: r.expected, low: r.low, high: r.high, within: null, deviation: null, deviationPercent: null };
  if (r.expected === null || r.error) return base;
  // The band fixed when the run started is what the technician measures against; a run started
  // before a tolerance rule tightened keeps it (its stored low/high), rather than failing the entry.
  const tolerance =
    r.low !== null && r.high !== null
      ? { kind: 'asymmetric' as const, basis: 'absolute' as const, below: r.expected - r.low, above: r.high - r.expected }
      : parseTolerance(r.toleranceText, r.unit);
  const check = checkReading({ expected: r.expected, tolerance, measured });
  return { ...base, low: check.low, high: check.high, within: check.within, deviation: check.deviation, deviationPercent: check.deviationPercent };
}

/** Which fields a step kind takes; anything else is a 400 naming it. */
export function checkEntryShape(step: RunStep, body: EntryBody, hasEntry: boolean) {
  const problems: { field: string; reason: string }[] = [];
  if (step.kind === 'reading') {
    if (body.done !== undefined) problems.push({ field: 'body.done', reason: 'a reading takes a value, not a tick' });
    if (body.value === undefined && !hasEntry) problems.push({ field: 'body.value', reason: 'enter the reading' });
  } else {
    if (body.value !== undefined) problems.push({ field: 'body.value', reason: `a ${step.kind === 'check' ? 'check step' : 'hazard note'} takes no value` });
    if (body.done === undefined && !hasEntry) problems.push({ field: 'body.done', reason: step.kind === 'check' ? 'tick the step' : 'acknowledge the hazard note' });
    if (step.kind === 'hazard' && body.done === false) problems.push({ field: 'body.done', reason: 'a hazard note cannot be un-acknowledged' });
  }
  if (problems.length) throw badRequest(problems.map((p) => `${p.field}: ${p.reason}`).join('; '), problems);
}
