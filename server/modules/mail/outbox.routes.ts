import { z } from 'zod';
import { defineRoute } from '../../http/route';
import { outboxPage } from './outbox.service';

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
      const { items, total, pending } = await outboxPage(deps.db, query);
      return {
        items,
        total,
        pending,
        page: query.page,
        pageSize: query.pageSize,
      };
    },
  }),
];
