import { checkReading, parseTolerance, type ReadingCheck } from '@shared/reckoners/reading-tolerance';
import type { RunStep } from '@shared/schemas/runs';
import { parseQuantity, QuantityParseError } from '@shared/units';

export type LiveCheck = { state: 'empty' } | { state: 'error'; message: string } | ({ state: 'checked'; measured: number } & ReadingCheck) | { state: 'no-band'; measured: number };

/** The same parser and the same checkReading the server uses, run as the technician types. */
export function liveCheck(step: RunStep, text: string): LiveCheck {
  const r = step.reading!;
  if (!text.trim()) return { state: 'empty' };
  let measured: number;
  try {
    measured = parseQuantity(text, r.unit).value;
  } catch (err) {
    return { state: 'error', message: err instanceof QuantityParseError ? err.reason : 'cannot read this value' };
  }
  if (r.expected === null || r.error) return { state: 'no-band', measured };
  try {
    return { state: 'checked', measured, ...checkReading({ expected: r.expected, tolerance: parseTolerance(r.toleranceText, r.unit), measured }) };
  } catch {
    return { state: 'no-band', measured };
  }
}
