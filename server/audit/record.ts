import type { Request } from 'express';
import type { Db, Tx } from '../db/client';
import { auditLog } from '../db/schema';
import { oneLine } from '../http/clean-text';

import type { AuditAction } from '../../shared/audit-actions';

/** The actions and their words live in shared/audit-actions.ts (one registry for server and page). */
export { AUDIT_ACTIONS, type AuditAction } from '../../shared/audit-actions';

/**
 * Appends one row to the audit log. Free text is cut short and stripped of control characters.
 * Pass the transaction of the change it records, so the entry exists exactly when the change does.
 */
export async function recordAudit(
  db: Db | Tx,
  entry: {
    action: AuditAction;
    actorId?: string | null;
    subject?: string;
    details?: Record<string, unknown>;
    req?: Request;
  },
) {
  const clean = (s: string | undefined) => (s === undefined ? undefined : oneLine(s, 200));
  const [row] = await db
    .insert(auditLog)
    .values({
      action: entry.action,
      actorId: entry.actorId ?? null,
      subject: clean(entry.subject) ?? null,
      details: entry.details ?? {},
      ip: entry.req?.ip ?? null,
    })
    .returning({ id: auditLog.id });
  return row!.id;
}
