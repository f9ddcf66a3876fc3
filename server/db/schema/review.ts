import { bigint, index, integer, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { people } from './people';
import { procedures, revisions } from './procedures';

export const SIGNATURE_MEANINGS = ['approved', 'returned', 'withdrawn'] as const;
export type SignatureMeaning = (typeof SIGNATURE_MEANINGS)[number];

/**
 * Sign-offs on revisions. Append-only: a database trigger refuses UPDATE, DELETE and TRUNCATE.
 * Name and role are copied at signing so the record reads the same after people change;
 * signed_at always comes from the database clock.
 */
export const signatures = pgTable(
  'signatures',
  {
    id: uuid().primaryKey().defaultRandom(),
    revisionId: uuid()
      .notNull()
      .references(() => revisions.id),
    procedureId: uuid()
      .notNull()
      .references(() => procedures.id),
    revisionNumber: integer().notNull(),
    signerId: uuid()
      .notNull()
      .references(() => people.id),
    signerName: text().notNull(),
    signerEmail: text().notNull(),
    signerRole: text().notNull(),
    meaning: text().$type<SignatureMeaning>().notNull(),
    /** The reviewer's comment (approved, returned) or the reason (withdrawn). */
    comment: text().notNull().default(''),
    /** SHA-256 (hex) of the canonical revision content the signer saw; see review/canonical.ts. */
    contentHash: text().notNull(),
    /** Version of the canonical form, so a future change to it cannot silently break old hashes. */
    hashVersion: integer().notNull().default(1),
    /** The audit row recording the password re-entry that authorised this signature. */
    reauthAuditId: bigint({ mode: 'number' }),
    requestId: text(),
    signedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    // One decision of each kind per revision: fifty parallel approvals leave exactly one row.
    uniqueIndex('signatures_revision_meaning_uq').on(t.revisionId, t.meaning),
    index('signatures_signer_idx').on(t.signerId),
  ],
);

/** Review comments on a revision as a whole (blockId null) or on one block of its document. */
export const reviewComments = pgTable(
  'review_comments',
  {
    id: uuid().primaryKey().defaultRandom(),
    revisionId: uuid()
      .notNull()
      .references(() => revisions.id),
    blockId: text(),
    authorId: uuid()
      .notNull()
      .references(() => people.id),
    body: text().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('review_comments_revision_idx').on(t.revisionId, t.createdAt)],
);
