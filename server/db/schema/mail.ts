import { index, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

/**
 * Mail waiting to go out. Rows are written in the same transaction as the change they report,
 * so a message is never lost; the sender retries with back-off while the mail server is down.
 */
export const mailOutbox = pgTable(
  'mail_outbox',
  {
    id: uuid().primaryKey().defaultRandom(),
    to: text().array().notNull(),
    subject: text().notNull(),
    text: text().notNull(),
    html: text().notNull(),
    /** What caused it, e.g. "review-requested", for the admin outbox page. */
    reason: text().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    nextAttemptAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    attempts: integer().notNull().default(0),
    lastError: text(),
    sentAt: timestamp({ withTimezone: true }),
  },
  (t) => [index('mail_outbox_due_idx').on(t.sentAt, t.nextAttemptAt)],
);
