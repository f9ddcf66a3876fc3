/**
 * Blank bench sheets and the readings copied in from them. A sheet is an approved revision's steps
 * worked out for one mains (the same evaluation a bench run makes); a run whose readings come from
 * a sheet keeps the date written on it, and each entry made meanwhile keeps that date as the day it
 * was taken. drizzle/0025 holds the same date rules underneath.
 */
import { eq } from 'drizzle-orm';
import { evaluateDocument } from '../../../shared/document/evaluate';
import { benchSheetModel, parseBenchSheetId } from '../../../shared/runs/bench-sheet-model';
import type { PaperSheetInput } from '../../../shared/schemas/paper-sheets';
import type { Db, Tx } from '../../db/client';
import { revisions, runs } from '../../db/schema';
import { conflict, notFound, refuse } from '../../http/errors';
import type { SessionUser } from '../../http/route';
import type { FileStore } from '../../storage/files';
import { revisionContentHash } from '../review/signed-content';
import { assertWritable } from '../runs/run-custody';
import { buildSteps } from '../runs/run-steps';

const dayOf = (ms: number) => new Date(ms).toISOString().slice(0, 10);
/**
 * A sheet's date is the shop's calendar date, so the bounds are the widest any shop could have:
 * today where the date is latest (UTC+14), the approval day where it is earliest (UTC−12).
 */
const latestToday = () => dayOf(Date.now() + 14 * 3_600_000);
const earliestDayOf = (at: Date) => dayOf(at.getTime() - 12 * 3_600_000);

/** An approved revision's blank bench sheet at the mains asked for (the frequency defaults to the procedure's). */
export async function benchSheet(
  db: Db,
  files: FileStore,
  user: SessionUser,
  revisionId: string,
  mains: { mainsVoltage: number; mainsFrequency?: number },
) {
  const [revision] = await db.select().from(revisions).where(eq(revisions.id, revisionId));
  if (!revision) throw notFound('No such revision.');
  if (revision.state !== 'approved')
    throw conflict(
      `Revision ${revision.number} is ${revision.state.replace('_', ' ')}; bench sheets are printed from approved revisions only.`,
      { state: revision.state },
    );
  const params = {
    ...revision.params,
    mainsVoltage: mains.mainsVoltage,
    mainsFrequency: mains.mainsFrequency ?? revision.params.mainsFrequency,
  };
  return benchSheetModel({
    revision: {
      title: revision.title,
      number: revision.number,
      contentHash: await revisionContentHash(db, files, revision),
      changeReason: revision.changeReason,
      approvedAt: revision.decidedAt?.toISOString() ?? null,
      equipmentModel: revision.equipmentModel,
    },
    params,
    steps: buildSteps(revision.document, evaluateDocument(revision.document, params)),
    printedOn: dayOf(Date.now()),
    printedBy: user.displayName,
  });
}

/**
 * Refuses a paper sheet that cannot belong to this run: dated in the future or before the revision
 * was approved, or (when its identifier is given) printed from another revision, for another mains,
 * or after the date written on it. `at` names the body field ("body.paperSheet").
 */
export async function checkPaperSheet(
  db: Db | Tx,
  sheet: PaperSheetInput,
  run: { revisionId: string; revisionHash: string; params: { mainsVoltage: number; mainsFrequency: number } },
  at: string,
) {
  const dateField = { field: `${at}.date`, label: 'Paper sheet date' };
  if (sheet.date > latestToday()) throw refuse({ ...dateField, reason: `${sheet.date} is in the future` });
  const [revision] = await db
    .select({ number: revisions.number, decidedAt: revisions.decidedAt })
    .from(revisions)
    .where(eq(revisions.id, run.revisionId));
  const approvedOn = revision?.decidedAt ? earliestDayOf(revision.decidedAt) : null;
  if (!approvedOn || sheet.date < approvedOn)
    throw refuse({
      ...dateField,
      reason: `${sheet.date} is before revision ${revision?.number ?? ''} was approved (${revision?.decidedAt?.toISOString().slice(0, 10) ?? 'not approved'})`,
    });
  if (!sheet.reference) return;
  const refField = { field: `${at}.reference`, label: 'Sheet identifier' };
  const id = parseBenchSheetId(sheet.reference);
  if (!id)
    throw refuse({
      ...refField,
      reason: 'Copy the identifier as printed, such as BS-3f2a9c1b7d04-230V-50Hz-20260314',
    });
  if (!run.revisionHash.startsWith(id.hashPrefix))
    throw refuse({ ...refField, reason: 'This sheet was printed from another revision' });
  const { mainsVoltage, mainsFrequency } = run.params;
  if (
    Math.abs(id.mainsVoltage - mainsVoltage) > 0.005 ||
    Math.abs(id.mainsFrequency - mainsFrequency) > 0.005
  )
    throw refuse({
      ...refField,
      reason: `This sheet was worked out for ${id.mainsVoltage} V, ${id.mainsFrequency} Hz; the run is at ${mainsVoltage} V, ${mainsFrequency} Hz`,
    });
  if (id.printedOn > sheet.date)
    throw refuse({ ...dateField, reason: `${sheet.date} is before the sheet was printed (${id.printedOn})` });
}

/** The columns a paper sheet sets on a run (both null: entries are made at the bench again). */
export const paperSheetColumns = (sheet: PaperSheetInput | null | undefined) => ({
  paperSheetDate: sheet?.date ?? null,
  paperSheetRef: sheet?.reference?.replace(/\s+/g, '') || null,
});

/** From now on, entries of this open run are copied from this paper sheet (or, with null, made at the bench). */
export async function setPaperSheet(db: Db, user: SessionUser, runId: string, sheet: PaperSheetInput | null) {
  return db.transaction(async (tx) => {
    const [run] = await tx.select().from(runs).where(eq(runs.id, runId)).for('update');
    if (!run) throw notFound('No such bench run.');
    await assertWritable(tx, run, user);
    if (sheet) await checkPaperSheet(tx, sheet, run, 'body.paperSheet');
    const [row] = await tx.update(runs).set(paperSheetColumns(sheet)).where(eq(runs.id, runId)).returning();
    return row!;
  });
}
