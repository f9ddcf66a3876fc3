/**
 * Hold points and step exceptions on a bench run. An out-of-band reading at a step marked as a hold
 * point stops the run (further entries, exceptions and signatures refused) until a senior — a
 * reviewer or admin who is not on the run — decides to continue (with a reason) or to abandon it.
 * A step may be recorded as not applicable (with why) or as a deviation (what was done instead);
 * a deviation waits for a senior's approval or refusal before the run can be signed. Both count as
 * finishing the step, both are part of the signed content. Triggers (drizzle/0023) hold the same.
 */
import { and, asc, desc, eq, inArray, isNull, sql } from 'drizzle-orm';
import type { Request } from 'express';
import type {
  AwaitingDecision,
  DeviationDecisionBody,
  HoldDecisionBody,
  RunHoldPointView,
  RunStepExceptionView,
  StepExceptionBody,
} from '../../../shared/schemas/run-decisions';
import { SENIOR_WORDS, STEP_EXCEPTION_WORDS } from '../../../shared/schemas/run-decisions';
import type { RunStep } from '../../../shared/schemas/runs';
import { formatQuantity } from '../../../shared/units/format';
import { recordAudit } from '../../audit/record';
import type { Db, Tx } from '../../db/client';
import { people, runEntries, runHolds, runs, runStepExceptions, units } from '../../db/schema';
import { conflict, HttpError, notFound, refuse } from '../../http/errors';
import type { SessionUser } from '../../http/route';
import { assertWritable } from './run-custody';
import { isFinished, lockedSteps } from './run-steps';
import type { EntryRow, RunRow } from './runs.service';

type HoldRow = typeof runHolds.$inferSelect;
type ExceptionRow = typeof runStepExceptions.$inferSelect;

const short = (s: string, n = 80) => (s.length > n ? `${s.slice(0, n - 1)}…` : s);
const stepOf = (run: Pick<RunRow, 'steps'>, stepId: string) => run.steps.find((s) => s.id === stepId);
const stepWords = (step: RunStep | undefined, stepId: string) =>
  step ? `“${short(step.text, 60)}” (step ${step.position})` : `step ${stepId}`;
const band = (h: Pick<HoldRow, 'low' | 'high' | 'unit'>) =>
  h.low !== null && h.high !== null
    ? `${formatQuantity(h.low, h.unit, 4)} … ${formatQuantity(h.high, h.unit, 4)}`
    : 'no band';

/** The 409 for a run stopped at a hold point, naming the reading and who may decide. */
export function heldAtHoldPoint(run: Pick<RunRow, 'steps'>, hold: HoldRow) {
  return conflict(
    `The reading ${stepWords(stepOf(run, hold.stepId), hold.stepId)} is a hold point and was out of band: measured ${hold.raw}, expected ${band(hold)}. This bench run is stopped until ${SENIOR_WORDS} decides to continue or abandon it.`,
    { code: 'hold-point', holdId: hold.id },
  );
}

/** Refuses a write while a hold point on the run waits for its decision. */
export async function refuseWhileHeld(db: Db | Tx, run: RunRow) {
  const [open] = await db
    .select()
    .from(runHolds)
    .where(and(eq(runHolds.runId, run.id), isNull(runHolds.decision)));
  if (open) throw heldAtHoldPoint(run, open);
}

/** Called in recordEntry's transaction after the entry is written: an out-of-band hold point stops the run. */
export async function openHoldIfOutOfBand(tx: Tx, run: RunRow, entry: EntryRow, newReading: boolean) {
  const step = stepOf(run, entry.stepId);
  if (!newReading || !step?.holdPoint || entry.within !== false || entry.measured === null) return null;
  const [hold] = await tx
    .insert(runHolds)
    .values({
      runId: run.id,
      stepId: entry.stepId,
      entryVersion: entry.version,
      raw: entry.raw ?? String(entry.measured),
      measured: entry.measured,
      unit: entry.unit ?? step.reading?.unit ?? '',
      low: entry.low,
      high: entry.high,
      openedBy: entry.enteredBy,
    })
    .returning();
  return hold!;
}

async function lockOpenRun(tx: Tx, runId: string) {
  const [run] = await tx.select().from(runs).where(eq(runs.id, runId)).for('update');
  if (!run) throw notFound('No such bench run.');
  return run;
}

/** A senior decides, never the technician on the run (the database holds the same). */
function assertNotOnRun(run: RunRow, user: SessionUser, recordedBy?: string) {
  if (run.performedBy === user.id || recordedBy === user.id)
    throw new HttpError(403, `You are on this bench run; ${SENIOR_WORDS} decides.`, {
      code: 'own-run',
    });
}

const nameOf = async (tx: Tx, id: string, fallback: string) =>
  (await tx.select({ name: people.displayName }).from(people).where(eq(people.id, id)))[0]?.name ?? fallback;

/** Continue (with a reason) or abandon a run stopped at a hold point; audited. */
export async function decideHold(
  db: Db | Tx,
  user: SessionUser,
  runId: string,
  holdId: string,
  body: HoldDecisionBody,
  req?: Request,
) {
  await db.transaction(async (tx) => {
    const run = await lockOpenRun(tx, runId);
    const [hold] = await tx
      .select()
      .from(runHolds)
      .where(and(eq(runHolds.id, holdId), eq(runHolds.runId, runId)));
    if (!hold) throw notFound('This bench run has no such hold.');
    if (hold.decision)
      throw conflict(
        `${hold.decidedByName} already decided this hold (${hold.decision}); a decided hold cannot be changed.`,
      );
    if (run.status !== 'in_progress')
      throw conflict('This bench run is no longer open; its hold cannot be decided.');
    assertNotOnRun(run, user, hold.openedBy);
    const name = await nameOf(tx, user.id, user.displayName);
    await tx
      .update(runHolds)
      .set({ decision: body.decision, reason: body.reason, decidedBy: user.id, decidedByName: name })
      .where(eq(runHolds.id, holdId));
    if (body.decision === 'abandon') {
      const step = stepOf(run, hold.stepId);
      await tx
        .update(runs)
        .set({
          status: 'abandoned',
          closedAt: sql`now()`,
          closedBy: user.id,
          closeReason: `Abandoned at the hold point ${stepWords(step, hold.stepId)}: ${body.reason}`,
        })
        .where(and(eq(runs.id, runId), eq(runs.status, 'in_progress')));
    }
    await recordAudit(tx, {
      action: 'run.hold-decided',
      actorId: user.id,
      subject: `run ${runId}`,
      details: {
        holdId,
        stepId: hold.stepId,
        measured: hold.raw,
        decision: body.decision,
        reason: body.reason,
      },
      req,
    });
  });
}

/** The latest record for each step: the one that counts. */
function currentByStep(rows: ExceptionRow[]) {
  const latest = new Map<string, ExceptionRow>();
  for (const r of [...rows].sort((a, b) => a.recordedAt.getTime() - b.recordedAt.getTime()))
    latest.set(r.stepId, r);
  return latest;
}

/** Steps a record finishes: not applicable, or a deviation a senior approved. */
export function excusedSteps(rows: ExceptionRow[]): Set<string> {
  return new Set(
    [...currentByStep(rows).values()]
      .filter((r) => r.kind === 'not_applicable' || r.decision === 'approved')
      .map((r) => r.stepId),
  );
}

/** The technician records a step as not applicable or as a deviation; audited. */
export async function recordStepException(
  db: Db | Tx,
  user: SessionUser,
  runId: string,
  body: StepExceptionBody,
  req?: Request,
) {
  await db.transaction(async (tx) => {
    const run = await lockOpenRun(tx, runId);
    await assertWritable(tx, run, user);
    await refuseWhileHeld(tx, run);
    const step = stepOf(run, body.stepId);
    if (!step) throw refuse({ field: 'body.stepId', label: 'Step', reason: 'This run has no such step' });
    if (step.kind === 'hazard')
      throw refuse({
        field: 'body.stepId',
        label: 'Step',
        reason: 'A hazard note is always acknowledged; it cannot be skipped or done another way',
      });
    const entries = await tx.select().from(runEntries).where(eq(runEntries.runId, runId));
    const { gate, locked } = lockedSteps(run.steps, new Map(entries.map((e) => [e.stepId, e])));
    if (gate && locked.includes(step.id))
      throw conflict(
        `Acknowledge the hazard note “${short(gate.text)}” (step ${gate.position}) before the steps after it.`,
        { hazardNoteId: gate.id },
      );
    if (
      body.kind === 'not_applicable' &&
      isFinished(
        step,
        entries.find((e) => e.stepId === step.id),
      )
    )
      throw conflict(
        `${stepWords(step, step.id)} is already recorded as done; it cannot also be not applicable. Record a deviation if it was done another way.`,
      );
    const rows = await tx.select().from(runStepExceptions).where(eq(runStepExceptions.runId, runId));
    const current = currentByStep(rows).get(step.id);
    if (current?.kind === 'deviation' && current.decision === null)
      throw conflict(
        `A deviation on ${stepWords(step, step.id)} already waits for ${SENIOR_WORDS} to decide.`,
      );
    const name = await nameOf(tx, user.id, user.displayName);
    const [row] = await tx
      .insert(runStepExceptions)
      .values({
        runId,
        stepId: step.id,
        kind: body.kind,
        reason: body.reason,
        recordedBy: user.id,
        recordedByName: name,
      })
      .returning();
    await recordAudit(tx, {
      action: 'run.step-excepted',
      actorId: user.id,
      subject: `run ${runId}`,
      details: { exceptionId: row!.id, stepId: step.id, kind: body.kind, reason: body.reason },
      req,
    });
  });
}

/** A senior approves or refuses a deviation, with a note; audited. */
export async function decideDeviation(
  db: Db | Tx,
  user: SessionUser,
  runId: string,
  exceptionId: string,
  body: DeviationDecisionBody,
  req?: Request,
) {
  await db.transaction(async (tx) => {
    const run = await lockOpenRun(tx, runId);
    const [row] = await tx
      .select()
      .from(runStepExceptions)
      .where(and(eq(runStepExceptions.id, exceptionId), eq(runStepExceptions.runId, runId)));
    if (!row) throw notFound('This bench run has no such step record.');
    if (row.kind !== 'deviation')
      throw conflict('A step recorded as not applicable needs no decision; only a deviation is approved.');
    if (row.decision)
      throw conflict(
        `${row.decidedByName} already ${row.decision} this deviation; a decided deviation cannot be changed.`,
      );
    if (run.status !== 'in_progress')
      throw conflict('This bench run is no longer open; its deviation cannot be decided.');
    assertNotOnRun(run, user, row.recordedBy);
    const name = await nameOf(tx, user.id, user.displayName);
    await tx
      .update(runStepExceptions)
      .set({ decision: body.decision, decisionNote: body.note, decidedBy: user.id, decidedByName: name })
      .where(eq(runStepExceptions.id, exceptionId));
    await recordAudit(tx, {
      action: 'run.deviation-decided',
      actorId: user.id,
      subject: `run ${runId}`,
      details: { exceptionId, stepId: row.stepId, decision: body.decision, note: body.note },
      req,
    });
  });
}

/** Refuses signing (or witnessing) while a hold or a deviation waits for a senior. */
export async function refuseWhileAwaiting(db: Db | Tx, run: RunRow) {
  await refuseWhileHeld(db, run);
  const [waiting] = await db
    .select()
    .from(runStepExceptions)
    .where(
      and(
        eq(runStepExceptions.runId, run.id),
        eq(runStepExceptions.kind, 'deviation'),
        isNull(runStepExceptions.decision),
      ),
    );
  if (waiting)
    throw conflict(
      `The deviation on ${stepWords(stepOf(run, waiting.stepId), waiting.stepId)} waits for ${SENIOR_WORDS} to approve it; the run sheet can be signed after that.`,
      { code: 'deviation-awaiting', exceptionId: waiting.id },
    );
}

export async function decisionRows(db: Db | Tx, runId: string) {
  const [holds, exceptions] = await Promise.all([
    db.select().from(runHolds).where(eq(runHolds.runId, runId)).orderBy(asc(runHolds.openedAt)),
    db
      .select()
      .from(runStepExceptions)
      .where(eq(runStepExceptions.runId, runId))
      .orderBy(asc(runStepExceptions.recordedAt)),
  ]);
  return { holds, exceptions };
}

/** What the signature covers of them (absent when a run has none, so older sheets hash as they did). */
export function decisionContent({ holds, exceptions }: { holds: HoldRow[]; exceptions: ExceptionRow[] }) {
  const iso = (d: Date | null) => d?.toISOString() ?? null;
  return {
    ...(holds.length && {
      holds: holds.map((h) => ({
        id: h.id,
        stepId: h.stepId,
        raw: h.raw,
        decision: h.decision,
        reason: h.reason,
        decidedBy: h.decidedBy,
        decidedAt: iso(h.decidedAt),
      })),
    }),
    ...(exceptions.length && {
      exceptions: exceptions.map((x) => ({
        id: x.id,
        stepId: x.stepId,
        kind: x.kind,
        reason: x.reason,
        recordedBy: x.recordedBy,
        decision: x.decision,
        decisionNote: x.decisionNote,
        decidedBy: x.decidedBy,
        decidedAt: iso(x.decidedAt),
      })),
    }),
  };
}

/** The run page's view of them. */
export function decisionViews(
  run: Pick<RunRow, 'steps'>,
  { holds, exceptions }: { holds: HoldRow[]; exceptions: ExceptionRow[] },
  who: (id: string) => { id: string; displayName: string },
): { holdPoints: RunHoldPointView[]; exceptions: RunStepExceptionView[] } {
  const iso = (d: Date | null) => d?.toISOString() ?? null;
  const place = (stepId: string) => {
    const s = stepOf(run, stepId);
    return { position: s?.position ?? 0, text: s?.text ?? stepId };
  };
  const current = currentByStep(exceptions);
  return {
    holdPoints: holds.map((h) => ({
      id: h.id,
      stepId: h.stepId,
      ...place(h.stepId),
      raw: h.raw,
      measured: h.measured,
      unit: h.unit,
      low: h.low,
      high: h.high,
      openedBy: who(h.openedBy),
      openedAt: h.openedAt.toISOString(),
      decision: h.decision,
      reason: h.reason,
      decidedBy: h.decidedBy ? { id: h.decidedBy, displayName: h.decidedByName ?? '' } : null,
      decidedAt: iso(h.decidedAt),
    })),
    exceptions: exceptions.map((x) => ({
      id: x.id,
      stepId: x.stepId,
      ...place(x.stepId),
      kind: x.kind,
      reason: x.reason,
      recordedBy: { id: x.recordedBy, displayName: x.recordedByName },
      recordedAt: x.recordedAt.toISOString(),
      decision: x.decision,
      decisionNote: x.decisionNote,
      decidedBy: x.decidedBy ? { id: x.decidedBy, displayName: x.decidedByName ?? '' } : null,
      decidedAt: iso(x.decidedAt),
      current: current.get(x.stepId)?.id === x.id,
    })),
  };
}

/** Holds and deviations on open runs waiting for a senior, oldest first (runs the person is on left out). */
export async function awaitingDecisions(db: Db, user: SessionUser): Promise<AwaitingDecision[]> {
  const runCols = {
    runId: runs.id,
    title: runs.title,
    steps: runs.steps,
    performedBy: runs.performedBy,
    model: units.model,
    serial: units.serial,
  };
  const [holds, deviations] = await Promise.all([
    db
      .select({ row: runHolds, ...runCols })
      .from(runHolds)
      .innerJoin(runs, eq(runs.id, runHolds.runId))
      .innerJoin(units, eq(units.id, runs.unitId))
      .where(and(isNull(runHolds.decision), eq(runs.status, 'in_progress')))
      .orderBy(asc(runHolds.openedAt)),
    db
      .select({ row: runStepExceptions, ...runCols })
      .from(runStepExceptions)
      .innerJoin(runs, eq(runs.id, runStepExceptions.runId))
      .innerJoin(units, eq(units.id, runs.unitId))
      .where(
        and(
          eq(runStepExceptions.kind, 'deviation'),
          isNull(runStepExceptions.decision),
          eq(runs.status, 'in_progress'),
        ),
      )
      .orderBy(desc(runStepExceptions.recordedAt)),
  ]);
  const performers = [...new Set([...holds, ...deviations].map((r) => r.performedBy))];
  const names = performers.length
    ? await db
        .select({ id: people.id, displayName: people.displayName })
        .from(people)
        .where(inArray(people.id, performers))
    : [];
  const person = (id: string) => names.find((n) => n.id === id) ?? { id, displayName: 'unknown' };
  const base = (r: (typeof holds)[number] | (typeof deviations)[number], stepId: string) => {
    const s = stepOf(r, stepId);
    return {
      runId: r.runId,
      runTitle: r.title,
      unit: { model: r.model, serial: r.serial },
      performedBy: person(r.performedBy),
      step: { id: stepId, position: s?.position ?? 0, text: s?.text ?? stepId },
    };
  };
  return [
    ...holds.map((h): AwaitingDecision => ({
      kind: 'hold',
      id: h.row.id,
      ...base(h, h.row.stepId),
      detail: `Measured ${h.row.raw}, expected ${band(h.row)}`,
      since: h.row.openedAt.toISOString(),
    })),
    ...deviations.map((d): AwaitingDecision => ({
      kind: 'deviation',
      id: d.row.id,
      ...base(d, d.row.stepId),
      detail: `${STEP_EXCEPTION_WORDS.deviation}: ${d.row.reason}`,
      since: d.row.recordedAt.toISOString(),
    })),
  ].filter((a) => a.performedBy.id !== user.id);
}
