import { sql } from 'drizzle-orm';
import { check, index, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import type { QualificationScope } from '../../../shared/schemas/registers';
import { people } from './people';
import { revisions } from './procedures';
import { runs } from './runs';

/** Who may run which procedure family, and who may do live work; withdrawn rows stay as history. */
export const qualifications = pgTable(
  'qualifications',
  {
    id: uuid().primaryKey().defaultRandom(),
    personId: uuid()
      .notNull()
      .references(() => people.id),
    scope: text().$type<QualificationScope>().notNull(),
    family: text(),
    note: text().notNull().default(''),
    grantedBy: uuid()
      .notNull()
      .references(() => people.id),
    grantedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    withdrawnBy: uuid().references(() => people.id),
    withdrawnAt: timestamp({ withTimezone: true }),
    withdrawReason: text(),
  },
  (t) => [
    index('qualifications_person_idx').on(t.personId),
    uniqueIndex('qualifications_active_uq')
      .on(t.personId, t.scope, sql`lower(coalesce(${t.family}, ''))`)
      .where(sql`${t.withdrawnAt} is null`),
    check(
      'qualifications_scope_ck',
      sql`(${t.scope} = 'family' and ${t.family} is not null) or (${t.scope} = 'live' and ${t.family} is null)`,
    ),
    check(
      'qualifications_withdrawn_ck',
      sql`(${t.withdrawnAt} is null) = (${t.withdrawnBy} is null) and (${t.withdrawnAt} is null) = (${t.withdrawReason} is null)`,
    ),
  ],
);

/** Append-only: a witness's co-signature ("witnessed") on a trainee's run, over its content hash. */
export const runWitnessSignatures = pgTable(
  'run_witness_signatures',
  {
    id: uuid().primaryKey().defaultRandom(),
    runId: uuid()
      .notNull()
      .references(() => runs.id),
    signerId: uuid()
      .notNull()
      .references(() => people.id),
    signerName: text().notNull(),
    meaning: text().$type<'witnessed'>().notNull().default('witnessed'),
    contentHash: text().notNull(),
    revisionId: uuid()
      .notNull()
      .references(() => revisions.id),
    revisionHash: text().notNull(),
    requestId: text(),
    signedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('run_witness_signatures_run_idx').on(t.runId),
    check('run_witness_signatures_meaning_ck', sql`${t.meaning} = 'witnessed'`),
  ],
);
