import { eq } from 'drizzle-orm';
import type { Request } from 'express';
import { recordAudit } from '../../audit/record';
import { verifyPassword } from '../../auth/passwords';
import { claimTry, PERSON_RULE } from '../../auth/throttle';
import { people } from '../../db/schema';
import type { Db } from '../../db/client';
import { HttpError } from '../../http/errors';
import type { SessionUser } from '../../http/route';

/** The throttle key a person's re-entered passwords count against, whatever they sign. */
export const reauthKey = (personId: string) => `reauth:${personId}`;

/**
 * Every signature needs the signer's password again, not just a live session. The try is claimed
 * before the password is checked (server/auth/throttle.ts), so parallel requests on any number of
 * app processes check at most the allowed number; past it, each try waits (429, Retry-After). A
 * wrong password is audited: credential misuse must be detectable.
 */
export async function confirmSignerPassword(db: Db, user: SessionUser, password: string, req: Request, subject: string, what = 'sign-off') {
  const tries = await claimTry(db, req.res, [{ key: reauthKey(user.id), rule: PERSON_RULE, onSuccess: 'reset' }], (wait) => `Too many wrong passwords at ${what}. Wait ${wait} and try again.`);
  const [person] = await db.select({ hash: people.passwordHash, active: people.active }).from(people).where(eq(people.id, user.id));
  const ok = !!person?.active && !!person.hash && (await verifyPassword(person.hash, password));
  if (!ok) {
    await recordAudit(db, { action: 'sign-off.failed', actorId: user.id, subject, req });
    throw new HttpError(401, `That password is not right. Your ${what} was not recorded.`, { fields: [{ field: 'body.password', reason: 'does not match your password' }] });
  }
  await tries.succeeded();
}
