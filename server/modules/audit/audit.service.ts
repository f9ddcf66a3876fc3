import { and, count, desc, eq, gte, lt, type SQL } from 'drizzle-orm';
import type { AuditEntryView } from '../../../shared/schemas/review';
import type { AuditAction } from '../../audit/record';
import type { Db } from '../../db/client';
import { auditLog, people } from '../../db/schema';

/** The end of a "to" filter: a bare date covers that whole day. */
const endOf = (to: string) =>
  /^\d{4}-\d{2}-\d{2}$/.test(to) ? new Date(Date.parse(to) + 86_400_000) : new Date(Date.parse(to) + 1);

/** One page of the audit log, newest first, and how many entries match the filter. */
export async function auditPage(
  db: Db,
  query: {
    action?: AuditAction;
    personId?: string;
    from?: string;
    to?: string;
    page: number;
    pageSize: number;
  },
) {
  const where: SQL[] = [];
  if (query.action) where.push(eq(auditLog.action, query.action));
  if (query.personId) where.push(eq(auditLog.actorId, query.personId));
  if (query.from) where.push(gte(auditLog.at, new Date(query.from)));
  if (query.to) where.push(lt(auditLog.at, endOf(query.to)));
  const filter = where.length ? and(...where) : undefined;
  const [total] = await db.select({ n: count() }).from(auditLog).where(filter);
  const rows = await db
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
  return { entries, total: total?.n ?? 0 };
}
