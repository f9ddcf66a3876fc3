import type { Snapshot } from '../../../shared/document/evaluate';
import { nodeDef, textOf, walk, type ProcedureDoc } from '../../../shared/document/schema';
import type { RunStep } from '../../../shared/schemas/runs';

/**
 * The steps of a bench run in document order: readings (with their expected band at the run's
 * own mains), check steps and hazard notes — each node module says what step it makes. Order
 * matters: a hazard note gates what follows it.
 */
export function buildSteps(doc: ProcedureDoc, snapshot: Snapshot): RunStep[] {
  const readings = new Map(snapshot.readings.map((r) => [r.id, r]));
  const reading = (id: string) => readings.get(id);
  const steps: RunStep[] = [];
  let section = '';
  for (const top of doc.content) {
    if (top.type === 'heading') section = textOf(top);
    walk(top, (node) => {
      const step = nodeDef(node.type)?.step?.(node.attrs as never, {
        node,
        section,
        position: steps.length + 1,
        reading,
      });
      if (step) steps.push(step);
    });
  }
  return steps;
}

export interface EntryState {
  stepId: string;
  measured: number | null;
  done: boolean;
  within: boolean | null;
}

/** A step is finished when its reading is recorded, its check ticked, or its hazard note acknowledged. */
export function isFinished(step: RunStep, entry: EntryState | undefined): boolean {
  if (!entry) return false;
  return step.kind === 'reading' ? entry.measured !== null : entry.done;
}

/** The first hazard note not yet acknowledged, and every step after it (locked until it is). */
export function lockedSteps(steps: RunStep[], entries: Map<string, EntryState>) {
  const gate = steps.find((s) => s.kind === 'hazard' && !entries.get(s.id)?.done);
  return {
    gate: gate ?? null,
    locked: gate ? steps.filter((s) => s.position > gate.position).map((s) => s.id) : [],
  };
}

/** `excused`: steps recorded as not applicable, or as a deviation a senior approved. */
export function progressOf(steps: RunStep[], entries: Map<string, EntryState>, excused = new Set<string>()) {
  return {
    done: steps.filter((s) => isFinished(s, entries.get(s.id)) || excused.has(s.id)).length,
    total: steps.length,
    outOfTolerance: [...entries.values()].filter((e) => e.within === false).length,
  };
}
