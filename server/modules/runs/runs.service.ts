import { and, asc, eq, sql } from 'drizzle-orm';
import { evaluateDocument } from '../../../shared/document/evaluate';
import type { EntryBody, StartRunBody } from '../../../shared/schemas/runs';
import type { Db, Tx } from '../../db/client';
import { people, revisions, runEntries, runEntryHistory, runPhotos, runs, units } from '../../db/schema';
import type { AppDeps } from '../../deps';
import { conflict, notFound, HttpError, refuse } from '../../http/errors';
import { canonicalJson, sha256Hex } from '../review/canonical';
import type { SessionUser } from '../../http/route';
import type { FileStore } from '../../storage/files';
import { revisionContentHash } from '../review/signed-content';
import { storePhoto } from './photo-upload';
import {
  acknowledgementMissing,
  acknowledgementRequired,
} from '../acknowledgements/acknowledgements.service';
import { assertWritable } from './run-custody';
import { openHoldIfOutOfBand, refuseWhileHeld } from './run-decisions';
import { usableInstrument } from '../registers/instruments.service';
import { checkWitness, eligibility, isLiveWork } from '../registers/qualifications.service';
import { checkEntryShape, decideReading, type DecidedReading } from './run-entry';
import { buildSteps, lockedSteps, type EntryState } from './run-steps';
import { checkPaperSheet, paperSheetColumns } from '../paper-sheets/paper-sheets.service';

export type RunRow = typeof runs.$inferSelect;
export type EntryRow = typeof runEntries.$inferSelect;

const short = (s: string, n = 80) => (s.length > n ? `${s.slice(0, n - 1)}…` : s);

/**
 * Starts a bench run on an approved revision: every expected value is evaluated again with the
 * bench's measured mains, and the run keeps that revision and its own snapshot from then on.
 */
export async function startRun(db: Db | Tx, files: FileStore, user: SessionUser, body: StartRunBody) {
  return db.transaction(async (tx) => {
    if (body.key) {
      const [existing] = await tx.select().from(runs).where(eq(runs.startKey, body.key));
      if (existing) {
        const same =
          existing.revisionId === body.revisionId &&
          existing.unitId === body.unitId &&
          existing.params.mainsVoltage === body.mainsVoltage &&
          existing.params.mainsFrequency === body.mainsFrequency &&
          existing.witnessId === (body.witnessId ?? null) &&
          existing.defaultInstrumentId === (body.instrumentId ?? null) &&
          existing.paperSheetDate === paperSheetColumns(body.paperSheet).paperSheetDate;
        if (!same) {
          throw new HttpError(
            422,
            'This start key was already used for a different run; nothing was started. Start again with a new key.',
            {
              fields: [{ field: 'body.key', reason: 'already used with a different request' }],
            },
          );
        }
        return { run: existing, created: false };
      }
    }
    const [revision] = await tx
      .select()
      .from(revisions)
      .where(eq(revisions.id, body.revisionId))
      .for('share');
    if (!revision) throw notFound('No such revision.');
    if (revision.state !== 'approved') {
      throw conflict(
        `Revision ${revision.number} of “${short(revision.title)}” is ${revision.state.replace('_', ' ')}; bench runs follow approved revisions only.`,
        { state: revision.state },
      );
    }
    // Read before you run: someone who ran an earlier revision acknowledges this one first.
    if (await acknowledgementMissing(tx, revision, user.id)) throw acknowledgementRequired(revision);
    const [unit] = await tx.select().from(units).where(eq(units.id, body.unitId));
    if (!unit)
      throw refuse({ field: 'body.unitId', label: 'Unit on the bench', reason: 'Choose a registered unit' });
    const params = {
      ...revision.params,
      mainsVoltage: body.mainsVoltage,
      mainsFrequency: body.mainsFrequency,
    };
    const snapshot = evaluateDocument(revision.document, params);
    const steps = buildSteps(revision.document, snapshot);
    // A trainee runs only with a qualified witness; the database holds the same rule.
    if (body.witnessId) {
      await checkWitness(tx, user.id, body.witnessId, revision.equipmentFamily, isLiveWork(steps));
    } else {
      const may = await eligibility(tx, user.id, { equipmentFamily: revision.equipmentFamily, steps });
      if (may.refusal)
        throw new HttpError(403, may.refusal, {
          code: 'not-qualified',
          fields: [{ field: 'body.witnessId', reason: 'name a qualified witness' }],
          witnesses: may.witnesses,
        });
    }
    if (body.instrumentId) await usableInstrument(tx, body.instrumentId, 'body.instrumentId');
    const revisionHash = await revisionContentHash(tx, files, revision);
    if (body.paperSheet)
      await checkPaperSheet(
        tx,
        body.paperSheet,
        { revisionId: revision.id, revisionHash, params },
        'body.paperSheet',
      );
    const [run] = await tx
      .insert(runs)
      .values({
        unitId: unit.id,
        procedureId: revision.procedureId,
        revisionId: revision.id,
        revisionNumber: revision.number,
        revisionHash,
        title: revision.title,
        params,
        snapshot,
        steps,
        startKey: body.key,
        witnessId: body.witnessId ?? null,
        defaultInstrumentId: body.instrumentId ?? null,
        ...paperSheetColumns(body.paperSheet),
        startedBy: user.id,
        performedBy: user.id,
      })
      .returning();
    return { run: run!, created: true };
  });
}

/** Whether this person may run a revision alone, and if not who could witness (for the start-run form). */
export async function runEligibility(db: Db, personId: string, revisionId: string) {
  const [revision] = await db.select().from(revisions).where(eq(revisions.id, revisionId));
  if (!revision) throw notFound('No such revision.');
  return eligibility(db, personId, {
    equipmentFamily: revision.equipmentFamily,
    steps: buildSteps(revision.document, revision.snapshot),
  });
}

/** What an idempotency key stands for: the step and everything the body asks for. */
const entryRequestHash = (runId: string, stepId: string, body: EntryBody) =>
  sha256Hex(
    canonicalJson({
      runId,
      stepId,
      value: body.value,
      done: body.done,
      note: body.note,
      reason: body.reason,
      instrumentId: body.instrumentId,
    }),
  );

const stateOf = (rows: EntryRow[]) => new Map<string, EntryState>(rows.map((e) => [e.stepId, e]));

/**
 * Records one entry for one step. The idempotency key makes a resend harmless: the same key
 * returns what was stored. Every version goes to the append-only history with who, when and why.
 */
export async function recordEntry(
  db: Db | Tx,
  user: SessionUser,
  runId: string,
  stepId: string,
  body: EntryBody,
) {
  // An entry carries who made it on the tablet; it is never recorded in another person's name.
  if (body.by !== undefined && body.by !== user.id) {
    throw conflict('This entry was made by someone else; it can only be sent from their own session.', {
      code: 'not-the-maker',
      fields: [{ field: 'body.by', reason: 'not the signed-in person' }],
    });
  }
  return db.transaction(async (tx) => {
    const [run] = await tx.select().from(runs).where(eq(runs.id, runId)).for('update');
    if (!run) throw notFound('No such bench run.');
    const [seen] = await tx
      .select()
      .from(runEntryHistory)
      .where(eq(runEntryHistory.idempotencyKey, body.key));
    const requestHash = entryRequestHash(runId, stepId, body);
    if (seen) {
      // A resend is the same request; the same key with anything else would silently drop the new value.
      if (
        seen.runId !== runId ||
        seen.stepId !== stepId ||
        (seen.requestHash !== null && seen.requestHash !== requestHash)
      ) {
        throw new HttpError(
          422,
          'This idempotency key was already used for a different entry; nothing was recorded. Send the entry again with a new key.',
          {
            fields: [{ field: 'body.key', reason: 'already used with a different request' }],
          },
        );
      }
      // What the entry is now (the answer to a resend is the entry as it stands).
      const rows = await tx.select().from(runEntries).where(eq(runEntries.runId, runId));
      const entry = rows.find((r) => r.stepId === stepId);
      if (!entry) throw notFound('This entry is no longer recorded.');
      return { replayed: true, run, entry, rows, instrument: null, stoppedAtHoldPoint: false };
    }
    await assertWritable(tx, run, user);
    await refuseWhileHeld(tx, run);
    const step = run.steps.find((s) => s.id === stepId);
    if (!step) throw notFound(`This run has no step “${short(stepId, 40)}”.`);
    const rows = await tx.select().from(runEntries).where(eq(runEntries.runId, runId));
    const { gate, locked } = lockedSteps(run.steps, stateOf(rows));
    if (gate && locked.includes(stepId)) {
      throw conflict(
        `Acknowledge the hazard note “${short(gate.text)}” (step ${gate.position}) before the steps after it.`,
        { hazardNoteId: gate.id },
      );
    }
    const existing = rows.find((r) => r.stepId === stepId);
    checkEntryShape(step, body, !!existing);

    let reading: DecidedReading | null = null;
    if (step.kind === 'reading' && body.value !== undefined) reading = decideReading(step, body.value);
    if (step.kind !== 'reading' && body.instrumentId !== undefined)
      throw refuse({
        field: 'body.instrumentId',
        label: 'Instrument',
        reason: 'Only a reading is taken with an instrument',
      });
    // Who took the reading: the one chosen for it, else the one it was taken with, else the run's usual one.
    const instrumentId =
      step.kind === 'reading'
        ? (body.instrumentId ?? existing?.instrumentId ?? run.defaultInstrumentId)
        : null;
    const instrument =
      instrumentId && (reading || body.instrumentId)
        ? await usableInstrument(tx, instrumentId, 'body.instrumentId')
        : null;
    const done = step.kind === 'reading' ? false : (body.done ?? existing?.done ?? false);
    const changesMeasurement =
      !!existing &&
      ((reading && existing.measured !== null && reading.measured !== existing.measured) ||
        (existing.done && !done));
    if (changesMeasurement && !body.reason) {
      throw refuse({
        field: 'body.reason',
        label: 'Reason for the change',
        reason: 'Say why a recorded entry is being changed',
      });
    }
    const values = {
      ...(reading ?? {}),
      ...(instrument && { instrumentId: instrument.id, instrumentDue: instrument.calibrationDue }),
      done,
      note: body.note ?? existing?.note ?? '',
      lastKey: body.key,
      enteredBy: user.id,
      // Copied from a paper sheet: the day written on it is the day it was taken.
      takenOn: run.paperSheetDate,
    };
    let entry: EntryRow;
    if (existing) {
      [entry] = (await tx
        .update(runEntries)
        .set({ ...values, version: existing.version + 1, enteredAt: sql`now()` })
        .where(and(eq(runEntries.id, existing.id)))
        .returning()) as [EntryRow];
    } else {
      [entry] = (await tx
        .insert(runEntries)
        .values({ ...values, runId, stepId, kind: step.kind })
        .returning()) as [EntryRow];
    }
    await tx.insert(runEntryHistory).values({
      runId,
      entryId: entry.id,
      stepId,
      version: entry.version,
      idempotencyKey: body.key,
      requestHash,
      raw: entry.raw,
      measured: entry.measured,
      within: entry.within,
      done: entry.done,
      note: entry.note,
      reason: body.reason ?? null,
      takenOn: entry.takenOn,
      enteredBy: user.id,
      enteredByName: user.displayName,
    });
    const hold = await openHoldIfOutOfBand(tx, run, entry, reading !== null);
    // The run row is locked, so its entries are exactly `rows` with this one put in.
    const outOfTolerance = [...rows.filter((r) => r.id !== entry.id), entry].some((r) => r.within === false);
    if (outOfTolerance !== run.outOfTolerance)
      await tx.update(runs).set({ outOfTolerance }).where(eq(runs.id, runId));
    const after = [...rows.filter((r) => r.id !== entry.id), entry];
    return {
      replayed: false,
      run: { ...run, outOfTolerance },
      entry,
      rows: after,
      instrument,
      stoppedAtHoldPoint: hold !== null,
    };
  });
}

/** Active technicians, to whom a bench run can be handed over. */
export const activeTechnicians = (db: Db) =>
  db
    .select({ id: people.id, displayName: people.displayName })
    .from(people)
    .where(and(eq(people.active, true), sql`'technician' = any(${people.roles})`))
    .orderBy(asc(people.displayName));

/** Stores an uploaded photo on the run, optionally on one of its steps; only while the run is writable. */
export async function addRunPhoto(
  deps: AppDeps,
  user: SessionUser,
  runId: string,
  stepId: string | null,
  file: Express.Multer.File | undefined,
) {
  const [run] = await deps.db.select().from(runs).where(eq(runs.id, runId));
  if (!run) throw notFound('No such bench run.');
  await assertWritable(deps.db, run, user);
  if (stepId !== null && !run.steps.some((s) => s.id === stepId))
    throw refuse({ field: 'body.stepId', label: 'Step', reason: 'This run has no such step' });
  const attachment = await storePhoto(deps, file, user.id);
  const [photo] = await deps.db
    .insert(runPhotos)
    .values({ runId, stepId, attachmentId: attachment.id, addedBy: user.id })
    .returning();
  return {
    id: photo!.id,
    stepId,
    url: `/api/attachments/${attachment.id}`,
    addedBy: { id: user.id, displayName: user.displayName },
    addedAt: photo!.addedAt.toISOString(),
  };
}
