import { and, asc, eq, gte } from 'drizzle-orm';
import type { EntryAnswer } from '../../../shared/runs/entry-answer';
import type { RunInstrument } from '../../../shared/schemas/runs';
import type { Db } from '../../db/client';
import { instruments, people, runEntryHistory } from '../../db/schema';
import type { SessionUser } from '../../http/route';
import { isFinished, lockedSteps, progressOf, type EntryState } from './run-steps';
import type { EntryRow, RunRow } from './runs.service';

/**
 * The answer to one entry: the entry, its step's state and the run's summary, from the rows the
 * entry's transaction already read. Only a changed entry's two newest versions and, where needed,
 * its instrument or maker's name are read again; nothing of the run page is built.
 */
export async function entryAnswerOf(
  db: Db,
  user: SessionUser,
  r: {
    replayed: boolean;
    run: RunRow;
    entry: EntryRow;
    rows: EntryRow[];
    instrument: RunInstrument | null;
    stoppedAtHoldPoint: boolean;
  },
): Promise<EntryAnswer> {
  const { run, entry } = r;
  const [recent, instrument, maker] = await Promise.all([
    entry.version > 1
      ? db
          .select()
          .from(runEntryHistory)
          .where(and(eq(runEntryHistory.entryId, entry.id), gte(runEntryHistory.version, entry.version - 1)))
          .orderBy(asc(runEntryHistory.version))
      : [],
    instrumentOf(db, entry, r.instrument),
    entry.enteredBy === user.id
      ? { id: user.id, displayName: user.displayName }
      : db
          .select({ id: people.id, displayName: people.displayName })
          .from(people)
          .where(eq(people.id, entry.enteredBy))
          .then(([p]) => p ?? { id: entry.enteredBy, displayName: 'unknown' }),
  ]);
  const state = new Map<string, EntryState>(r.rows.map((e) => [e.stepId, e]));
  const step = run.steps.find((s) => s.id === entry.stepId)!;
  return {
    replayed: r.replayed,
    entry: {
      stepId: entry.stepId,
      kind: entry.kind,
      raw: entry.raw,
      measured: entry.measured,
      unit: entry.unit,
      expected: entry.expected,
      low: entry.low,
      high: entry.high,
      within: entry.within,
      deviation: entry.deviation,
      deviationPercent: entry.deviationPercent,
      done: entry.done,
      note: entry.note,
      version: entry.version,
      lastKey: entry.lastKey,
      enteredBy: maker,
      enteredAt: entry.enteredAt.toISOString(),
      takenOn: entry.takenOn,
      instrument,
      recentHistory: recent.map((h) => ({
        version: h.version,
        raw: h.raw,
        measured: h.measured,
        within: h.within,
        done: h.done,
        note: h.note,
        reason: h.reason,
        enteredBy: { id: h.enteredBy, displayName: h.enteredByName },
        enteredAt: h.enteredAt.toISOString(),
        takenOn: h.takenOn,
      })),
    },
    step: { id: step.id, finished: isFinished(step, state.get(step.id)) },
    run: {
      id: run.id,
      outOfTolerance: run.outOfTolerance,
      progress: progressOf(run.steps, state),
      locked: lockedSteps(run.steps, state).locked,
      stoppedAtHoldPoint: r.stoppedAtHoldPoint,
    },
  };
}

/** The instrument that took the reading, with its due date then (read only when the entry did not). */
async function instrumentOf(
  db: Db,
  entry: EntryRow,
  known: RunInstrument | null,
): Promise<RunInstrument | null> {
  if (!entry.instrumentId) return null;
  const due = entry.instrumentDue;
  if (known?.id === entry.instrumentId) return { ...known, calibrationDue: due ?? known.calibrationDue };
  const [i] = await db.select().from(instruments).where(eq(instruments.id, entry.instrumentId));
  return i
    ? { id: i.id, identifier: i.identifier, kind: i.kind, calibrationDue: due ?? i.calibrationDue }
    : null;
}
