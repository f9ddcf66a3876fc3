/**
 * The review state machine: draft → in review → approved | returned; approved → superseded (by the
 * next approval) | withdrawn. Each transition is one transaction that locks the procedure, then the
 * revision, re-checks the state and updates with a conditional WHERE, so two people acting at once
 * can never both succeed. The database trigger enforces the same machine underneath.
 */
import type { Tx } from '../../db/client';
import type { FileStore } from '../../storage/files';
import { capitalise, inputProblem, reckonerName } from '../../../shared/document/check/words';
import { and, eq, ne, sql } from 'drizzle-orm';
import type { Request } from 'express';
import type { Snapshot } from '../../../shared/document/evaluate';
import { recordAudit } from '../../audit/record';
import { procedures, revisions, type RevisionState } from '../../db/schema';
import type { AppDeps } from '../../deps';
import { conflict, HttpError, notFound } from '../../http/errors';
import type { SessionUser } from '../../http/route';
import { countsAsAuthor, wroteOrEdited } from './four-eyes';
import { confirmSignerPassword } from './reauth';
import { tellTechniciansOnHold } from '../runs/run-hold';
import { queueDecision, queueReviewRequested } from './review-mail';
import { createProcedure, type NewProcedure } from '../procedures/procedures.service';
import { signRevision, type Signer } from './signatures';
import { revisionContentHash } from './signed-content';

type RevisionRow = typeof revisions.$inferSelect;

const STATE_WORDS: Record<RevisionState, string> = {
  draft: 'a draft',
  in_review: 'in review',
  approved: 'approved',
  returned: 'returned',
  superseded: 'superseded',
  withdrawn: 'withdrawn',
};

export const illegal = (row: Pick<RevisionRow, 'number' | 'state'>, wanted: string) =>
  conflict(`Revision ${row.number} is ${STATE_WORDS[row.state]}; ${wanted}.`, { state: row.state });

/** What stops a revision going to review: reckoner errors, unresolved readings, procedure errors. */
export function submitBlockers(snapshot: Snapshot) {
  const problems: { blockId: string | null; message: string }[] = [];
  for (const b of snapshot.blocks) {
    if (!b.ok)
      for (const e of b.errors)
        problems.push({
          blockId: b.id,
          message: `${capitalise(reckonerName(b))}: ${inputProblem(b.kind, e.field, e.reason)}`,
        });
  }
  for (const r of snapshot.readings) {
    if (r.error)
      problems.push({
        blockId: r.id,
        message: `Reading “${r.label || 'untitled'}” is unresolved: ${r.error}`,
      });
  }
  for (const e of snapshot.errors) problems.push({ blockId: null, message: e.message });
  return problems;
}

const fourEyesRefusal = (userId: string, row: RevisionRow) =>
  wroteOrEdited(userId, row)
    ? `You wrote or edited revision ${row.number}; another reviewer must decide on it.`
    : `Revision ${row.number} was started from a revision you wrote or edited; another reviewer must decide on it.`;

/** Locks the procedure then the revision, in that order everywhere (no deadlocks between transitions). */
async function lockRevision(tx: Tx, revisionId: string) {
  const [peek] = await tx
    .select({ procedureId: revisions.procedureId })
    .from(revisions)
    .where(eq(revisions.id, revisionId));
  if (!peek) throw notFound('No such revision.');
  await tx.execute(sql`select 1 from ${procedures} where ${procedures.id} = ${peek.procedureId} for update`);
  const [row] = await tx.select().from(revisions).where(eq(revisions.id, revisionId)).for('update');
  return row!;
}

/**
 * A draft goes to review, inside the caller's transaction: author or editor only, the draft as it
 * was opened (lockVersion), nothing blocking; audited. The one path to in_review.
 */
export async function recordSubmission(
  tx: Tx,
  userId: string,
  revisionId: string,
  changeReason: string,
  opts: { lockVersion?: number; req?: Request } = {},
) {
  const current = await lockRevision(tx, revisionId);
  if (!wroteOrEdited(userId, current))
    throw new HttpError(403, `Only the author or an editor of revision ${current.number} can submit it.`);
  if (current.state !== 'draft') throw illegal(current, 'only a draft can be submitted for review');
  if (opts.lockVersion !== undefined && opts.lockVersion !== current.lockVersion) {
    throw conflict('This draft was saved again after you opened it; reload and check it before submitting.', {
      state: current.state,
      lockVersion: current.lockVersion,
    });
  }
  const problems = submitBlockers(current.snapshot);
  if (problems.length) {
    throw conflict(
      `Revision ${current.number} cannot go to review yet: ${problems
        .slice(0, 3)
        .map((p) => p.message)
        .join('; ')}`,
      { state: current.state, problems },
    );
  }
  if (!current.plainText.trim() && !current.snapshot.blocks.length)
    throw conflict(`Revision ${current.number} is empty; write the procedure before submitting it.`, {
      state: current.state,
      problems: [],
    });
  const [updated] = await tx
    .update(revisions)
    .set({ state: 'in_review', changeReason, submittedAt: sql`now()`, updatedAt: sql`now()` })
    .where(and(eq(revisions.id, revisionId), eq(revisions.state, 'draft')))
    .returning();
  if (!updated) throw illegal(current, 'only a draft can be submitted for review');
  await recordAudit(tx, {
    action: 'revision.submitted',
    actorId: userId,
    subject: `${updated.title} r${updated.number}`,
    details: { revisionId, from: 'draft', to: 'in_review', changeReason: changeReason.slice(0, 500) },
    req: opts.req,
  });
  return updated;
}

export async function submitRevision(
  deps: AppDeps,
  user: SessionUser,
  revisionId: string,
  body: { changeReason: string; lockVersion?: number },
  req: Request,
) {
  const row = await deps.db.transaction(async (tx) => {
    const updated = await recordSubmission(tx, user.id, revisionId, body.changeReason, {
      lockVersion: body.lockVersion,
      req,
    });
    await queueReviewRequested(tx, deps.config.publicUrl, updated, user.displayName);
    return updated;
  });
  void deps.mailer?.flush();
  return row;
}

/**
 * The decision itself, inside the caller's transaction: the reviewer (never the author or an
 * editor) approves or returns a revision in review and signs it; an approval supersedes the
 * approved revision before it and records the content hash the signature covers, which the
 * database compares with the signature at commit (drizzle/0015). `reauthenticated` says the
 * caller checked the signer's password just now; the signature then links that audit entry.
 */
export async function recordDecision(
  tx: Tx,
  files: FileStore,
  signer: Signer,
  revisionId: string,
  decision: 'approved' | 'returned',
  opts: { comment: string; reauthenticated: boolean; req?: Request },
) {
  const current = await lockRevision(tx, revisionId);
  // Checked under the lock: someone may have saved as an editor in between.
  if (countsAsAuthor(signer.id, current)) throw new HttpError(403, fourEyesRefusal(signer.id, current));
  const verb = decision === 'approved' ? 'approved' : 'returned';
  if (current.state !== 'in_review') throw illegal(current, `only a revision in review can be ${verb}`);
  let superseded: RevisionRow | undefined;
  if (decision === 'approved') {
    // The one-approved-per-procedure index needs the old approval moved aside first.
    [superseded] = await tx
      .update(revisions)
      .set({ state: 'superseded', updatedAt: sql`now()` })
      .where(
        and(
          eq(revisions.procedureId, current.procedureId),
          eq(revisions.state, 'approved'),
          ne(revisions.id, current.id),
        ),
      )
      .returning();
  }
  // The signed content leaves out state and times, so the row as locked hashes as it will be stored.
  const contentHash = decision === 'approved' ? await revisionContentHash(tx, files, current) : undefined;
  const [updated] = await tx
    .update(revisions)
    .set({
      state: decision,
      decidedAt: sql`now()`,
      updatedAt: sql`now()`,
      ...(contentHash ? { contentHash } : {}),
    })
    .where(and(eq(revisions.id, revisionId), eq(revisions.state, 'in_review')))
    .returning();
  if (!updated) throw illegal(current, `only a revision in review can be ${verb}`);
  const subject = `${updated.title} r${updated.number}`;
  const reauthAuditId = opts.reauthenticated
    ? await recordAudit(tx, {
        action: 'sign-off.reauthenticated',
        actorId: signer.id,
        subject,
        details: { revisionId, meaning: decision },
        req: opts.req,
      })
    : undefined;
  const signature = await signRevision(tx, files, {
    row: updated,
    signer,
    role: 'reviewer',
    meaning: decision,
    comment: opts.comment,
    reauthAuditId,
    requestId: opts.req?.id === undefined ? undefined : String(opts.req.id),
  });
  await recordAudit(tx, {
    action: decision === 'approved' ? 'revision.approved' : 'revision.returned',
    actorId: signer.id,
    subject,
    details: {
      revisionId,
      from: 'in_review',
      to: decision,
      signatureId: signature.id,
      contentHash: signature.contentHash,
      comment: opts.comment.slice(0, 500),
    },
    req: opts.req,
  });
  if (superseded) {
    await recordAudit(tx, {
      action: 'revision.superseded',
      actorId: signer.id,
      subject: `${superseded.title} r${superseded.number}`,
      details: { revisionId: superseded.id, from: 'approved', to: 'superseded', by: updated.id },
      req: opts.req,
    });
  }
  return { revision: updated, signature, superseded };
}

/** Approve or return a revision in review: reviewer only, never one's own, password re-entered. */
export async function decideRevision(
  deps: AppDeps,
  user: SessionUser,
  revisionId: string,
  decision: 'approved' | 'returned',
  input: { password: string; comment: string },
  req: Request,
) {
  const [before] = await deps.db.select().from(revisions).where(eq(revisions.id, revisionId));
  if (!before) throw notFound('No such revision.');
  if (countsAsAuthor(user.id, before)) throw new HttpError(403, fourEyesRefusal(user.id, before));
  await confirmSignerPassword(deps.db, user, input.password, req, `${before.title} r${before.number}`);

  const result = await deps.db.transaction(async (tx) => {
    const decided = await recordDecision(tx, deps.files, user, revisionId, decision, {
      comment: input.comment,
      reauthenticated: true,
      req,
    });
    await queueDecision(
      tx,
      deps.config.publicUrl,
      decided.revision,
      decision,
      user.displayName,
      input.comment,
    );
    return decided;
  });
  // Kept answers go now, not only when this process hears its own NOTIFY.
  deps.library.changed(before.procedureId);
  void deps.mailer?.flush();
  return result;
}

/**
 * A new procedure whose revision 1 goes the whole way in one transaction, by the same steps as
 * the API: created as the author's draft, submitted by the author, approved and signed by the
 * reviewer. For demo content and tests; no password is asked here, so the signature links no
 * re-authentication, and no mail is queued.
 */
export async function createApprovedProcedure(
  tx: Tx,
  files: FileStore,
  author: Signer,
  reviewer: Signer,
  input: NewProcedure & { changeReason: string },
  comment: string,
) {
  const { procedure, revision } = await createProcedure(tx, author.id, input);
  await recordSubmission(tx, author.id, revision.id, input.changeReason);
  const decided = await recordDecision(tx, files, reviewer, revision.id, 'approved', {
    comment,
    reauthenticated: false,
  });
  return { procedure, ...decided };
}

/**
 * The withdrawal itself, inside the caller's transaction: the approved revision becomes withdrawn,
 * signed by the reviewer or admin with the reason; audited.
 */
export async function recordWithdrawal(
  tx: Tx,
  files: FileStore,
  signer: Signer & { roles: string[] },
  procedureId: string,
  opts: { reason: string; reauthenticated: boolean; req?: Request },
) {
  await tx.execute(sql`select 1 from ${procedures} where ${procedures.id} = ${procedureId} for update`);
  const [approved] = await tx
    .select()
    .from(revisions)
    .where(and(eq(revisions.procedureId, procedureId), eq(revisions.state, 'approved')))
    .for('update');
  if (!approved) {
    const [latest] = await tx
      .select()
      .from(revisions)
      .where(eq(revisions.procedureId, procedureId))
      .orderBy(sql`${revisions.number} desc`)
      .limit(1);
    throw conflict(
      latest
        ? `This procedure has no approved revision to withdraw; its latest, revision ${latest.number}, is ${STATE_WORDS[latest.state]}.`
        : 'This procedure has no revisions.',
      { state: latest?.state ?? null },
    );
  }
  const [updated] = await tx
    .update(revisions)
    .set({ state: 'withdrawn', updatedAt: sql`now()` })
    .where(and(eq(revisions.id, approved.id), eq(revisions.state, 'approved')))
    .returning();
  if (!updated) throw illegal(approved, 'only an approved revision can be withdrawn');
  const subject = `${updated.title} r${updated.number}`;
  const reauthAuditId = opts.reauthenticated
    ? await recordAudit(tx, {
        action: 'sign-off.reauthenticated',
        actorId: signer.id,
        subject,
        details: { revisionId: updated.id, meaning: 'withdrawn' },
        req: opts.req,
      })
    : undefined;
  const role = signer.roles.includes('reviewer') ? 'reviewer' : 'admin';
  const signature = await signRevision(tx, files, {
    row: updated,
    signer,
    role,
    meaning: 'withdrawn',
    comment: opts.reason,
    reauthAuditId,
    requestId: opts.req?.id === undefined ? undefined : String(opts.req.id),
  });
  await recordAudit(tx, {
    action: 'revision.withdrawn',
    actorId: signer.id,
    subject,
    details: {
      revisionId: updated.id,
      from: 'approved',
      to: 'withdrawn',
      signatureId: signature.id,
      reason: opts.reason.slice(0, 500),
    },
    req: opts.req,
  });
  return { revision: updated, signature };
}

/**
 * Takes a procedure's approved revision out of use: reviewer or admin, signed, with a reason. Open
 * bench runs on it go on hold (refused from then on, see runs/run-hold.ts); their technicians are mailed.
 */
export async function withdrawProcedure(
  deps: AppDeps,
  user: SessionUser,
  procedureId: string,
  input: { password: string; reason: string },
  req: Request,
) {
  const [proc] = await deps.db.select().from(procedures).where(eq(procedures.id, procedureId));
  if (!proc) throw notFound('No such procedure.');
  await confirmSignerPassword(deps.db, user, input.password, req, `${proc.title} (withdraw)`);
  const result = await deps.db.transaction(async (tx) => {
    const withdrawn = await recordWithdrawal(tx, deps.files, user, procedureId, {
      reason: input.reason,
      reauthenticated: true,
      req,
    });
    await tellTechniciansOnHold(
      tx,
      deps.config.publicUrl,
      withdrawn.revision,
      input.reason,
      user.displayName,
    );
    return withdrawn;
  });
  deps.library.changed(procedureId);
  await deps.mailer?.flush();
  return result;
}
