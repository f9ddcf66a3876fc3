import { sql } from 'drizzle-orm';
import { bigserial, check, index, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import type { Disposition, UnitState } from '../../../shared/schemas/follow-ups';
import { people } from './people';
import { procedures } from './procedures';
import { runs, units } from './runs';

/**
 * Append-only: the second signature on a signed run ("checked and released") over the run's content
 * hash, by someone other than its performer; one per run (guarded by triggers, drizzle/0024).
 */
export const runReleases = pgTable(
  'run_releases',
  {
    id: uuid().primaryKey().defaultRandom(),
    runId: uuid()
      .notNull()
      .references(() => runs.id),
    signerId: uuid()
      .notNull()
      .references(() => people.id),
    signerName: text().notNull(),
    /** The capacity they release in: a reviewer, or a technician qualified for the run. */
    signerRole: text().notNull(),
    meaning: text().$type<'released'>().notNull().default('released'),
    contentHash: text().notNull(),
    requestId: text(),
    signedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('run_releases_run_uq').on(t.runId),
    check('run_releases_meaning_ck', sql`${t.meaning} = 'released'`),
  ],
);

/** Append-only: every state a unit was put in (the latest is its state now), by a signature or by a person with a reason. */
export const unitStateChanges = pgTable(
  'unit_state_changes',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    unitId: uuid()
      .notNull()
      .references(() => units.id),
    state: text().$type<UnitState>().notNull(),
    /** The run whose signature moved the unit (performed → on the bench, released → released). */
    runId: uuid().references(() => runs.id),
    reason: text(),
    byId: uuid()
      .notNull()
      .references(() => people.id),
    byName: text().notNull(),
    at: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('unit_state_changes_unit_idx').on(t.unitId, t.id),
    check(
      'unit_state_changes_state_ck',
      sql`${t.state} in ('on_bench', 'released', 'waiting_parts', 'returned')`,
    ),
    check('unit_state_changes_released_ck', sql`${t.state} <> 'released' or ${t.runId} is not null`),
    check(
      'unit_state_changes_why_ck',
      sql`${t.runId} is not null or length(btrim(coalesce(${t.reason}, ''))) >= 3`,
    ),
  ],
);

/**
 * The record a signed run with out-of-band readings opens (in its signing transaction). Closed only
 * by a later in-band signed run of the same procedure on the same unit, or by a disposition that ends
 * it (a reviewer's accepted reason, or return unrepaired); closed, it is frozen (drizzle/0024).
 */
export const followUps = pgTable(
  'follow_ups',
  {
    id: uuid().primaryKey().defaultRandom(),
    runId: uuid()
      .notNull()
      .references(() => runs.id),
    unitId: uuid()
      .notNull()
      .references(() => units.id),
    procedureId: uuid()
      .notNull()
      .references(() => procedures.id),
    /** The run's out-of-band entries (run_entries ids). */
    entryIds: uuid().array().notNull(),
    ownerId: uuid()
      .notNull()
      .references(() => people.id),
    disposition: text().$type<Disposition>(),
    dispositionReason: text(),
    dispositionBy: uuid().references(() => people.id),
    dispositionAt: timestamp({ withTimezone: true }),
    closingRunId: uuid().references(() => runs.id),
    closedBy: uuid().references(() => people.id),
    closedAt: timestamp({ withTimezone: true }),
    openedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('follow_ups_run_uq').on(t.runId),
    index('follow_ups_unit_idx').on(t.unitId),
    index('follow_ups_open_idx')
      .on(t.openedAt)
      .where(sql`${t.closedAt} is null`),
    check('follow_ups_disposition_ck', sql`${t.disposition} in ('repair', 'accept', 'return')`),
    check(
      'follow_ups_decided_ck',
      sql`(${t.disposition} is null) = (${t.dispositionBy} is null) and (${t.disposition} is null) = (${t.dispositionAt} is null)
        and (${t.disposition} is null or ${t.disposition} = 'repair' or length(btrim(coalesce(${t.dispositionReason}, ''))) >= 3)`,
    ),
    check(
      'follow_ups_closed_ck',
      sql`(${t.closedAt} is null) = (${t.closedBy} is null)
        and (${t.closingRunId} is null or ${t.closedAt} is not null)
        and (${t.closedAt} is null or ${t.closingRunId} is not null or coalesce(${t.disposition}, '') in ('accept', 'return'))`,
    ),
  ],
);
