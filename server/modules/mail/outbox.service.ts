import { count, desc, isNotNull, isNull } from 'drizzle-orm';
import type { OutboxItemView } from '../../../shared/schemas/review';
import type { Db } from '../../db/client';
import { mailOutbox } from '../../db/schema';

/** Set-password links are secrets meant for the invitee alone; the outbox page shows them cut. */
const redact = (text: string) =>
  text.replace(/(\/set-password\/)[A-Za-z0-9_-]+/g, '$1[link sent to the invitee]');

/** One page of queued mail, newest first, with how many match and how many wait to be sent. */
export async function outboxPage(
  db: Db,
  query: { status?: 'sent' | 'pending'; page: number; pageSize: number },
) {
  const filter =
    query.status === 'sent'
      ? isNotNull(mailOutbox.sentAt)
      : query.status === 'pending'
        ? isNull(mailOutbox.sentAt)
        : undefined;
  const [total] = await db.select({ n: count() }).from(mailOutbox).where(filter);
  const [pending] = await db.select({ n: count() }).from(mailOutbox).where(isNull(mailOutbox.sentAt));
  const rows = await db
    .select()
    .from(mailOutbox)
    .where(filter)
    .orderBy(desc(mailOutbox.createdAt))
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  const items: OutboxItemView[] = rows.map((m) => ({
    id: m.id,
    to: m.to,
    subject: m.subject,
    reason: m.reason,
    createdAt: m.createdAt.toISOString(),
    status: m.sentAt ? 'sent' : 'pending',
    sentAt: m.sentAt?.toISOString() ?? null,
    attempts: m.attempts,
    lastError: m.lastError,
    nextAttemptAt: m.nextAttemptAt.toISOString(),
    text: redact(m.text),
  }));
  return { items, total: total?.n ?? 0, pending: pending?.n ?? 0 };
}
