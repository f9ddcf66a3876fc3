import { index, integer, pgTable, text, timestamp } from 'drizzle-orm/pg-core';

/**
 * Password tries per key ("sign-in:account:<e-mail>", "sign-in:address:<ip>", "sign-off:<person>"),
 * shared by every app process: a try is claimed here, atomically, before any password is checked
 * (server/auth/throttle.ts). `retryAt` is when the next try may start; `forgetAt` when a quiet key
 * starts over.
 */
export const authThrottle = pgTable(
  'auth_throttle',
  {
    key: text().primaryKey(),
    failures: integer().notNull(),
    retryAt: timestamp({ withTimezone: true }).notNull(),
    forgetAt: timestamp({ withTimezone: true }).notNull(),
  },
  (t) => [index('auth_throttle_forget_idx').on(t.forgetAt)],
);
