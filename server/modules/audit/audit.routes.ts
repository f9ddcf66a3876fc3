import { z } from 'zod';
import { verifyAuditChain } from '../../audit/chain';
import { AUDIT_ACTIONS } from '../../audit/record';
import { defineRoute } from '../../http/route';
import { auditPage } from './audit.service';

/** A calendar day (YYYY-MM-DD, UTC) or a full ISO timestamp. */
const when = z
  .string()
  .max(40)
  .refine(
    (s) => /^\d{4}-\d{2}-\d{2}(T[\d:.]+(Z|[+-]\d{2}:\d{2})?)?$/.test(s) && !Number.isNaN(Date.parse(s)),
    { error: 'must be a date (YYYY-MM-DD) or an ISO date-time', abort: true },
  )
  // PostgreSQL has no year 0 and the log starts long after 1970: anything outside is a typo, not a 500.
  .refine(
    (s) => Date.parse(s) >= Date.UTC(1970, 0, 1) && Date.parse(s) < Date.UTC(10000, 0, 1),
    'must be a date between 1970 and 9999',
  );

export const auditQuery = z
  .object({
    action: z.enum(AUDIT_ACTIONS, { error: 'not a recorded action' }).optional(),
    personId: z.uuid({ error: 'Choose a person from the list' }).meta({ title: 'Person' }).optional(),
    from: when.optional(),
    /** Inclusive: a bare date covers that whole day. */
    to: when.optional(),
    page: z.coerce.number().int().min(1).max(100_000).default(1),
    pageSize: z.coerce.number().int().min(1).max(200).default(50),
  })
  .strict()
  .refine((q) => !q.from || !q.to || Date.parse(q.from) <= Date.parse(q.to), {
    message: 'must not be after "to"',
    path: ['from'],
  });

export const auditRoutes = [
  defineRoute({
    method: 'get',
    path: '/audit/chain',
    access: ['admin'],
    summary: 'Check the audit log hash chain: every entry recomputed, the first broken link named',
    handler: async ({ deps }) => ({ chain: await verifyAuditChain(deps.db) }),
  }),

  defineRoute({
    method: 'get',
    path: '/audit',
    access: ['admin'],
    summary: 'The audit log, newest first, filtered by action, person and date range, in pages',
    query: auditQuery,
    handler: async ({ query, deps }) => {
      const { entries, total } = await auditPage(deps.db, query);
      return {
        entries,
        total,
        page: query.page,
        pageSize: query.pageSize,
        actions: AUDIT_ACTIONS,
      };
    },
  }),
];
