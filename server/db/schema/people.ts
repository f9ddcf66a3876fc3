import { sql } from 'drizzle-orm';
import { bigint, boolean, check, index, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';

import type { Role } from '../../../shared/schemas/roles';

export { ROLES, type Role } from '../../../shared/schemas/roles';

export const people = pgTable('people', {
  id: uuid().primaryKey().defaultRandom(),
  email: text().notNull().unique(),
  displayName: text().notNull(),
  /** argon2id hash; null until an invited person sets a password. */
  passwordHash: text(),
  roles: text()
    .array()
    .$type<Role[]>()
    .notNull()
    .default(sql`'{}'::text[]`),
  active: boolean().notNull().default(true),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  deactivatedAt: timestamp({ withTimezone: true }),
  /** Base32 secret of the person's authenticator (RFC 6238); null while they have none. */
  totpSecret: text(),
  /** A secret being set up: becomes totpSecret once a code from it is confirmed. */
  totpPendingSecret: text(),
  /** The last time step a code was accepted for: a code is never accepted twice (RFC 6238 §5.2). */
  totpLastStep: bigint({ mode: 'number' }),
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
    /** 'invitation' for a new person, 'reset' for an admin-started password reset. */
    purpose: text().$type<'invitation' | 'reset'>().notNull().default('invitation'),
  },
  (t) => [index('invitations_person_idx').on(t.personId)],
);

/** Single-use codes that stand in for a lost authenticator; only their SHA-256 is stored. */
export const recoveryCodes = pgTable(
  'recovery_codes',
  {
    id: uuid().primaryKey().defaultRandom(),
    personId: uuid()
      .notNull()
      .references(() => people.id, { onDelete: 'cascade' }),
    codeHash: text().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    usedAt: timestamp({ withTimezone: true }),
  },
  (t) => [unique('recovery_codes_person_code').on(t.personId, t.codeHash)],
);

/** The shop's sign-in settings: one row. */
export const shopSettings = pgTable(
  'shop_settings',
  {
    id: boolean().primaryKey().default(true),
    /** Reviewers and admins must use authenticator codes. */
    requireSecondFactor: boolean().notNull().default(false),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedBy: uuid().references(() => people.id),
  },
  (t) => [check('shop_settings_one_row', sql`${t.id}`)],
);
