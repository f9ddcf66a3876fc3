import { and, eq, inArray, sql } from 'drizzle-orm';
import type { Request } from 'express';
import { formatQuantity } from '../../../shared/units/format';
import type { AppDeps } from '../../deps';
import { paths } from '../../../shared/paths';
import { recordAudit } from '../../audit/record';
import {
  people,
  procedures,
  revisions,
  runEntries,
  runs,
  runSignatures,
  runWitnessSignatures,
  signatures,
  units,
} from '../../db/schema';
import { conflict, HttpError, notFound } from '../../http/errors';
import type { SessionUser } from '../../http/route';
import { composeMail, enqueueMail } from '../../mail/outbox';
import type { FileStore } from '../../storage/files';
import { followUpOnSign, queueFollowUpMail } from '../follow-ups/follow-ups.service';
import { confirmSignerPassword } from '../review/reauth';
import { revisionContentHash } from '../review/signed-content';
import { assertWritable } from './run-custody';
import { holdOf, onHold } from './run-hold';
import { runContentHash } from './run-hash';
import { isFinished } from './run-steps';
import { decisionRows, excusedSteps, refuseWhileAwaiting } from './run-decisions';
import { runContent, unitRecordOf } from './run-view';
import type { Tx } from '../../db/client';
import type { RunRow } from './runs.service';

export const runSheetPath = (runId: string) => paths.run.href(runId);

/**
 * The technician signs the run sheet: password again, meaning "performed", database time, and the
 * SHA-256 of the canonical run content. From then on triggers refuse any change to it.
 */
export async function signRun(
  deps: AppDeps,
  user: SessionUser,
  runId: string,
  body: { password: string; meaning: 'performed'; reason?: string },
  req: Request,
) {
  const { db } = deps;
  const [exists] = await db.select().from(runs).where(eq(runs.id, runId));
  if (!exists) throw notFound('No such bench run.');
  if (exists.status === 'signed') throw conflict('This run sheet is already signed.');
  // Only the performer signs, never on hold: said before the password is asked for (and again under the lock).
  await assertWritable(db, exists, user);
  await refuseWhileAwaiting(db, exists);
  // A trainee's run waits for its witness: said before the password is asked for, too.
  if (exists.witnessId)
    await db.transaction(async (tx) =>
      requireWitness(tx, exists, (await signableContent(tx, deps.files, exists)).contentHash),
    );
  await confirmSignerPassword(db, user, body.password, req, `run ${runId}`);

  const result = await db.transaction(async (tx) => {
    const signed = await writeRunSignature(tx, deps.files, user, runId, {
      meaning: body.meaning,
      reason: body.reason,
      requestId: String(req.id ?? ''),
      req,
    });
    const { run, unitRecord, entries, signerName, signature, outOfTolerance, followUp } = signed;
    if (outOfTolerance) await queueOutOfToleranceMail(tx, deps, run, unitRecord, entries, signerName);
    if (followUp) await queueFollowUpMail(tx, deps, followUp, run, entries);
    return { signature, outOfTolerance };
  });
  await deps.mailer?.flush();
  return result;
}

/**
 * Writes a technician's signature on a run sheet in the caller's transaction, after every check
 * (performer, not on hold, every step finished, revision and photos unchanged): the canonical
 * content hash, the signature row, the run's signed state and the audit entry. `signedAt` dates
 * the signature (demo history); by default it is the database's time.
 */
export async function writeRunSignature(
  tx: Tx,
  files: FileStore,
  user: SessionUser,
  runId: string,
  how: { meaning: 'performed'; reason?: string; requestId: string; signedAt?: Date; req?: Request },
) {
  const [run] = await tx.select().from(runs).where(eq(runs.id, runId)).for('update');
  if (!run || run.status === 'signed') throw conflict('This run sheet is already signed.');
  await assertWritable(tx, run, user);
  const { entries, unitRecord, contentHash } = await signableContent(tx, files, run);
  await requireWitness(tx, run, contentHash);
  const [person] = await tx.select({ name: people.displayName }).from(people).where(eq(people.id, user.id));
  const signerName = person?.name ?? user.displayName;
  const outOfTolerance = entries.some((e) => e.within === false);
  // The signature first: the trigger refuses rows for a run that is already signed.
  const [signature] = await tx
    .insert(runSignatures)
    .values({
      runId,
      signerId: user.id,
      signerName,
      signerRole: 'technician',
      meaning: how.meaning,
      reason: how.reason ?? null,
      contentHash,
      revisionId: run.revisionId,
      revisionHash: run.revisionHash,
      requestId: how.requestId,
      ...(how.signedAt && { signedAt: how.signedAt }),
    })
    .returning();
  await tx
    .update(runs)
    .set({ status: 'signed', signedAt: how.signedAt ?? sql`now()`, contentHash, unitRecord, outOfTolerance })
    .where(and(eq(runs.id, runId), eq(runs.status, 'in_progress')));
  // The unit goes on the bench; out-of-band readings open a follow-up, a passing re-run closes one.
  const followUp = await followUpOnSign(tx, run, entries, user, how.signedAt);
  await recordAudit(tx, {
    action: 'run.signed',
    actorId: user.id,
    subject: `run ${runId}`,
    details: { contentHash, revisionId: run.revisionId, meaning: how.meaning, outOfTolerance },
    req: how.req,
  });
  return { run, unitRecord, entries, signerName, signature: signature!, outOfTolerance, followUp };
}

/** A witnessed run is signed only over content its witness co-signed (the database checks the same at commit). */
async function requireWitness(tx: Tx, run: RunRow, contentHash: string) {
  if (run.witnessId) {
    const [witnessed] = await tx
      .select({ id: runWitnessSignatures.id })
      .from(runWitnessSignatures)
      .where(
        and(
          eq(runWitnessSignatures.runId, run.id),
          eq(runWitnessSignatures.signerId, run.witnessId),
          eq(runWitnessSignatures.contentHash, contentHash),
        ),
      );
    if (!witnessed) {
      const [w] = await tx
        .select({ name: people.displayName })
        .from(people)
        .where(eq(people.id, run.witnessId));
      throw conflict(
        `${w?.name ?? 'The witness'} has not co-signed this run as it stands now; they sign as witness first (again, if an entry changed after they signed).`,
        { code: 'witness-required' },
      );
    }
  }
}

/**
 * The run's content as it would be signed, after the checks every signature needs: every step
 * finished, the revision and the photos unchanged since the run started.
 */
async function signableContent(tx: Tx, files: FileStore, run: RunRow) {
  const runId = run.id;
  const entries = await tx.select().from(runEntries).where(eq(runEntries.runId, runId));
  const byStep = new Map(entries.map((e) => [e.stepId, e]));
  // Nothing is signed while a hold or a deviation waits; a step not applicable or an approved deviation is finished.
  await refuseWhileAwaiting(tx, run);
  const excused = excusedSteps((await decisionRows(tx, runId)).exceptions);
  const unfinished = run.steps.filter((s) => !isFinished(s, byStep.get(s.id)) && !excused.has(s.id));
  if (unfinished.length) {
    const list = unfinished
      .slice(0, 5)
      .map((s) => `${s.position}. ${s.text.slice(0, 60)}`)
      .join('; ');
    throw conflict(
      `${unfinished.length} step${unfinished.length === 1 ? ' is' : 's are'} not finished: ${list}${unfinished.length > 5 ? '; …' : ''}`,
      {
        unfinished: unfinished.map((s) => ({ id: s.id, position: s.position, kind: s.kind, text: s.text })),
      },
    );
  }
  const [revision] = await tx.select().from(revisions).where(eq(revisions.id, run.revisionId));
  if ((await revisionContentHash(tx, files, revision!)) !== run.revisionHash) {
    throw conflict(
      'The revision this run followed no longer matches what it was when the run started; the run sheet cannot be signed. Tell an admin.',
    );
  }
  const [unit] = await tx.select().from(units).where(eq(units.id, run.unitId));
  const unitRecord = unitRecordOf(unit!);
  const content = await runContent(tx, files, run, unitRecord);
  if (content.photos.some((p) => p.sha256 === null)) {
    throw conflict(
      'A photo of this run is missing or altered in storage (its bytes no longer match the SHA-256 recorded at upload); the run sheet cannot be signed. Tell an admin.',
    );
  }
  return { entries, unitRecord, contentHash: runContentHash(content) };
}

/**
 * The named witness co-signs a trainee's finished run ("witnessed"): password again, over the same
 * content hash the trainee's signature will cover. The trainee can sign only after it.
 */
export async function witnessRun(
  deps: AppDeps,
  user: SessionUser,
  runId: string,
  password: string,
  req: Request,
) {
  const { db } = deps;
  const [run] = await db.select().from(runs).where(eq(runs.id, runId));
  if (!run) throw notFound('No such bench run.');
  const check = async (tx: Tx | AppDeps['db'], row: RunRow) => {
    if (!row.witnessId) throw conflict('This run names no witness; it needs no co-signature.');
    if (row.witnessId !== user.id) {
      const [w] = await tx
        .select({ name: people.displayName })
        .from(people)
        .where(eq(people.id, row.witnessId));
      throw new HttpError(403, `${w?.name ?? 'Someone else'} is this run’s witness; only they co-sign it.`, {
        code: 'not-the-witness',
      });
    }
    if (row.status !== 'in_progress')
      throw conflict('This bench run is not open; it cannot be witnessed now.');
    const hold = await holdOf(tx, row, true);
    if (hold) throw onHold(hold);
  };
  await check(db, run);
  await confirmSignerPassword(db, user, password, req, `run ${runId}`);
  await db.transaction((tx) =>
    writeWitnessSignature(tx, deps.files, user, runId, { requestId: String(req.id ?? ''), req }, check),
  );
}

/**
 * Writes the witness's co-signature in the caller's transaction over the run's content as it would
 * be signed (demo content calls it directly, dated, without the password a seeder cannot give).
 */
export async function writeWitnessSignature(
  tx: Tx,
  files: FileStore,
  user: SessionUser,
  runId: string,
  how: { requestId: string; signedAt?: Date; req?: Request },
  check?: (tx: Tx, run: RunRow) => Promise<void>,
) {
  const [locked] = await tx.select().from(runs).where(eq(runs.id, runId)).for('update');
  if (!locked) throw notFound('No such bench run.');
  await check?.(tx, locked);
  const { contentHash } = await signableContent(tx, files, locked);
  const [person] = await tx.select({ name: people.displayName }).from(people).where(eq(people.id, user.id));
  await tx.insert(runWitnessSignatures).values({
    runId,
    signerId: user.id,
    signerName: person?.name ?? user.displayName,
    contentHash,
    revisionId: locked.revisionId,
    revisionHash: locked.revisionHash,
    requestId: how.requestId,
    ...(how.signedAt && { signedAt: how.signedAt }),
  });
  await recordAudit(tx, {
    action: 'run.witnessed',
    actorId: user.id,
    subject: `run ${runId}`,
    details: { contentHash, performedBy: locked.performedBy },
    req: how.req,
  });
}

/** Who hears about an out-of-tolerance run: the procedure's author and the revision's approvers. */
async function recipients(tx: Tx, run: RunRow) {
  const [revision] = await tx
    .select({ authorId: revisions.authorId })
    .from(revisions)
    .where(eq(revisions.id, run.revisionId));
  const [procedure] = await tx
    .select({ ownerId: procedures.ownerId })
    .from(procedures)
    .where(eq(procedures.id, run.procedureId));
  const approvers = await tx
    .select({ id: signatures.signerId })
    .from(signatures)
    .where(and(eq(signatures.revisionId, run.revisionId), eq(signatures.meaning, 'approved')));
  const ids = [revision!.authorId, procedure!.ownerId, ...approvers.map((a) => a.id)];
  const byId = await tx
    .select({ email: people.email })
    .from(people)
    .where(and(inArray(people.id, ids), eq(people.active, true)));
  // No recorded approval (demo content): the shop's reviewers hear instead.
  const reviewers = approvers.length
    ? []
    : await tx
        .select({ email: people.email })
        .from(people)
        .where(and(eq(people.active, true), sql`'reviewer' = any(${people.roles})`));
  return [...byId, ...reviewers].map((p) => p.email);
}

async function queueOutOfToleranceMail(
  tx: Tx,
  deps: AppDeps,
  run: RunRow,
  unit: { model: string; serial: string; jobNumber: string },
  entries: (typeof runEntries.$inferSelect)[],
  signer: string,
) {
  const out = entries.filter((e) => e.within === false);
  const lines = out.map((e) => {
    const step = run.steps.find((s) => s.id === e.stepId);
    const band =
      e.low !== null && e.high !== null
        ? `${formatQuantity(e.low, e.unit ?? '')} … ${formatQuantity(e.high, e.unit ?? '')}`
        : 'no band';
    return `• ${step?.text ?? e.stepId}: measured ${e.raw} (${formatQuantity(e.measured ?? 0, e.unit ?? '')}), expected ${band}.`;
  });
  const { text, html } = composeMail({
    greeting: 'Hello,',
    lines: [
      `${signer} signed a bench run of “${run.title}” (revision ${run.revisionNumber}) on ${unit.model} serial ${unit.serial}${unit.jobNumber ? `, job ${unit.jobNumber}` : ''} with ${out.length} reading${out.length === 1 ? '' : 's'} out of tolerance:`,
      ...lines,
      'Check whether the unit or the procedure needs attention.',
    ],
    link: {
      url: new URL(runSheetPath(run.id), deps.config.publicUrl).toString(),
      label: 'Open the run sheet',
    },
  });
  await enqueueMail(tx, {
    to: await recipients(tx, run),
    subject: `Out of tolerance: ${run.title} on ${unit.model} ${unit.serial}`.slice(0, 200),
    text,
    html,
    reason: 'run-out-of-tolerance',
  });
}
