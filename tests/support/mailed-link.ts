import { desc, sql } from 'drizzle-orm';
import type { Db } from '../../server/db/client';
import { mailOutbox } from '../../server/db/schema';
import { linksIn, setPasswordToken } from './parsed-mail';

/**
 * The token of the newest set-password link mailed to `email`, read from the mail queued for them
 * (the admin's answer never carries it).
 */
export async function setPasswordTokenMailedTo(db: Db, email: string) {
  const rows = await db
    .select()
    .from(mailOutbox)
    .where(sql`${email.toLowerCase()} = any(${mailOutbox.to})`)
    .orderBy(desc(mailOutbox.createdAt));
  for (const row of rows) {
    const token = setPasswordToken({ links: linksIn(row.text) });
    if (token) return token;
  }
  throw new Error(`no set-password link was mailed to ${email}`);
}
