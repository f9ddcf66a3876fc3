import { index, integer, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { people } from './people';
import { procedures, revisions } from './procedures';

/**
 * A technician's recorded read of a newly approved revision (what changed) before their first run
 * on it. Append-only (trigger and grants, drizzle/0021); the database checks at insert that the
 * revision is approved and the hash is the one its approval signed, and takes the time from its clock.
 */
export const revisionAcknowledgements = pgTable(
  'revision_acknowledgements',
  {
    id: uuid().primaryKey().defaultRandom(),
    revisionId: uuid()
      .notNull()
      .references(() => revisions.id),
    procedureId: uuid()
      .notNull()
      .references(() => procedures.id),
    revisionNumber: integer().notNull(),
    personId: uuid()
      .notNull()
      .references(() => people.id),
    /** Copied at the time, so the record reads the same after people change. */
    personName: text().notNull(),
    /** The revision's content hash (revisions.content_hash) as acknowledged. */
    contentHash: text().notNull(),
    acknowledgedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('revision_acknowledgements_revision_person_uq').on(t.revisionId, t.personId),
    index('revision_acknowledgements_person_idx').on(t.personId),
  ],
);

/** Each approved revision whose periodic review fell due and was mailed about: one row, one mail. */
export const reviewDueNotices = pgTable('review_due_notices', {
  revisionId: uuid()
    .primaryKey()
    .references(() => revisions.id),
  dueAt: timestamp({ withTimezone: true }).notNull(),
  notifiedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});
