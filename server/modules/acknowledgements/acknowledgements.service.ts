/**
 * Read before you run: when a revision is approved, everyone who ran an earlier revision of the
 * procedure acknowledges what changed (the review's diff) before their first run on it. The row is
 * append-only and checked by the database (drizzle/0021); starting a run without it is refused.
 */
import { and, asc, eq, lt, or, sql } from 'drizzle-orm';
import { paths } from '../../../shared/paths';
import type { AcknowledgementStatus, AcknowledgementView } from '../../../shared/schemas/acknowledgements';
import { recordAudit } from '../../audit/record';
import type { Db, Tx } from '../../db/client';
import { people, revisionAcknowledgements, revisions, runs } from '../../db/schema';
import { conflict, notFound } from '../../http/errors';
import type { SessionUser } from '../../http/route';
import type { Request } from 'express';
import { revisionDiff } from '../review/review-view';

type RevisionRow = typeof revisions.$inferSelect;

/** People who ran (started or performed) an earlier revision of the procedure and not yet this one. */
function whoMustAcknowledge(db: Db | Tx, rev: RevisionRow, personId?: string) {
  const ranEarlier = db
    .selectDistinct({ id: people.id, displayName: people.displayName })
    .from(runs)
    .innerJoin(people, or(eq(people.id, runs.performedBy), eq(people.id, runs.startedBy)))
    .where(
      and(
        eq(runs.procedureId, rev.procedureId),
        lt(runs.revisionNumber, rev.number),
        eq(people.active, true),
        personId ? eq(people.id, personId) : undefined,
        sql`not exists (select 1 from ${runs} r2 where r2.revision_id = ${rev.id}
              and (r2.performed_by = ${people.id} or r2.started_by = ${people.id}))`,
      ),
    )
    .orderBy(asc(people.displayName));
  return ranEarlier;
}

async function acknowledgementOf(db: Db | Tx, revisionId: string, personId: string) {
  const [row] = await db
    .select()
    .from(revisionAcknowledgements)
    .where(
      and(
        eq(revisionAcknowledgements.revisionId, revisionId),
        eq(revisionAcknowledgements.personId, personId),
      ),
    );
  return row;
}

/** Whether `personId` must acknowledge the approved revision before running it (and has not). */
export async function acknowledgementMissing(db: Db | Tx, rev: RevisionRow, personId: string) {
  if (rev.state !== 'approved') return false;
  if (await acknowledgementOf(db, rev.id, personId)) return false;
  return (await whoMustAcknowledge(db, rev, personId)).length > 0;
}

/** The refusal a run start gets without the acknowledgement: the reason and where to acknowledge. */
export const acknowledgementRequired = (rev: RevisionRow) =>
  conflict(
    `Revision ${rev.number} of “${rev.title}” changed the procedure you ran before: read what changed and acknowledge it before your first run on it.`,
    { code: 'acknowledgement-required', acknowledgeUrl: paths.acknowledgeRevision.href(rev.id) },
  );

async function approvedRevision(db: Db | Tx, revisionId: string) {
  const [rev] = await db.select().from(revisions).where(eq(revisions.id, revisionId));
  if (!rev || !['approved', 'superseded', 'withdrawn'].includes(rev.state))
    throw notFound('No such revision.');
  return rev;
}

const recordView = (a: typeof revisionAcknowledgements.$inferSelect) => ({
  person: { id: a.personId, displayName: a.personName },
  acknowledgedAt: a.acknowledgedAt.toISOString(),
  contentHash: a.contentHash,
});

/** The acknowledgement screen for the caller: what changed, and whether they still have to acknowledge. */
export async function acknowledgementView(
  db: Db,
  user: SessionUser,
  revisionId: string,
): Promise<AcknowledgementView> {
  const rev = await approvedRevision(db, revisionId);
  const [mine, diff] = await Promise.all([acknowledgementOf(db, rev.id, user.id), revisionDiff(db, rev)]);
  return {
    revision: {
      id: rev.id,
      procedureId: rev.procedureId,
      number: rev.number,
      title: rev.title,
      equipmentModel: rev.equipmentModel,
      changeReason: rev.changeReason,
      contentHash: rev.contentHash ?? '',
    },
    required: !mine && (await acknowledgementMissing(db, rev, user.id)),
    acknowledgement: mine ? recordView(mine) : null,
    base: diff.base && { id: diff.base.id, number: diff.base.number },
    textDiff: diff.textDiff,
    valueChanges: diff.valueChanges,
  };
}

/**
 * Records the caller's acknowledgement of the approved revision over the content hash they were
 * shown (409 if the revision is not the approved one, or the hash is not its own); audited. Acknowledging
 * twice returns the first record.
 */
export async function acknowledgeRevision(
  db: Db,
  user: SessionUser,
  revisionId: string,
  contentHash: string,
  req: Request,
) {
  return db.transaction(async (tx) => {
    const [rev] = await tx.select().from(revisions).where(eq(revisions.id, revisionId)).for('share');
    if (!rev) throw notFound('No such revision.');
    const existing = await acknowledgementOf(tx, rev.id, user.id);
    if (existing) return { acknowledgement: recordView(existing), created: false };
    if (rev.state !== 'approved')
      throw conflict(
        `Revision ${rev.number} is ${rev.state.replace('_', ' ')}; only the approved revision is acknowledged.`,
        { state: rev.state },
      );
    if (rev.contentHash !== contentHash)
      throw conflict(
        `Revision ${rev.number}’s content hash is not the one you were shown; reload the page and read it again.`,
        { code: 'hash-mismatch', contentHash: rev.contentHash },
      );
    const [row] = await tx
      .insert(revisionAcknowledgements)
      .values({
        revisionId: rev.id,
        procedureId: rev.procedureId,
        revisionNumber: rev.number,
        personId: user.id,
        personName: user.displayName,
        contentHash,
      })
      .returning();
    await recordAudit(tx, {
      action: 'revision.acknowledged',
      actorId: user.id,
      subject: `${rev.title} r${rev.number}`,
      details: { revisionId: rev.id, contentHash, acknowledgementId: row!.id },
      req,
    });
    return { acknowledgement: recordView(row!), created: true };
  });
}

/** For reviewers: everyone who must acknowledge the revision (or did), with when and over which hash. */
export async function acknowledgementStatus(db: Db, revisionId: string): Promise<AcknowledgementStatus> {
  const rev = await approvedRevision(db, revisionId);
  const [owing, done] = await Promise.all([
    whoMustAcknowledge(db, rev),
    db
      .select()
      .from(revisionAcknowledgements)
      .where(eq(revisionAcknowledgements.revisionId, rev.id))
      .orderBy(asc(revisionAcknowledgements.acknowledgedAt)),
  ]);
  const acknowledged = new Map(done.map((a) => [a.personId, a]));
  const everyone = new Map(owing.map((p) => [p.id, p.displayName]));
  for (const a of done) everyone.set(a.personId, a.personName);
  return {
    revisionId: rev.id,
    number: rev.number,
    people: [...everyone].map(([id, displayName]) => {
      const a = acknowledged.get(id);
      return {
        id,
        displayName,
        acknowledgedAt: a?.acknowledgedAt.toISOString() ?? null,
        contentHash: a?.contentHash ?? null,
      };
    }),
  };
}
