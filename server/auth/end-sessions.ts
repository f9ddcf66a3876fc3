import { and, ne, sql } from 'drizzle-orm';
import type { AppDeps } from '../deps';
import { session } from '../db/schema';

/**
 * Deletes every stored session of a person (but `keepSid`) and drops them from this process's
 * caches at once; another app process stops honouring them within its session read cache (2 s).
 */
export async function endSessionsOf(
  { db, auth }: Pick<AppDeps, 'db' | 'auth'>,
  personId: string,
  keepSid?: string,
) {
  const mine = sql`${session.sess}->'passport'->>'user' = ${personId}`;
  const ended = await db
    .delete(session)
    .where(keepSid ? and(mine, ne(session.sid, keepSid)) : mine)
    .returning({ sid: session.sid });
  auth.sessions.forgetSessionsOf(personId);
  auth.passport.forgetPerson(personId);
  return ended.length;
}
