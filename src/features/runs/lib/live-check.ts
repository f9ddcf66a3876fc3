import { checkStepReading, readMeasured } from '@shared/reckoners/measurement';
import type { ReadingCheck } from '@shared/reckoners/reading-tolerance';
import type { RunStep } from '@shared/schemas/runs';

export type LiveCheck =
  | { state: 'empty' }
  | { state: 'error'; message: string }
  | ({ state: 'checked'; measured: number } & ReadingCheck)
  | { state: 'no-band'; measured: number };

/** The same reading of the value and the same check the server uses, run as the technician types. */
export function liveCheck(step: RunStep, text: string): LiveCheck {
  const r = step.reading!;
  if (!text.trim()) return { state: 'empty' };
  const read = readMeasured(text, r.unit, r.measure);
  if (!read.ok) return { state: 'error', message: read.reason };
  if (r.expected === null || r.error) return { state: 'no-band', measured: read.measured };
  try {
    return {
      state: 'checked',
      measured: read.measured,
      ...checkStepReading({ ...r, expected: r.expected }, read.measured),
    };
  } catch {
    return { state: 'no-band', measured: read.measured };
  }
}
