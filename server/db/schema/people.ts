import { sql } from 'drizzle-orm';
import { boolean, index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

import type { Role } from '../../../shared/schemas/roles';

export { ROLES, type Role } from '../../../shared/schemas/roles';

export const people = pgTable('people', {
  id: uuid().primaryKey().defaultRandom(),
  email: text().notNull().unique(),
  displayName: text().notNull(),
  /** argon2id hash; null until an invited person sets a password. */
  passwordHash: text(),
  roles: text().array().$type<Role[]>().notNull().default(sql`'{}'::text[]`),
  active: boolean().notNull().default(true),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  deactivatedAt: timestamp({ withTimezone: true }),
});

/** One-time set-password links; only a SHA-256 of the token is stored. */
export const invitations = pgTable(
  'invitations',
  {
    tokenHash: text().primaryKey(),
    personId: uuid()
      .notNull()
      .references(() => people.id, { onDelete: 'cascade' }),
    createdBy: uuid().references(() => people.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    usedAt: timestamp({ withTimezone: true }),
  },
  (t) => [index('invitations_person_idx').on(t.personId)],
);
