import { expect } from 'vitest';
import { runReckoner } from '../../shared/reckoners/validate';
import type { Caution, Output } from '../../shared/reckoners/types';

/** Relative comparison; 0.1 % unless a check states otherwise (docs/references.md, introduction). */
export function expectClose(actual: number, expected: number, rel = 1e-3, what = ''): void {
  const tol = Math.abs(expected) * rel;
  expect(Number.isFinite(actual), `${what} finite`).toBe(true);
  expect(Math.abs(actual - expected), `${what}: ${actual} vs ${expected} (rel ${rel})`).toBeLessThanOrEqual(
    tol + 1e-15,
  );
}

export function run(kind: string, inputs: unknown): { outputs: Record<string, Output>; cautions: Caution[] } {
  const r = runReckoner(kind, inputs);
  if (!r.ok) throw new Error(`${kind} rejected valid input: ${JSON.stringify(r.errors)}`);
  return r;
}

export function num(o: Record<string, Output>, key: string): number {
  const out = o[key];
  if (!out) throw new Error(`no output "${key}" (have ${Object.keys(o).join(', ')})`);
  if (typeof out.value !== 'number') throw new Error(`output "${key}" is not a number`);
  return out.value;
}

export function fieldErrors(kind: string, inputs: unknown): { field: string; reason: string }[] {
  const r = runReckoner(kind, inputs);
  if (r.ok) throw new Error(`${kind} accepted bad input ${JSON.stringify(inputs)}`);
  return r.errors;
}

/** The value `fn` throws, for assertions made outside any catch; fails the test when nothing is thrown. */
export function thrownBy(fn: () => unknown): unknown {
  try {
    fn();
  } catch (e) {
    return e;
  }
  throw new Error('expected a throw, but nothing was thrown');
}
