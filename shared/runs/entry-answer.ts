import { z } from 'zod';
import type { EntryVersionView, EntryView, RunView } from '../schemas/runs';

/**
 * What `PUT /api/runs/:id/entries/:stepId` answers: only what the entry changed — the entry, its
 * step's state and the run's summary — not the whole run. A field a feature adds to the entry or
 * the run summary goes here (and into `applyEntryAnswer` when the run page shows it).
 */
const person = z.object({ id: z.string(), displayName: z.string() });

const entryVersion = z.object({
  version: z.number(),
  raw: z.string().nullable(),
  measured: z.number().nullable(),
  within: z.boolean().nullable(),
  done: z.boolean(),
  note: z.string(),
  reason: z.string().nullable(),
  enteredBy: person,
  enteredAt: z.string(),
  /** The paper sheet's date when the reading was copied from one. */
  takenOn: z.string().nullable().optional(),
});

export const entryAnswer = z.object({
  /** The same idempotency key was seen before: nothing new was recorded; this is the entry now. */
  replayed: z.boolean(),
  entry: z.object({
    stepId: z.string(),
    kind: z.enum(['reading', 'check', 'hazard']),
    raw: z.string().nullable(),
    measured: z.number().nullable(),
    unit: z.string().nullable(),
    expected: z.number().nullable(),
    low: z.number().nullable(),
    high: z.number().nullable(),
    within: z.boolean().nullable(),
    deviation: z.number().nullable(),
    deviationPercent: z.number().nullable(),
    done: z.boolean(),
    note: z.string(),
    version: z.number(),
    lastKey: z.string(),
    enteredBy: person,
    enteredAt: z.string(),
    takenOn: z.string().nullable(),
    instrument: z
      .object({ id: z.string(), identifier: z.string(), kind: z.string(), calibrationDue: z.string() })
      .nullable(),
    /**
     * The newest versions of a changed entry (the one before and this one), not its whole history:
     * a client holding the version before appends them; one that does not reads the run again.
     */
    recentHistory: z.array(entryVersion),
  }),
  /** The step's state after the entry. */
  step: z.object({ id: z.string(), finished: z.boolean() }),
  /** The run's summary after the entry. */
  run: z.object({
    id: z.string(),
    outOfTolerance: z.boolean(),
    progress: z.object({ done: z.number(), total: z.number(), outOfTolerance: z.number() }),
    locked: z.array(z.string()),
    /** This entry stopped the run at a hold point: the run page (its hold) is read again. */
    stoppedAtHoldPoint: z.boolean(),
  }),
});
export type EntryAnswer = z.infer<typeof entryAnswer>;

// The answer's entry is the run view's entry without its whole history: the compiler keeps them in step.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
export const entryMatchesView: Same<
  Omit<EntryAnswer['entry'], 'recentHistory'>,
  Required<Omit<EntryView, 'history'>>
> = true;
export const versionMatchesView: Same<z.infer<typeof entryVersion>, EntryVersionView> = true;

/**
 * The run with one entry answer applied, or null when the run held is too old to apply it to
 * (an entry version in between was made elsewhere): then the run is read again.
 */
export function applyEntryAnswer(run: RunView, answer: EntryAnswer): RunView | null {
  if (run.id !== answer.run.id || answer.run.stoppedAtHoldPoint) return null;
  const { recentHistory, ...fields } = answer.entry;
  const held = run.entries.find((e) => e.stepId === fields.stepId);
  const heldVersion = held?.version ?? 0;
  if (heldVersion > fields.version) return run; // an older answer arriving late: keep what is newer
  if (heldVersion < fields.version - 1) return null;
  let history = held?.history ?? [];
  if (heldVersion === fields.version - 1 && fields.version > 1) {
    const known = new Set(history.map((h) => h.version));
    history = [...history, ...recentHistory.filter((h) => !known.has(h.version))];
    if (history.length !== fields.version) return null;
  }
  const entry: EntryView = { ...fields, history };
  const witness = run.witness;
  return {
    ...run,
    // A new entry changes the content a witness co-signed: their signature no longer covers it.
    witness:
      witness?.signature && !answer.replayed
        ? { ...witness, signature: { ...witness.signature, current: false } }
        : witness,
    outOfTolerance: answer.run.outOfTolerance,
    progress: answer.run.progress,
    locked: answer.run.locked,
    entries: held ? run.entries.map((e) => (e.stepId === entry.stepId ? entry : e)) : [...run.entries, entry],
  };
}
