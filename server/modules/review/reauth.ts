import { and, count, eq, gt } from 'drizzle-orm';
import type { Request } from 'express';
import { recordAudit } from '../../audit/record';
import { verifyPassword } from '../../auth/passwords';
import { auditLog, people } from '../../db/schema';
import type { Db } from '../../db/client';
import { HttpError } from '../../http/errors';
import type { SessionUser } from '../../http/route';

/** Wrong passwords at sign-off allowed per person per window before further tries are refused. */
export const SIGN_OFF_FAILURE_LIMIT = 5;
const WINDOW_MS = 15 * 60_000;

/**
 * Every signature needs the signer's password again, not just a live session. A wrong password is
 * audited (credential misuse must be detectable) and, past a few, refused outright with 429.
 */
export async function confirmSignerPassword(db: Db, user: SessionUser, password: string, req: Request, subject: string) {
  const [recent] = await db
    .select({ n: count() })
    .from(auditLog)
    .where(and(eq(auditLog.actorId, user.id), eq(auditLog.action, 'sign-off.failed'), gt(auditLog.at, new Date(Date.now() - WINDOW_MS))));
  if ((recent?.n ?? 0) >= SIGN_OFF_FAILURE_LIMIT) {
    throw new HttpError(429, 'Too many wrong passwords at sign-off. Wait 15 minutes, or ask an admin to check your account.');
  }
  const [person] = await db.select({ hash: people.passwordHash, active: people.active }).from(people).where(eq(people.id, user.id));
  const ok = !!person?.active && !!person.hash && (await verifyPassword(person.hash, password));
  if (!ok) {
    await recordAudit(db, { action: 'sign-off.failed', actorId: user.id, subject, req });
    throw new HttpError(401, 'That password is not right. Your sign-off was not recorded.', { fields: [{ field: 'body.password', reason: 'does not match your password' }] });
  }
}
