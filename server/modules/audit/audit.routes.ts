import { and, count, desc, eq, gte, lt, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import type { AuditEntryView } from '../../../shared/schemas/review';
import { verifyAuditChain } from '../../audit/chain';
import { AUDIT_ACTIONS } from '../../audit/record';
import { auditLog, people } from '../../db/schema';
import { defineRoute } from '../../http/route';

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
    personId: z.uuid('not a valid person id').optional(),
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

const endOf = (to: string) =>
  /^\d{4}-\d{2}-\d{2}$/.test(to) ? new Date(Date.parse(to) + 86_400_000) : new Date(Date.parse(to) + 1);

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
      const where: SQL[] = [];
      if (query.action) where.push(eq(auditLog.action, query.action));
      if (query.personId) where.push(eq(auditLog.actorId, query.personId));
      if (query.from) where.push(gte(auditLog.at, new Date(query.from)));
      if (query.to) where.push(lt(auditLog.at, endOf(query.to)));
      const filter = where.length ? and(...where) : undefined;
      const [total] = await deps.db.select({ n: count() }).from(auditLog).where(filter);
      const rows = await deps.db
        .select({ a: auditLog, actor: { id: people.id, displayName: people.displayName } })
        .from(auditLog)
        .leftJoin(people, eq(people.id, auditLog.actorId))
        .where(filter)
        .orderBy(desc(auditLog.id))
        .limit(query.pageSize)
        .offset((query.page - 1) * query.pageSize);
      const entries: AuditEntryView[] = rows.map(({ a, actor }) => ({
        id: a.id,
        at: a.at.toISOString(),
        action: a.action,
        actor: actor?.id ? actor : null,
        subject: a.subject,
        details: a.details,
        ip: a.ip,
      }));
      return {
        entries,
        total: total?.n ?? 0,
        page: query.page,
        pageSize: query.pageSize,
        actions: AUDIT_ACTIONS,
      };
    },
  }),
];
