import { checkStepReading, readMeasured } from '../../../shared/reckoners/measurement';
import type { EntryBody, RunStep } from '../../../shared/schemas/runs';
import { refuse } from '../../http/errors';

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

/** Reads a measurement as typed, in the reading's unit and measure, and refuses anything not finite or not plausible. */
export function readMeasurement(step: RunStep, value: string | number): { raw: string; measured: number } {
  const r = readMeasured(value, step.reading!.unit, step.reading!.measure);
  if (!r.ok) throw refuse({ field: 'body.value', label: 'Measured value', reason: r.reason });
  return r;
}

/** The server's own verdict, from the shared check and the band at the run's mains. */
export function decideReading(step: RunStep, value: string | number): DecidedReading {
  const r = step.reading!;
  const { raw, measured } = readMeasurement(step, value);
  const base = {
    raw,
    measured,
    unit: r.unit,
    expected: r.expected,
    low: r.low,
    high: r.high,
    within: null,
    deviation: null,
    deviationPercent: null,
  };
  if (r.expected === null || r.error) return base;
  const check = checkStepReading({ ...r, expected: r.expected }, measured);
  return {
    ...base,
    low: check.low,
    high: check.high,
    within: check.within,
    deviation: check.deviation,
    deviationPercent: check.deviationPercent,
  };
}

/** Which fields a step kind takes; anything else is a 400 naming it. */
export function checkEntryShape(step: RunStep, body: EntryBody, hasEntry: boolean) {
  const problems: { field: string; reason: string }[] = [];
  if (step.kind === 'reading') {
    if (body.done !== undefined)
      problems.push({ field: 'body.done', reason: 'A reading takes a value, not a tick' });
    if (body.value === undefined && !hasEntry)
      problems.push({ field: 'body.value', reason: 'Enter the measured value' });
  } else {
    if (body.value !== undefined)
      problems.push({
        field: 'body.value',
        reason: `A ${step.kind === 'check' ? 'check step' : 'hazard note'} takes no value`,
      });
    if (body.done === undefined && !hasEntry)
      problems.push({
        field: 'body.done',
        reason: step.kind === 'check' ? 'Tick the step' : 'Acknowledge the hazard note',
      });
    if (step.kind === 'hazard' && body.done === false)
      problems.push({ field: 'body.done', reason: 'A hazard note cannot be un-acknowledged' });
  }
  if (problems.length) throw refuse(...problems);
}
