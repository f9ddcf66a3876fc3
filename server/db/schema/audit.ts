import { bigserial, index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { people } from './people';

/**
 * Append-only record of security-relevant events (state changes, sign-offs, sign-in failures, role
 * changes, deactivations…). A database trigger refuses UPDATE, DELETE and TRUNCATE.
 */
export const auditLog = pgTable(
  'audit_log',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    at: timestamp({ withTimezone: true }).notNull().defaultNow(),
    actorId: uuid().references(() => people.id),
    action: text().notNull(),
    subject: text(),
    details: jsonb().$type<Record<string, unknown>>().notNull().default({}),
    ip: text(),
  },
  (t) => [index('audit_log_at_idx').on(t.at), index('audit_log_action_idx').on(t.action), index('audit_log_actor_idx').on(t.actorId, t.at)],
);
