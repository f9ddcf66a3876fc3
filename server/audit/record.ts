import type { Request } from 'express';
import type { Db, Tx } from '../db/client';
import { auditLog } from '../db/schema';
import { oneLine } from '../http/clean-text';

/** Every action the audit log records; the admin page filters by these. */
export const AUDIT_ACTIONS = [
  'sign-in',
  'sign-in.failed',
  'sign-out',
  'sign-out.everywhere',
  'sign-in.code-failed',
  'reauth.failed',
  'person.invited',
  'person.password-set',
  'person.password-changed',
  'person.password-reset-sent',
  'person.second-factor-enabled',
  'person.second-factor-disabled',
  'person.second-factor-reset',
  'person.recovery-codes-renewed',
  'settings.changed',
  'person.roles-changed',
  'person.deactivated',
  'person.reactivated',
  'revision.submitted',
  'revision.approved',
  'revision.returned',
  'revision.superseded',
  'revision.withdrawn',
  'sign-off.reauthenticated',
  'sign-off.failed',
  'review.commented',
  'run.signed',
  'run.handed-over',
  'run.abandoned',
] as const;

export type AuditAction = (typeof AUDIT_ACTIONS)[number];

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
