import type { Snapshot } from '../../../shared/document/evaluate';
import { checkStepHeading, textOf } from '../../../shared/document/extract';
import {
  checkKindOf,
  HAZARD_FLAG_LABELS,
  HAZARD_FLAGS,
  isLiveCheck,
  isLiveReading,
  walk,
  type CheckStepAttrs,
  type HazardNoteAttrs,
  type ProcedureDoc,
  type ReadingAttrs,
} from '../../../shared/document/schema';
import type { RunStep } from '../../../shared/schemas/runs';

/**
 * The steps of a bench run in document order: readings (with their expected band at the run's
 * own mains), check steps and hazard notes. Order matters: a hazard note gates what follows it.
 */
export function buildSteps(doc: ProcedureDoc, snapshot: Snapshot): RunStep[] {
  const readings = new Map(snapshot.readings.map((r) => [r.id, r]));
  const steps: RunStep[] = [];
  let section = '';
  for (const top of doc.content) {
    if (top.type === 'heading') section = textOf(top);
    walk(top, (node) => {
      const position = steps.length + 1;
      if (node.type === 'reading') {
        const r = readings.get(String(node.attrs?.id));
        if (!r) return;
        steps.push({
          id: r.id,
          kind: 'reading',
          position,
          section,
          text: r.label,
          reading: {
            testPoint: r.testPoint,
            meterRange: r.meterRange,
            unit: r.unit,
            ...(r.measure && r.measure !== 'scalar' ? { measure: r.measure } : {}),
            toleranceText: r.toleranceText,
            expectedSource: r.expectedSource,
            expected: r.expected,
            low: r.low,
            high: r.high,
            bandText: r.bandText,
            ...(r.error ? { error: r.error } : {}),
          },
          ...(isLiveReading(node.attrs as ReadingAttrs) ? { live: true } : {}),
        });
      } else if (node.type === 'checkStep') {
        const a = node.attrs as CheckStepAttrs;
        const kind = checkKindOf(a);
        const check =
          kind === 'confirm' && !a.live
            ? {}
            : {
                check: {
                  kind,
                  heading: checkStepHeading(a),
                  ...(a.threshold ? { threshold: a.threshold } : {}),
                  ...(a.seconds ? { seconds: a.seconds } : {}),
                },
              };
        steps.push({
          id: a.id,
          kind: 'check',
          position,
          section,
          text: a.text,
          ...check,
          ...(isLiveCheck(a) ? { live: true } : {}),
        });
      } else if (node.type === 'hazardNote') {
        const a = node.attrs as HazardNoteAttrs;
        // One line per paragraph, so the note reads as written.
        const text = (node.content ?? []).map(textOf).join('\n').trim();
        const flags = HAZARD_FLAGS.filter((f) => a.flags?.[f]).map((f) => HAZARD_FLAG_LABELS[f]);
        steps.push({
          id: a.id,
          kind: 'hazard',
          position,
          section,
          text,
          hazard: { level: a.level, ...(flags.length ? { flags } : {}) },
        });
      }
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

export function progressOf(steps: RunStep[], entries: Map<string, EntryState>) {
  return {
    done: steps.filter((s) => isFinished(s, entries.get(s.id))).length,
    total: steps.length,
    outOfTolerance: [...entries.values()].filter((e) => e.within === false).length,
  };
}
