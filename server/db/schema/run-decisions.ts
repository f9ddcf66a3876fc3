import { sql } from 'drizzle-orm';
import { check, doublePrecision, index, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { people } from './people';
import { runs } from './runs';

/**
 * A hold point reached out of band: the run stops until a senior (reviewer or admin, not the
 * performer) decides to continue, with a reason, or to abandon the run. Inserted undecided; the
 * decision is written once and never changed or deleted (triggers in drizzle/0023).
 */
export const runHolds = pgTable(
  'run_holds',
  {
    id: uuid().primaryKey().defaultRandom(),
    runId: uuid()
      .notNull()
      .references(() => runs.id),
    stepId: text().notNull(),
    /** The entry version whose reading stopped the run, and that reading. */
    entryVersion: integer().notNull(),
    raw: text().notNull(),
    measured: doublePrecision().notNull(),
    unit: text().notNull(),
    low: doublePrecision(),
    high: doublePrecision(),
    openedBy: uuid()
      .notNull()
      .references(() => people.id),
    openedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    decision: text().$type<'continue' | 'abandon'>(),
    reason: text(),
    decidedBy: uuid().references(() => people.id),
    decidedByName: text(),
    decidedAt: timestamp({ withTimezone: true }),
  },
  (t) => [
    index('run_holds_run_idx').on(t.runId),
    check(
      'run_holds_decision_ck',
      sql`(${t.decision} is null and ${t.reason} is null and ${t.decidedBy} is null and ${t.decidedByName} is null and ${t.decidedAt} is null)
       or (${t.decision} in ('continue', 'abandon') and length(btrim(${t.reason})) >= 3 and ${t.decidedBy} is not null and ${t.decidedByName} is not null and ${t.decidedAt} is not null)`,
    ),
  ],
);

export const STEP_EXCEPTION_KINDS = ['not_applicable', 'deviation'] as const;
export type StepExceptionKind = (typeof STEP_EXCEPTION_KINDS)[number];

/**
 * A step recorded as not applicable (with why) or as a deviation (what was done instead). A
 * deviation waits for a senior's approval or refusal (with a note) before the run can be signed;
 * the decision is written once. The latest row for a step is the one that counts.
 */
export const runStepExceptions = pgTable(
  'run_step_exceptions',
  {
    id: uuid().primaryKey().defaultRandom(),
    runId: uuid()
      .notNull()
      .references(() => runs.id),
    stepId: text().notNull(),
    kind: text().$type<StepExceptionKind>().notNull(),
    /** Not applicable: why. Deviation: what was done instead, and why. */
    reason: text().notNull(),
    recordedBy: uuid()
      .notNull()
      .references(() => people.id),
    recordedByName: text().notNull(),
    recordedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    decision: text().$type<'approved' | 'refused'>(),
    decisionNote: text(),
    decidedBy: uuid().references(() => people.id),
    decidedByName: text(),
    decidedAt: timestamp({ withTimezone: true }),
  },
  (t) => [
    index('run_step_exceptions_run_idx').on(t.runId),
    check('run_step_exceptions_kind_ck', sql`${t.kind} in ('not_applicable', 'deviation')`),
    check('run_step_exceptions_reason_ck', sql`length(btrim(${t.reason})) >= 3`),
    check(
      'run_step_exceptions_decision_ck',
      sql`(${t.decision} is null and ${t.decisionNote} is null and ${t.decidedBy} is null and ${t.decidedByName} is null and ${t.decidedAt} is null)
       or (${t.kind} = 'deviation' and ${t.decision} in ('approved', 'refused') and length(btrim(${t.decisionNote})) >= 3 and ${t.decidedBy} is not null and ${t.decidedByName} is not null and ${t.decidedAt} is not null)`,
    ),
  ],
);
