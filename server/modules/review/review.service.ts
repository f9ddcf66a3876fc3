import { eq } from 'drizzle-orm';
import type { Request } from 'express';
import { recordAudit } from '../../audit/record';
import type { Db } from '../../db/client';
import { reviewComments, signatures, type revisions } from '../../db/schema';
import type { SessionUser } from '../../http/route';
import { commentsOf } from './review-view';

/** Records a comment on the revision (or one block of it) with its audit entry; answers it as listed. */
export async function addComment(
  db: Db,
  user: SessionUser,
  row: typeof revisions.$inferSelect,
  blockId: string | null,
  body: string,
  req: Request,
) {
  const [created] = await db.transaction(async (tx) => {
    const inserted = await tx
      .insert(reviewComments)
      .values({ revisionId: row.id, blockId, authorId: user.id, body })
      .returning();
    await recordAudit(tx, {
      action: 'review.commented',
      actorId: user.id,
      subject: `${row.title} r${row.number}`,
      details: { revisionId: row.id, commentId: inserted[0]!.id, blockId },
      req,
    });
    return inserted;
  });
  return (await commentsOf(db, row)).find((c) => c.id === created!.id);
}

export async function signatureById(db: Db, id: string) {
  const [sig] = await db.select().from(signatures).where(eq(signatures.id, id));
  return sig;
}
