import type { Request } from 'express';
import type { Db } from '../db/client';
import { auditLog } from '../db/schema';

export type AuditAction =
  | 'sign-in'
  | 'sign-in.failed'
  | 'sign-out'
  | 'person.invited'
  | 'person.password-set'
  | 'person.roles-changed'
  | 'person.deactivated'
  | 'person.reactivated';

/** Appends one row to the audit log. Free text is cut short and stripped of control characters. */
export async function recordAudit(
  db: Db,
  entry: { action: AuditAction; actorId?: string | null; subject?: string; details?: Record<string, unknown>; req?: Request },
) {
  const clean = (s: string | undefined) => s?.replace(/[\u0000-\u001f\u007f]/g, ' ').slice(0, 200);
  await db.insert(auditLog).values({
    action: entry.action,
    actorId: entry.actorId ?? null,
    subject: clean(entry.subject) ?? null,
    details: entry.details ?? {},
    ip: entry.req?.ip ?? null,
  });
}
