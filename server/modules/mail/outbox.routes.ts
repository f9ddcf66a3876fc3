import { count, desc, isNotNull, isNull } from 'drizzle-orm';
import { z } from 'zod';
import type { OutboxItemView } from '../../../shared/schemas/review';
import { mailOutbox } from '../../db/schema';
import { defineRoute } from '../../http/route';

/** Set-password links are secrets meant for the invitee alone; the outbox page shows them cut. */
const redact = (text: string) =>
  text.replace(/(\/set-password\/)[A-Za-z0-9_-]+/g, '$1[link sent to the invitee]');

const outboxQuery = z
  .object({
    status: z.enum(['sent', 'pending'], { error: 'must be sent or pending' }).optional(),
    page: z.coerce.number().int().min(1).max(100_000).default(1),
    pageSize: z.coerce.number().int().min(1).max(200).default(50),
  })
  .strict();

export const outboxRoutes = [
  defineRoute({
    method: 'get',
    path: '/mail/outbox',
    access: ['admin'],
    summary:
      'Mail queued by Benchwright, newest first: recipients, reason, delivery state, attempts, last error, text',
    query: outboxQuery,
    handler: async ({ query, deps }) => {
      const filter =
        query.status === 'sent'
          ? isNotNull(mailOutbox.sentAt)
          : query.status === 'pending'
            ? isNull(mailOutbox.sentAt)
            : undefined;
      const [total] = await deps.db.select({ n: count() }).from(mailOutbox).where(filter);
      const [pending] = await deps.db
        .select({ n: count() })
        .from(mailOutbox)
        .where(isNull(mailOutbox.sentAt));
      const rows = await deps.db
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
      return {
        items,
        total: total?.n ?? 0,
        pending: pending?.n ?? 0,
        page: query.page,
        pageSize: query.pageSize,
      };
    },
  }),
];
