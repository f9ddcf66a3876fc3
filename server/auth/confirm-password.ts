import { eq } from 'drizzle-orm';
import type { Request } from 'express';
import { recordAudit, type AuditAction } from '../audit/record';
import type { Db } from '../db/client';
import { people } from '../db/schema';
import { HttpError } from '../http/errors';
import type { SessionUser } from '../http/route';
import { verifyPassword } from './passwords';
import { claimTry, PERSON_RULE } from './throttle';

/** The throttle key every re-entered password of a person counts against, whatever it is for. */
export const reauthKey = (personId: string) => `reauth:${personId}`;

/**
 * A signed-in person types their password again (to sign, to change the password, to set up an
 * authenticator). The try is claimed before the password is checked (./throttle.ts), so parallel
 * requests on any number of app processes check at most the allowed number; past it each try
 * waits (429, Retry-After). A wrong password is audited: credential misuse must be detectable.
 */
export async function confirmPassword(
  db: Db,
  user: SessionUser,
  password: string,
  req: Request,
  opts: { subject: string; what: string; failedAction: AuditAction; field?: string; wrong?: string },
) {
  const tries = await claimTry(
    db,
    req.res,
    [{ key: reauthKey(user.id), rule: PERSON_RULE, onSuccess: 'reset' }],
    (wait) => `Too many wrong passwords at ${opts.what}. Wait ${wait} and try again.`,
  );
  const [person] = await db
    .select({ hash: people.passwordHash, active: people.active })
    .from(people)
    .where(eq(people.id, user.id));
  const ok = !!person?.active && !!person.hash && (await verifyPassword(person.hash, password));
  if (!ok) {
    await recordAudit(db, { action: opts.failedAction, actorId: user.id, subject: opts.subject, req });
    throw new HttpError(401, opts.wrong ?? 'That password is not right.', {
      fields: [{ field: opts.field ?? 'body.password', reason: 'does not match your password' }],
    });
  }
  await tries.succeeded();
}
