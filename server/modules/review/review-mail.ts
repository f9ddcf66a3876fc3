import { and, arrayContains, eq } from 'drizzle-orm';
import type { Tx } from '../../db/client';
import { people, type revisions } from '../../db/schema';
import { composeMail, enqueueMail } from '../../mail/outbox';
import { authorsOf } from './four-eyes';
import { reviewPagePath } from './links';

type RevisionRow = typeof revisions.$inferSelect;

const label = (r: RevisionRow) => `${r.title} (${r.equipmentModel}), revision ${r.number}`;

/** Review requested: every active reviewer who neither wrote nor edited the revision. */
export async function queueReviewRequested(
  tx: Tx,
  publicUrl: string,
  row: RevisionRow,
  submitterName: string,
) {
  const reviewers = await tx
    .select({ id: people.id, email: people.email, displayName: people.displayName })
    .from(people)
    .where(and(eq(people.active, true), arrayContains(people.roles, ['reviewer'])));
  const excluded = new Set(authorsOf(row));
  const to = reviewers.filter((p) => !excluded.has(p.id));
  for (const reviewer of to) {
    await enqueueMail(tx, {
      to: [reviewer.email],
      subject: `Review requested: ${label(row)}`,
      reason: 'review-requested',
      ...composeMail({
        greeting: `Hello ${reviewer.displayName},`,
        lines: [
          `${submitterName} submitted ${label(row)} for review.`,
          'Check what changed against the last approved revision, then approve or return it with your signed decision.',
        ],
        link: { url: publicUrl + reviewPagePath(row.id), label: 'Open the review' },
      }),
    });
  }
  return to.length;
}

/** Approved or returned: the revision's author, with the reviewer's comment. */
export async function queueDecision(
  tx: Tx,
  publicUrl: string,
  row: RevisionRow,
  decision: 'approved' | 'returned',
  reviewerName: string,
  comment: string,
) {
  const [author] = await tx
    .select({ email: people.email, displayName: people.displayName, active: people.active })
    .from(people)
    .where(eq(people.id, row.authorId));
  if (!author?.active) return;
  const verb = decision === 'approved' ? 'approved' : 'returned';
  await enqueueMail(tx, {
    to: [author.email],
    subject: `${decision === 'approved' ? 'Approved' : 'Returned'}: ${label(row)}`,
    reason: decision === 'approved' ? 'revision-approved' : 'revision-returned',
    ...composeMail({
      greeting: `Hello ${author.displayName},`,
      lines: [
        `${reviewerName} ${verb} ${label(row)}.`,
        comment ? `Comment: ${comment}` : 'No comment was given.',
        decision === 'returned'
          ? 'Start a new draft to address the comments.'
          : 'Technicians can now run this revision at the bench.',
      ],
      link: { url: publicUrl + reviewPagePath(row.id), label: 'Open the revision' },
    }),
  });
}
