import { and, asc, desc, eq, inArray, sql, type SQL } from 'drizzle-orm';
import type {
  EntryView,
  RevisionRecord,
  RunListItem,
  RunStatus,
  RunView,
} from '../../../shared/schemas/runs';
import type { Db, Tx } from '../../db/client';
import {
  attachments,
  instruments,
  people,
  revisions,
  runEntries,
  runEntryHistory,
  runHandovers,
  runPhotos,
  runs,
  runSignatures,
  runWitnessSignatures,
  signatures,
  units,
} from '../../db/schema';
import { notFound } from '../../http/errors';
import type { FileStore } from '../../storage/files';
import { runContentHash, type RunContent } from './run-hash';
import { holdOf, supersessionOf } from './run-hold';
import { releaseAndFollowUps } from './run-release';
import { lockedSteps, progressOf } from './run-steps';
import { decisionContent, decisionRows, decisionViews, excusedSteps } from './run-decisions';
import type { RunRow } from './runs.service';

const iso = (d: Date | null) => (d ? d.toISOString() : null);

async function names(db: Db | Tx, ids: string[]) {
  const unique = [...new Set(ids)];
  const rows = unique.length
    ? await db
        .select({ id: people.id, displayName: people.displayName })
        .from(people)
        .where(inArray(people.id, unique))
    : [];
  const map = new Map(rows.map((r) => [r.id, r]));
  return (id: string) => map.get(id) ?? { id, displayName: 'unknown' };
}

type EntryRow = typeof runEntries.$inferSelect;
type PhotoHash = RunContent['photos'][number];
type Decisions = Awaited<ReturnType<typeof decisionRows>>;

/** Photos with the SHA-256 their rows recorded, kept only where the stored bytes still hash to it. */
const rehashed = (
  files: FileStore,
  photos: { id: string; stepId: string | null; sha256: string }[],
): Promise<PhotoHash[]> =>
  Promise.all(
    photos.map(async (p) => ({
      id: p.id,
      stepId: p.stepId,
      sha256: (await files.exists(p.sha256)) ? p.sha256 : null,
    })),
  );

/** The canonical content a technician's signature covers, from what is stored now (photos re-hashed). */
export async function runContent(
  db: Db | Tx,
  files: FileStore,
  run: RunRow,
  unit: RunContent['unit'],
): Promise<RunContent> {
  const [entries, photos, decisions] = await Promise.all([
    db.select().from(runEntries).where(eq(runEntries.runId, run.id)),
    db
      .select({ id: runPhotos.id, stepId: runPhotos.stepId, sha256: attachments.sha256 })
      .from(runPhotos)
      .innerJoin(attachments, eq(attachments.id, runPhotos.attachmentId))
      .where(eq(runPhotos.runId, run.id)),
    decisionRows(db, run.id),
  ]);
  return contentOf(run, unit, entries, await rehashed(files, photos), decisions);
}

/** The same, from entries and photos already read. */
function contentOf(
  run: RunRow,
  unit: RunContent['unit'],
  entries: EntryRow[],
  photos: PhotoHash[],
  decisions: Decisions,
): RunContent {
  return {
    runId: run.id,
    revision: { id: run.revisionId, number: run.revisionNumber, hash: run.revisionHash },
    unit,
    params: run.params,
    steps: run.steps,
    ...(run.witnessId && { witnessId: run.witnessId }),
    ...(run.paperSheetDate && { paperSheet: { date: run.paperSheetDate, reference: run.paperSheetRef } }),
    entries: entries.map((e) => ({
      stepId: e.stepId,
      raw: e.raw,
      measured: e.measured,
      unit: e.unit,
      expected: e.expected,
      low: e.low,
      high: e.high,
      within: e.within,
      done: e.done,
      note: e.note,
      version: e.version,
      // Only where a reading names one, so run sheets signed before instruments hash as they did.
      ...(e.instrumentId && { instrument: { id: e.instrumentId, calibrationDue: e.instrumentDue ?? '' } }),
      ...(e.takenOn && { takenOn: e.takenOn }),
    })),
    photos: photos.map((p) => ({ id: p.id, stepId: p.stepId, sha256: p.sha256 })),
    ...decisionContent(decisions),
  };
}

export const unitRecordOf = (u: typeof units.$inferSelect) => ({
  id: u.id,
  model: u.model,
  serial: u.serial,
  owner: u.owner,
  jobNumber: u.jobNumber,
});

/** The revision a run followed, with its approval record (reviewer sign-offs when recorded). */
export async function revisionRecord(db: Db | Tx, run: RunRow): Promise<RevisionRecord> {
  // Only the record's columns: the revision's document, snapshot and HTML stay in the database.
  const [[rev], signOffs] = await Promise.all([
    db
      .select({
        id: revisions.id,
        number: revisions.number,
        state: revisions.state,
        title: revisions.title,
        decidedAt: revisions.decidedAt,
        changeReason: revisions.changeReason,
        author: { id: people.id, displayName: people.displayName },
      })
      .from(revisions)
      .innerJoin(people, eq(people.id, revisions.authorId))
      .where(eq(revisions.id, run.revisionId)),
    db
      .select({ name: signatures.signerName, meaning: signatures.meaning, signedAt: signatures.signedAt })
      .from(signatures)
      .where(eq(signatures.revisionId, run.revisionId))
      .orderBy(asc(signatures.signedAt)),
  ]);
  return {
    id: rev!.id,
    number: rev!.number,
    state: rev!.state,
    title: rev!.title,
    approvedAt: iso(rev!.decidedAt),
    author: rev!.author,
    contentHash: run.revisionHash,
    changeReason: rev!.changeReason,
    signOffs: signOffs.map((s) => ({ name: s.name, meaning: s.meaning, signedAt: s.signedAt.toISOString() })),
  };
}

/** A run as the client shows it; pass the run row when it was just read (under its lock) to save reading it again. */
export async function loadRunView(
  db: Db | Tx,
  files: FileStore,
  runId: string,
  known?: RunRow,
): Promise<RunView> {
  let [run] = known ? [known] : await db.select().from(runs).where(eq(runs.id, runId));
  if (!run) throw notFound('No such bench run.');
  // Independent reads, side by side (inside a transaction they queue on its one connection).
  const [[unit], entries, history, photos, [signature], revision, handovers, hold, superseded, decisions] =
    await Promise.all([
      db.select().from(units).where(eq(units.id, run.unitId)),
      db.select().from(runEntries).where(eq(runEntries.runId, runId)),
      db
        .select()
        .from(runEntryHistory)
        .where(eq(runEntryHistory.runId, runId))
        .orderBy(asc(runEntryHistory.id)),
      db
        .select({
          id: runPhotos.id,
          stepId: runPhotos.stepId,
          attachmentId: runPhotos.attachmentId,
          addedBy: runPhotos.addedBy,
          addedAt: runPhotos.addedAt,
          sha256: attachments.sha256,
        })
        .from(runPhotos)
        .innerJoin(attachments, eq(attachments.id, runPhotos.attachmentId))
        .where(eq(runPhotos.runId, runId))
        .orderBy(asc(runPhotos.addedAt)),
      db.select().from(runSignatures).where(eq(runSignatures.runId, runId)),
      revisionRecord(db, run),
      db
        .select()
        .from(runHandovers)
        .where(eq(runHandovers.runId, runId))
        .orderBy(asc(runHandovers.at), asc(runHandovers.id)),
      holdOf(db, run),
      supersessionOf(db, run),
      decisionRows(db, runId),
    ]);
  const instrumentIds = [
    ...new Set([run.defaultInstrumentId, ...entries.map((e) => e.instrumentId)].filter((i) => i !== null)),
  ];
  const [instrumentRows, witnessSignatures] = await Promise.all([
    instrumentIds.length
      ? db.select().from(instruments).where(inArray(instruments.id, instrumentIds))
      : Promise.resolve([]),
    run.witnessId
      ? db
          .select()
          .from(runWitnessSignatures)
          .where(eq(runWitnessSignatures.runId, runId))
          .orderBy(desc(runWitnessSignatures.signedAt))
      : Promise.resolve([]),
  ]);
  const instrumentOf = (id: string | null, due?: string | null) => {
    const i = instrumentRows.find((r) => r.id === id);
    return i
      ? { id: i.id, identifier: i.identifier, kind: i.kind, calibrationDue: due ?? i.calibrationDue }
      : null;
  };
  const who = await names(db, [
    ...(run.witnessId ? [run.witnessId] : []),
    run.startedBy,
    run.performedBy,
    ...(run.closedBy ? [run.closedBy] : []),
    ...entries.map((e) => e.enteredBy),
    ...photos.map((p) => p.addedBy),
    ...decisions.holds.map((h) => h.openedBy),
    ...(signature ? [signature.signerId] : []),
  ]);

  const entryViews: EntryView[] = entries.map((e) => ({
    stepId: e.stepId,
    kind: e.kind,
    raw: e.raw,
    measured: e.measured,
    unit: e.unit,
    expected: e.expected,
    low: e.low,
    high: e.high,
    within: e.within,
    deviation: e.deviation,
    deviationPercent: e.deviationPercent,
    done: e.done,
    note: e.note,
    version: e.version,
    lastKey: e.lastKey,
    instrument: instrumentOf(e.instrumentId, e.instrumentDue),
    takenOn: e.takenOn,
    enteredBy: who(e.enteredBy),
    enteredAt: e.enteredAt.toISOString(),
    history:
      e.version > 1
        ? history
            .filter((h) => h.entryId === e.id)
            .map((h) => ({
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
            }))
        : [],
  }));
  const state = new Map(entries.map((e) => [e.stepId, e]));
  const unitNow = unitRecordOf(unit!);
  let verified = false;
  // Signed since the given row was read: read the run again, as signed.
  if (signature && run.status !== 'signed')
    [run] = (await db.select().from(runs).where(eq(runs.id, runId))) as [RunRow];
  if (signature) {
    // A signed run's entries and photos cannot change (triggers), so the ones read above are what was
    // signed; the photos' bytes are hashed again, so a file altered or gone shows here.
    const photoHashes = await rehashed(files, photos);
    verified =
      photoHashes.every((p) => p.sha256 !== null) &&
      runContentHash(contentOf(run, run.unitRecord ?? unitNow, entries, photoHashes, decisions)) ===
        signature.contentHash &&
      signature.contentHash === run.contentHash;
  }
  // What a witness signature must cover: the signed content, or (open run) the content as it stands.
  const currentHash =
    run.witnessId && witnessSignatures[0]
      ? (run.contentHash ??
        runContentHash(contentOf(run, unitNow, entries, await rehashed(files, photos), decisions)))
      : null;
  const quality = await releaseAndFollowUps(db, run);
  return {
    ...quality,
    id: run.id,
    title: run.title,
    status: run.status,
    outOfTolerance: run.outOfTolerance,
    unit: run.unitRecord ?? unitNow,
    revision,
    params: run.params,
    snapshot: run.snapshot,
    steps: run.steps,
    entries: entryViews,
    photos: photos.map((p) => ({
      id: p.id,
      stepId: p.stepId,
      url: `/api/attachments/${p.attachmentId}`,
      addedBy: who(p.addedBy),
      addedAt: p.addedAt.toISOString(),
    })),
    signature: signature
      ? {
          signer: { id: signature.signerId, displayName: signature.signerName },
          signerRole: signature.signerRole,
          meaning: signature.meaning,
          reason: signature.reason,
          signedAt: signature.signedAt.toISOString(),
          contentHash: signature.contentHash,
          verified,
        }
      : null,
    startedBy: who(run.startedBy),
    performedBy: who(run.performedBy),
    // Names as recorded at the handover.
    handovers: handovers.map((h) => ({
      from: { id: h.fromId, displayName: h.fromName },
      to: { id: h.toId, displayName: h.toName },
      by: { id: h.byId, displayName: h.byName },
      reason: h.reason,
      at: h.at.toISOString(),
    })),
    witness: run.witnessId ? witnessView(run, who(run.witnessId), witnessSignatures[0], currentHash) : null,
    defaultInstrument: instrumentOf(run.defaultInstrumentId),
    paperSheet: run.paperSheetDate ? { date: run.paperSheetDate, reference: run.paperSheetRef } : null,
    hold,
    ...decisionViews(run, decisions, who),
    // A withdrawn revision holds the run; the hold says so, not this.
    superseded: hold ? null : superseded,
    closed:
      run.status === 'abandoned' && run.closedBy
        ? { by: who(run.closedBy), reason: run.closeReason ?? '', at: iso(run.closedAt)! }
        : null,
    startedAt: run.startedAt.toISOString(),
    signedAt: iso(run.signedAt),
    progress: progressOf(run.steps, state, excusedSteps(decisions.exceptions)),
    locked: lockedSteps(run.steps, state).locked,
  };
}

function witnessView(
  run: RunRow,
  person: { id: string; displayName: string },
  sig: typeof runWitnessSignatures.$inferSelect | undefined,
  currentHash: string | null,
): RunView['witness'] {
  return {
    person: { id: person.id, displayName: sig?.signerName ?? person.displayName },
    signature: sig
      ? {
          signedAt: sig.signedAt.toISOString(),
          contentHash: sig.contentHash,
          current: sig.contentHash === currentHash,
        }
      : null,
  };
}

export async function listRuns(
  db: Db,
  filter: { status?: RunStatus; unitId?: string; performedBy?: string },
): Promise<RunListItem[]> {
  const where: SQL[] = [];
  if (filter.status) where.push(eq(runs.status, filter.status));
  if (filter.unitId) where.push(eq(runs.unitId, filter.unitId));
  if (filter.performedBy) where.push(eq(runs.performedBy, filter.performedBy));
  const rows = await db
    .select({
      run: runs,
      unit: { id: units.id, model: units.model, serial: units.serial },
      revisionState: revisions.state,
      atHoldPoint: sql<boolean>`exists (select 1 from run_holds h where h.run_id = ${runs.id} and h.decision is null)`,
    })
    .from(runs)
    .innerJoin(units, eq(units.id, runs.unitId))
    .innerJoin(revisions, eq(revisions.id, runs.revisionId))
    .where(where.length ? and(...where) : undefined)
    .orderBy(desc(runs.startedAt))
    .limit(200);
  const ids = rows.map((r) => r.run.id);
  const entries = ids.length
    ? await db
        .select({
          runId: runEntries.runId,
          stepId: runEntries.stepId,
          measured: runEntries.measured,
          done: runEntries.done,
          within: runEntries.within,
        })
        .from(runEntries)
        .where(inArray(runEntries.runId, ids))
    : [];
  const who = await names(
    db,
    rows.flatMap((r) => [r.run.startedBy, r.run.performedBy]),
  );
  return rows.map(({ run, unit, revisionState, atHoldPoint }) => {
    const state = new Map(entries.filter((e) => e.runId === run.id).map((e) => [e.stepId, e]));
    const p = progressOf(run.steps, state);
    return {
      id: run.id,
      title: run.title,
      status: run.status,
      onHold: run.status === 'in_progress' && revisionState === 'withdrawn',
      atHoldPoint: run.status === 'in_progress' && atHoldPoint,
      outOfTolerance: run.outOfTolerance,
      revisionNumber: run.revisionNumber,
      unit,
      startedBy: who(run.startedBy),
      performedBy: who(run.performedBy),
      startedAt: run.startedAt.toISOString(),
      signedAt: iso(run.signedAt),
      progress: { done: p.done, total: p.total },
    };
  });
}
