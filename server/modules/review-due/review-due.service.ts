/**
 * Periodic review: an approved revision falls due for review `reviewIntervalMonths` after its
 * approval. Reviewers list what is due or overdue; when one falls due, the reviewers get one mail
 * (a review_due_notices row per revision makes the check idempotent, across processes too).
 */
import { and, arrayContains, asc, eq, isNull, sql } from 'drizzle-orm';
import { paths } from '../../../shared/paths';
import { REVIEW_DUE_SOON_DAYS, type ReviewDueItem } from '../../../shared/schemas/review-due';
import type { Db } from '../../db/client';
import { people, reviewDueNotices, revisions } from '../../db/schema';
import { composeMail, enqueueMail } from '../../mail/outbox';
import type { MailSender } from '../../mail/sender';

/** The review-due date of an approved revision, in SQL: its approval plus the shop's interval. */
const dueAt = (months: number) =>
  sql<Date>`(${revisions.decidedAt} + make_interval(months => ${months}::int))`.mapWith(
    (v: string | Date) => new Date(v),
  );

/** Approved revisions whose review date has passed or comes within REVIEW_DUE_SOON_DAYS, soonest first. */
export async function dueReviews(db: Db, months: number): Promise<ReviewDueItem[]> {
  const due = dueAt(months);
  const rows = await db
    .select({
      revisionId: revisions.id,
      procedureId: revisions.procedureId,
      title: revisions.title,
      equipmentModel: revisions.equipmentModel,
      number: revisions.number,
      approvedAt: revisions.decidedAt,
      dueAt: due,
    })
    .from(revisions)
    .where(
      and(
        eq(revisions.state, 'approved'),
        sql`${due} <= now() + make_interval(days => ${REVIEW_DUE_SOON_DAYS}::int)`,
      ),
    )
    .orderBy(asc(due));
  const now = Date.now();
  return rows.map((r) => ({
    ...r,
    approvedAt: r.approvedAt!.toISOString(),
    dueAt: r.dueAt.toISOString(),
    status: r.dueAt.getTime() <= now ? 'overdue' : 'due',
  }));
}

/**
 * Mails the reviewers about every approved revision that has fallen due and was not mailed about
 * yet, in one transaction with its notice row; returns how many fell due in this check.
 */
export async function notifyDueReviews(
  db: Db,
  opts: { months: number; publicUrl: string; mailer?: MailSender },
) {
  const due = dueAt(opts.months);
  const count = await db.transaction(async (tx) => {
    const fallen = await tx
      .select({
        id: revisions.id,
        title: revisions.title,
        model: revisions.equipmentModel,
        number: revisions.number,
        dueAt: due,
      })
      .from(revisions)
      .leftJoin(reviewDueNotices, eq(reviewDueNotices.revisionId, revisions.id))
      .where(and(eq(revisions.state, 'approved'), sql`${due} <= now()`, isNull(reviewDueNotices.revisionId)));
    if (!fallen.length) return 0;
    // A process checking at the same moment waits here and then inserts nothing: one mail each.
    const claimed = await tx
      .insert(reviewDueNotices)
      .values(fallen.map((f) => ({ revisionId: f.id, dueAt: f.dueAt })))
      .onConflictDoNothing()
      .returning({ revisionId: reviewDueNotices.revisionId });
    const mine = new Set(claimed.map((c) => c.revisionId));
    const reviewers = await tx
      .select({ email: people.email })
      .from(people)
      .where(and(eq(people.active, true), arrayContains(people.roles, ['reviewer'])));
    for (const f of fallen.filter((x) => mine.has(x.id))) {
      const label = `${f.title} (${f.model}), revision ${f.number}`;
      await enqueueMail(tx, {
        to: reviewers.map((r) => r.email),
        subject: `Review due: ${label}`,
        reason: 'review-due',
        ...composeMail({
          greeting: 'Hello reviewers,',
          lines: [
            `${label} was due for its periodic review on ${f.dueAt.toISOString().slice(0, 10)}.`,
            'Read it again against current practice; start a new revision if anything has changed.',
          ],
          link: { url: opts.publicUrl + paths.reviewDue.href(), label: 'Reviews due' },
        }),
      });
    }
    return mine.size;
  });
  if (count) await opts.mailer?.flush();
  return count;
}

export const DEFAULT_REVIEW_DUE_CHECK_MS = 3600_000;
/** The shop default when REVIEW_INTERVAL_MONTHS is not set: two years. */
export const DEFAULT_REVIEW_INTERVAL_MONTHS = 24;
