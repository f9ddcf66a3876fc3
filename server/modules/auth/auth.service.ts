import { createHash } from 'node:crypto';
import { and, eq, gt, isNull } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { invitations, people } from '../../db/schema';
import { HttpError } from '../../http/errors';

/** Set-password links are stored as the SHA-256 of their token, never the token itself. */
export const tokenHash = (token: string) => createHash('sha256').update(token).digest('hex');

const linkGone = 'This link has expired or has already been used. Ask an admin for a new one.';

export async function personById(db: Db, id: string) {
  const [person] = await db.select().from(people).where(eq(people.id, id));
  return person;
}

const linkStillGood = (token: string) =>
  and(
    eq(invitations.tokenHash, tokenHash(token)),
    isNull(invitations.usedAt),
    gt(invitations.expiresAt, new Date()),
  );

/** Who a set-password link is for (404 once it is used or expired). */
export async function setPasswordLink(db: Db, token: string) {
  const [row] = await db
    .select({ email: people.email, displayName: people.displayName, purpose: invitations.purpose })
    .from(invitations)
    .innerJoin(people, eq(people.id, invitations.personId))
    .where(linkStillGood(token));
  if (!row) throw new HttpError(404, linkGone);
  return row;
}

/** Spends the link (and any other still out for the person) and stores the new password hash. */
export async function setPasswordFromLink(db: Db, token: string, passwordHash: string) {
  return db.transaction(async (tx) => {
    const [used] = await tx
      .update(invitations)
      .set({ usedAt: new Date() })
      .where(linkStillGood(token))
      .returning();
    if (!used) throw new HttpError(404, linkGone);
    await tx.update(people).set({ passwordHash }).where(eq(people.id, used.personId));
    await tx
      .update(invitations)
      .set({ usedAt: new Date() })
      .where(and(eq(invitations.personId, used.personId), isNull(invitations.usedAt)));
    return used;
  });
}
