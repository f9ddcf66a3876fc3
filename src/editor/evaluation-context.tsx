import { createContext, useContext } from 'react';
import type { BlockSnapshot, ResolvedReading, Snapshot } from '@shared/document/evaluate';
import type { ProcedureParams } from '@shared/document/params';
import type { Measure } from '@shared/reckoners/types';

export interface Evaluation {
  snapshot: Snapshot | null;
  params: ProcedureParams;
  /** Why the whole document could not be evaluated, if it could not. */
  failure: string | null;
}

/** One evaluation of the whole document, shared by every node view so references between blocks agree. */
export const EvaluationContext = createContext<Evaluation | null>(null);

export function useEvaluation(): Evaluation {
  const value = useContext(EvaluationContext);
  if (!value) throw new Error('useEvaluation outside the editor');
  return value;
}

export const blockResult = (e: Evaluation, id: string): BlockSnapshot | undefined =>
  e.snapshot?.blocks.find((b) => b.id === id);
export const readingResult = (e: Evaluation, id: string): ResolvedReading | undefined =>
  e.snapshot?.readings.find((r) => r.id === id);

/** Numeric outputs of other reckoners, for "from block" pickers; `unit` narrows to matching units. */
/** Numeric outputs other blocks can refer to; with `unit` (and `measure`) only those of that quantity. */
export function numericOutputs(
  e: Evaluation,
  opts: { exceptId?: string; unit?: string; measure?: Measure } = {},
) {
  const list: { ref: string; label: string; formatted: string; unit: string }[] = [];
  for (const b of e.snapshot?.blocks ?? []) {
    if (b.id === opts.exceptId || !b.ok) continue;
    for (const [key, out] of Object.entries(b.outputs)) {
      if (typeof out.value !== 'number') continue;
      if (opts.unit !== undefined && (out.unit ?? '') !== opts.unit) continue;
      if (opts.measure !== undefined && (out.measure ?? 'scalar') !== opts.measure) continue;
      list.push({
        ref: `${b.name}.${key}`,
        label: `${b.name} · ${out.label}`,
        formatted: out.formatted,
        unit: out.unit ?? '',
      });
    }
  }
  return list;
}
