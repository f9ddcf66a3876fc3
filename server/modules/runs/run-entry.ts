import { checkReading, parseTolerance } from '../../../shared/reckoners/reading-tolerance';
import { parseQuantity, QuantityParseError } from '../../../shared/units';
import { formatQuantity } from '../../../shared/units/format';
import type { EntryBody, RunStep } from '../../../shared/schemas/runs';
import { badRequest } from '../../http/errors';

/** Largest magnitude a bench meter can sensibly show, per unit; beyond it the entry is a typo. */
const PLAUSIBLE_MAX: Record<string, number> = { V: 1e5, A: 1e3, Ω: 1e12, W: 1e5, Hz: 1e9, F: 10, s: 1e6, '%': 1e4 };

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
      measured = parseQuantity(value, unit).value;
    } catch (err) {
      if (err instanceof QuantityParseError) throw fail(err.reason === 'not a number' ? `"${value}" is not a number` : `"${value}": ${err.reason}`);
      throw err;
    }
  }
  if (!Number.isFinite(measured)) throw fail('must be a finite number');
  const max = PLAUSIBLE_MAX[unit] ?? 1e12;
  if (Math.abs(measured) > max) throw fail(`${formatQuantity(measured, unit)} is beyond what a bench meter reads (at most ${formatQuantity(max, unit)})`);
  return { raw, measured };
}

/** The server's own verdict, from the shared checkReading and the band at the run's mains. */
export function decideReading(step: RunStep, value: string | number): DecidedReading {
  const r = step.reading!;
  const { raw, measured } = readMeasurement(step, value);
  const base = { raw, measured, unit: r.unit, expected: r.expected, low: r.low, high: r.high, within: null, deviation: null, deviationPercent: null };
  if (r.expected === null || r.error) return base;
  const check = checkReading({ expected: r.expected, tolerance: parseTolerance(r.toleranceText, r.unit), measured });
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
