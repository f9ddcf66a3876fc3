/**
 * Who may write on a bench run: only its current performer records entries, adds photos and signs.
 * A run changes hands only by an explicit handover (recorded, audited, named on the sheet), and an
 * open run can be closed as abandoned. Triggers (drizzle/0017) refuse the same underneath.
 */
import { and, eq, sql } from 'drizzle-orm';
import type { Request } from 'express';
import type { HandoverBody } from '../../../shared/schemas/runs';
import { recordAudit } from '../../audit/record';
import type { Db, Tx } from '../../db/client';
import { people, revisions, runHandovers, runs } from '../../db/schema';
import { conflict, HttpError, notFound, refuse } from '../../http/errors';
import type { SessionUser } from '../../http/route';
import { heldBy, isLiveWork, missing } from '../registers/qualifications.service';
import { holdOf, onHold } from './run-hold';
import type { RunRow } from './runs.service';

const nameOf = async (db: Db | Tx, id: string) =>
  (await db.select({ name: people.displayName }).from(people).where(eq(people.id, id)))[0]?.name ??
  'another technician';

/** Refuses a write on a run that is signed, abandoned, on hold, or performed by someone else. */
export async function assertWritable(db: Db | Tx, run: RunRow, user: SessionUser) {
  if (run.status === 'signed') throw conflict('This run sheet is signed; nothing on it can change.');
  if (run.status === 'abandoned')
    throw conflict('This bench run was closed as abandoned; nothing on it can change.');
  if (run.performedBy !== user.id) {
    const name = await nameOf(db, run.performedBy);
    throw new HttpError(
      403,
      `${name} is performing this run; only they can record entries, add photos and sign. Ask them to hand it over to you.`,
      {
        code: 'not-performer',
        performedBy: { id: run.performedBy, displayName: name },
      },
    );
  }
  const hold = await holdOf(db, run, true);
  if (hold) throw onHold(hold);
}

async function lockRun(tx: Tx, runId: string) {
  const [run] = await tx.select().from(runs).where(eq(runs.id, runId)).for('update');
  if (!run) throw notFound('No such bench run.');
  if (run.status !== 'in_progress')
    throw conflict(
      `This bench run is ${run.status === 'signed' ? 'signed' : 'closed as abandoned'}; it can no longer be handed over or closed.`,
    );
  return run;
}

/** The performer themself, or an admin when the performer is away. */
async function assertInCharge(tx: Tx, run: RunRow, user: SessionUser, what: string) {
  if (run.performedBy === user.id || user.roles.includes('admin')) return;
  throw new HttpError(
    403,
    `${await nameOf(tx, run.performedBy)} is performing this run; only they or an admin can ${what}.`,
    { code: 'not-performer' },
  );
}

export async function handOverRun(
  db: Db,
  user: SessionUser,
  runId: string,
  body: HandoverBody,
  req: Request,
) {
  await db.transaction(async (tx) => {
    const run = await lockRun(tx, runId);
    await assertInCharge(tx, run, user, 'hand it over');
    const hold = await holdOf(tx, run, true);
    if (hold) throw onHold(hold);
    const [to] = await tx.select().from(people).where(eq(people.id, body.to));
    if (!to?.active || !to.roles.includes('technician'))
      throw refuse({ field: 'body.to', label: 'Technician', reason: 'Choose an active technician' });
    if (to.id === run.performedBy)
      throw refuse({
        field: 'body.to',
        label: 'Technician',
        reason: 'This technician already performs this run',
      });
    // The new performer must be qualified for the run, unless it has a witness (who cannot be the performer).
    if (run.witnessId === to.id)
      throw refuse({ field: 'body.to', label: 'Technician', reason: 'This technician is the run’s witness' });
    if (!run.witnessId) {
      const [rev] = await tx
        .select({ family: revisions.equipmentFamily })
        .from(revisions)
        .where(eq(revisions.id, run.revisionId));
      const lacks = missing(await heldBy(tx, to.id), rev!.family, isLiveWork(run.steps));
      if (lacks.length)
        throw refuse({
          field: 'body.to',
          label: 'Technician',
          reason: `${to.displayName} is not qualified for ${lacks.join(' or ')}, and this run has no witness`,
        });
    }
    const fromName = await nameOf(tx, run.performedBy);
    // The handover row first: the trigger lets the performer change only with it in place.
    await tx.insert(runHandovers).values({
      runId,
      fromId: run.performedBy,
      fromName,
      toId: to.id,
      toName: to.displayName,
      byId: user.id,
      byName: user.displayName,
      reason: body.reason,
    });
    await tx.update(runs).set({ performedBy: to.id }).where(eq(runs.id, runId));
    await recordAudit(tx, {
      action: 'run.handed-over',
      actorId: user.id,
      subject: `run ${runId}`,
      details: { from: run.performedBy, to: to.id, reason: body.reason },
      req,
    });
  });
}

export async function abandonRun(db: Db, user: SessionUser, runId: string, reason: string, req: Request) {
  await db.transaction(async (tx) => {
    const run = await lockRun(tx, runId);
    await assertInCharge(tx, run, user, 'close it');
    const hold = await holdOf(tx, run);
    await tx
      .update(runs)
      .set({ status: 'abandoned', closedAt: sql`now()`, closedBy: user.id, closeReason: reason })
      .where(and(eq(runs.id, runId), eq(runs.status, 'in_progress')));
    await recordAudit(tx, {
      action: 'run.abandoned',
      actorId: user.id,
      subject: `run ${runId}`,
      details: { reason, revisionId: run.revisionId, onHold: hold !== null },
      req,
    });
  });
}
