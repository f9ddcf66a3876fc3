import { bigint, bigserial, index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { people } from './people';

/**
 * Append-only record of security-relevant events (state changes, sign-offs, sign-in failures, role
 * changes, deactivations…). A database trigger refuses UPDATE, DELETE and TRUNCATE, and another
 * links each row to the one before (seq, prevHash, rowHash: drizzle/0012), so an edit made around
 * the triggers shows up in the chain check.
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
    /** Position in the hash chain, set by the database (not null once written). */
    seq: bigint({ mode: 'number' }).unique(),
    /** SHA-256 (hex) of the previous row in the chain; 64 zeros for the first. */
    prevHash: text(),
    /** SHA-256 (hex) of this row's content and prevHash. */
    rowHash: text(),
  },
  (t) => [
    index('audit_log_at_idx').on(t.at),
    index('audit_log_action_idx').on(t.action),
    index('audit_log_actor_idx').on(t.actorId, t.at),
  ],
);
