import { and, ne, sql } from 'drizzle-orm';
import type { Request } from 'express';
import type { Db } from '../db/client';
import { session } from '../db/schema';

/**
 * Deletes every stored session of a person (but `keepSid`) and drops them from this process's
 * caches at once; another app process stops honouring them within its session read cache (2 s).
 */
export async function endSessionsOf(db: Db, req: Request, personId: string, keepSid?: string) {
  const mine = sql`${session.sess}->'passport'->>'user' = ${personId}`;
  const ended = await db
    .delete(session)
    .where(keepSid ? and(mine, ne(session.sid, keepSid)) : mine)
    .returning({ sid: session.sid });
  (req.app.locals.forgetSessionsOf as (id: string) => void)(personId);
  (req.app.locals.passport as { forgetPerson(id: string): void }).forgetPerson(personId);
  return ended.length;
}
