import { index, json, pgTable, timestamp, varchar } from 'drizzle-orm/pg-core';

/**
 * Exactly the table connect-pg-simple expects (its table.sql), declared here so the committed
 * migrations create it and drizzle-kit never drops it. Do not add columns.
 */
export const session = pgTable(
  'session',
  {
    sid: varchar('sid').primaryKey(),
    sess: json('sess').notNull(),
    expire: timestamp('expire', { precision: 6 }).notNull(),
  },
  (t) => [index('IDX_session_expire').on(t.expire)],
);
