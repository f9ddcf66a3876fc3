import { capitalise, reckonerName } from '../../../shared/document/check/words';
import { and, asc, desc, eq, inArray, lt } from 'drizzle-orm';
import { describeRevision } from '../../../shared/document/block-view';
import { extractBlocks } from '../../../shared/document/extract';
import type { ProcedureDoc } from '../../../shared/document/schema';
import type { BlockRef, QueueItem, ReviewCommentView, ReviewView } from '../../../shared/schemas/review';
import type { Db } from '../../db/client';
import { people, procedures, reviewComments, revisions } from '../../db/schema';
import type { SessionUser } from '../../http/route';
import type { FileStore } from '../../storage/files';
import { diffText } from './diff/text-diff';
import { countsAsAuthor } from './four-eyes';
import { valueChanges } from './diff/value-changes';
import { verifiedSignatures } from './signatures';

type RevisionRow = typeof revisions.$inferSelect;

/** Every block a comment can point at, with a short label. */
export function blockRefs(doc: ProcedureDoc): BlockRef[] {
  const b = extractBlocks(doc);
  return [
    // By the reckoner's label and section, never by the internal name references use.
    ...b.reckoners.map((r) => ({ id: r.id, label: capitalise(reckonerName(r)) })),
    ...b.readings.map((r) => ({ id: r.id, label: `Reading “${r.label || 'untitled'}”` })),
    ...b.checkSteps.map((c) => ({ id: c.id, label: `Check “${c.text.slice(0, 60)}”` })),
    ...b.hazardNotes.map((h) => ({ id: h.id, label: `Hazard note “${h.text.slice(0, 60)}”` })),
    ...b.images.map((i) => ({ id: i.id, label: `Image “${i.caption || i.alt}”` })),
    ...b.files.map((f) => ({ id: f.id, label: `File “${f.fileName}”` })),
  ];
}

/** The last approved revision before this one: the one a reviewer compares against. */
export async function baseRevision(db: Db, row: RevisionRow) {
  const [base] = await db
    .select()
    .from(revisions)
    .where(
      and(
        eq(revisions.procedureId, row.procedureId),
        lt(revisions.number, row.number),
        inArray(revisions.state, ['approved', 'superseded', 'withdrawn']),
      ),
    )
    .orderBy(desc(revisions.number))
    .limit(1);
  return base;
}

export async function commentsOf(db: Db, row: RevisionRow): Promise<ReviewCommentView[]> {
  const labels = new Map(blockRefs(row.document).map((b) => [b.id, b.label]));
  const rows = await db
    .select({ c: reviewComments, author: { id: people.id, displayName: people.displayName } })
    .from(reviewComments)
    .innerJoin(people, eq(people.id, reviewComments.authorId))
    .where(eq(reviewComments.revisionId, row.id))
    .orderBy(asc(reviewComments.createdAt));
  return rows.map(({ c, author }) => ({
    id: c.id,
    revisionId: c.revisionId,
    blockId: c.blockId,
    blockLabel: c.blockId ? (labels.get(c.blockId) ?? 'a block no longer in this revision') : null,
    author,
    body: c.body,
    createdAt: c.createdAt.toISOString(),
  }));
}

/** What changed against the last approved revision, in words and in numbers: the review's diff. */
export async function revisionDiff(db: Db, row: RevisionRow) {
  const base = await baseRevision(db, row);
  const figures = describeRevision(row.document, row.snapshot);
  return {
    base: base ? { id: base.id, number: base.number, state: base.state } : null,
    textDiff: diffText(base?.plainText ?? '', row.plainText),
    valueChanges: valueChanges(base ? describeRevision(base.document, base.snapshot) : null, figures),
    figures,
  };
}

export async function buildReviewView(
  db: Db,
  files: FileStore,
  user: SessionUser,
  row: RevisionRow,
): Promise<ReviewView> {
  const ids = [...new Set([row.authorId, ...row.editorIds])];
  const names = new Map(
    (
      await db
        .select({ id: people.id, displayName: people.displayName })
        .from(people)
        .where(inArray(people.id, ids))
    ).map((p) => [p.id, p]),
  );
  const { figures, ...diff } = await revisionDiff(db, row);
  const own = countsAsAuthor(user.id, row);
  const isReviewer = user.roles.includes('reviewer');
  const cannotDecideReason = !isReviewer
    ? 'Only reviewers approve or return revisions.'
    : own
      ? 'You wrote or edited this revision; another reviewer must decide on it.'
      : row.state !== 'in_review'
        ? `This revision is ${row.state.replace('_', ' ')}; only a revision in review can be decided.`
        : null;
  return {
    revision: {
      id: row.id,
      procedureId: row.procedureId,
      number: row.number,
      state: row.state,
      lockVersion: row.lockVersion,
      title: row.title,
      equipmentFamily: row.equipmentFamily,
      equipmentModel: row.equipmentModel,
      author: names.get(row.authorId) ?? { id: row.authorId, displayName: 'unknown' },
      editors: row.editorIds
        .filter((id) => id !== row.authorId)
        .map((id) => names.get(id) ?? { id, displayName: 'unknown' }),
      submittedAt: row.submittedAt?.toISOString() ?? null,
      decidedAt: row.decidedAt?.toISOString() ?? null,
      html: row.html,
      changeReason: row.changeReason,
    },
    ...diff,
    reckoners: figures.blocks,
    blocks: blockRefs(row.document),
    comments: await commentsOf(db, row),
    signatures: await verifiedSignatures(db, files, row.id),
    canDecide: cannotDecideReason === null,
    cannotDecideReason,
  };
}

/** Revisions waiting for a decision, oldest submission first. */
export async function reviewQueue(db: Db, user: SessionUser): Promise<QueueItem[]> {
  const rows = await db
    .select({ r: revisions, author: { id: people.id, displayName: people.displayName } })
    .from(revisions)
    .innerJoin(people, eq(people.id, revisions.authorId))
    .innerJoin(procedures, eq(procedures.id, revisions.procedureId))
    .where(eq(revisions.state, 'in_review'))
    .orderBy(asc(revisions.submittedAt));
  const now = Date.now();
  return rows.map(({ r, author }) => {
    const submitted = r.submittedAt ?? r.updatedAt;
    return {
      revisionId: r.id,
      procedureId: r.procedureId,
      title: r.title,
      equipmentModel: r.equipmentModel,
      number: r.number,
      author,
      submittedAt: submitted.toISOString(),
      ageSeconds: Math.max(0, Math.round((now - submitted.getTime()) / 1000)),
      ownWork: countsAsAuthor(user.id, r),
    };
  });
}
