/**
 * A withdrawn revision puts the open runs on it on hold: nothing more can be recorded or signed
 * (the server refuses with the withdrawal reason, a database trigger underneath), the run can be
 * closed as abandoned, and the technicians on it are told by mail in the withdrawal's transaction.
 */
import { paths } from '../../../shared/paths';
import { and, asc, eq, gt, inArray } from 'drizzle-orm';
import type { RunHold, RunSupersession } from '../../../shared/schemas/runs';
import type { Db, Tx } from '../../db/client';
import { people, revisions, runEntries, runHandovers, runs, signatures, units } from '../../db/schema';
import { conflict } from '../../http/errors';
import { composeMail, enqueueMail } from '../../mail/outbox';
import type { RunRow } from './runs.service';

type RevisionRow = typeof revisions.$inferSelect;

/** The hold on an open run whose revision was withdrawn, or null. `lock` waits for a withdrawal in progress. */
export async function holdOf(
  db: Db | Tx,
  run: Pick<RunRow, 'status' | 'revisionId' | 'revisionNumber'>,
  lock = false,
): Promise<RunHold | null> {
  if (run.status !== 'in_progress') return null;
  const query = db.select({ state: revisions.state }).from(revisions).where(eq(revisions.id, run.revisionId));
  const [revision] = lock ? await query.for('share') : await query;
  if (revision?.state !== 'withdrawn') return null;
  const [signed] = await db
    .select({ comment: signatures.comment, signerName: signatures.signerName, signedAt: signatures.signedAt })
    .from(signatures)
    .where(and(eq(signatures.revisionId, run.revisionId), eq(signatures.meaning, 'withdrawn')));
  return {
    reason: signed?.comment ?? 'no reason recorded',
    by: signed?.signerName ?? 'unknown',
    at: (signed?.signedAt ?? new Date(0)).toISOString(),
    revisionNumber: run.revisionNumber,
  };
}

/**
 * A newer approved revision does not stop an open run (it keeps the revision it started on, and its
 * sheet says which); the technician is shown what changed since and where the new revision is.
 */
export async function supersessionOf(
  db: Db | Tx,
  run: Pick<RunRow, 'status' | 'procedureId' | 'revisionNumber'>,
): Promise<RunSupersession | null> {
  if (run.status !== 'in_progress') return null;
  const newer = await db
    .select({
      revisionId: revisions.id,
      number: revisions.number,
      state: revisions.state,
      changeReason: revisions.changeReason,
    })
    .from(revisions)
    .where(
      and(
        eq(revisions.procedureId, run.procedureId),
        gt(revisions.number, run.revisionNumber),
        inArray(revisions.state, ['approved', 'superseded']),
      ),
    )
    .orderBy(asc(revisions.number));
  const current = newer.find((r) => r.state === 'approved');
  if (!current) return null;
  return {
    revisionId: current.revisionId,
    number: current.number,
    changes: newer.map(({ revisionId, number, changeReason }) => ({ revisionId, number, changeReason })),
  };
}

export const onHold = (hold: RunHold) =>
  conflict(
    `Revision ${hold.revisionNumber} was withdrawn by ${hold.by}: “${hold.reason}” This bench run is on hold: nothing more can be recorded or signed on it; close it as abandoned.`,
    { code: 'on-hold', hold },
  );

/**
 * Called in the withdrawal's transaction: every technician on an open run of the revision (who
 * started it, performs it, took part in a handover or made an entry) gets one mail listing their runs.
 */
export async function tellTechniciansOnHold(
  tx: Tx,
  publicUrl: string,
  revision: RevisionRow,
  reason: string,
  withdrawnBy: string,
) {
  const open = await tx
    .select({
      id: runs.id,
      startedBy: runs.startedBy,
      performedBy: runs.performedBy,
      model: units.model,
      serial: units.serial,
    })
    .from(runs)
    .innerJoin(units, eq(units.id, runs.unitId))
    .where(and(eq(runs.revisionId, revision.id), eq(runs.status, 'in_progress')));
  if (!open.length) return [];
  const ids = open.map((r) => r.id);
  const [entries, handovers] = await Promise.all([
    tx
      .selectDistinct({ runId: runEntries.runId, who: runEntries.enteredBy })
      .from(runEntries)
      .where(inArray(runEntries.runId, ids)),
    tx
      .select({ runId: runHandovers.runId, from: runHandovers.fromId, to: runHandovers.toId })
      .from(runHandovers)
      .where(inArray(runHandovers.runId, ids)),
  ]);
  const onRun = new Map<string, Set<string>>(open.map((r) => [r.id, new Set([r.startedBy, r.performedBy])]));
  for (const e of entries) onRun.get(e.runId)!.add(e.who);
  for (const h of handovers) onRun.get(h.runId)!.add(h.from).add(h.to);
  const everyone = [...new Set([...onRun.values()].flatMap((s) => [...s]))];
  const technicians = await tx
    .select({ id: people.id, email: people.email, displayName: people.displayName })
    .from(people)
    .where(and(inArray(people.id, everyone), eq(people.active, true)));
  for (const person of technicians) {
    const theirs = open.filter((r) => onRun.get(r.id)!.has(person.id));
    await enqueueMail(tx, {
      to: [person.email],
      subject: `On hold: ${revision.title} revision ${revision.number} was withdrawn`.slice(0, 200),
      reason: 'run-on-hold',
      ...composeMail({
        greeting: `Hello ${person.displayName},`,
        lines: [
          `${withdrawnBy} withdrew revision ${revision.number} of “${revision.title}”: ${reason}`,
          `${theirs.length === 1 ? 'This bench run' : 'These bench runs'} of yours ${theirs.length === 1 ? 'is' : 'are'} on hold: nothing more can be recorded or signed. Close ${theirs.length === 1 ? 'it' : 'each'} as abandoned, and start again when a new revision is approved.`,
          ...theirs.map(
            (r) => `• ${r.model} ${r.serial}: ${new URL(paths.run.href(r.id), publicUrl).toString()}`,
          ),
        ],
        link: { url: new URL('/runs', publicUrl).toString(), label: 'Open the bench runs' },
      }),
    });
  }
  return ids;
}
