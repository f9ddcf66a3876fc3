import { sql } from 'drizzle-orm';
import {
  bigserial,
  boolean,
  check,
  date,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgTable,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import type { ProcedureParams } from '../../../shared/document/params';
import type { Snapshot } from '../../../shared/document/evaluate';
import type { RunStep } from '../../../shared/schemas/runs';
import { instruments } from './instruments';
import { people } from './people';
import { attachments, procedures, revisions } from './procedures';

/** One physical item on the bench: a customer's amplifier, a radio in for service. */
export const units = pgTable(
  'units',
  {
    id: uuid().primaryKey().defaultRandom(),
    model: text().notNull(),
    serial: text().notNull(),
    owner: text().notNull().default(''),
    jobNumber: text().notNull().default(''),
    notes: text().notNull().default(''),
    createdBy: uuid()
      .notNull()
      .references(() => people.id),
    lockVersion: integer().notNull().default(1),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('units_model_idx').on(t.model),
    uniqueIndex('units_model_serial_uq').on(sql`lower(${t.model})`, sql`lower(${t.serial})`),
  ],
);

export const unitPhotos = pgTable(
  'unit_photos',
  {
    id: uuid().primaryKey().defaultRandom(),
    unitId: uuid()
      .notNull()
      .references(() => units.id),
    attachmentId: uuid()
      .notNull()
      .references(() => attachments.id),
    caption: text().notNull().default(''),
    addedBy: uuid()
      .notNull()
      .references(() => people.id),
    addedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('unit_photos_unit_idx').on(t.unitId), index('unit_photos_attachment_idx').on(t.attachmentId)],
);

export const RUN_STATUSES = ['in_progress', 'signed', 'abandoned'] as const;
export type RunStatus = (typeof RUN_STATUSES)[number];

/**
 * One technician following one approved revision on one unit. The run keeps the revision it was
 * started on and its own evaluated snapshot (at the bench's measured mains), whatever is approved later.
 */
export const runs = pgTable(
  'runs',
  {
    id: uuid().primaryKey().defaultRandom(),
    unitId: uuid()
      .notNull()
      .references(() => units.id),
    procedureId: uuid()
      .notNull()
      .references(() => procedures.id),
    revisionId: uuid()
      .notNull()
      .references(() => revisions.id),
    revisionNumber: integer().notNull(),
    /** SHA-256 of the canonical revision content at the start of the run. */
    revisionHash: text().notNull(),
    title: text().notNull(),
    params: jsonb().$type<ProcedureParams>().notNull(),
    snapshot: jsonb().$type<Snapshot>().notNull(),
    steps: jsonb().$type<RunStep[]>().notNull(),
    status: text().$type<RunStatus>().notNull().default('in_progress'),
    outOfTolerance: boolean().notNull().default(false),
    /** Client-generated key so a repeated start creates one run. */
    startKey: uuid().unique(),
    startedBy: uuid()
      .notNull()
      .references(() => people.id),
    /** Who performs the run now: the only person who may record entries and sign (changed by a recorded handover). */
    performedBy: uuid()
      .notNull()
      .references(() => people.id),
    startedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    signedAt: timestamp({ withTimezone: true }),
    /** Closed as abandoned: when, by whom and why (the run is frozen from then on). */
    closedAt: timestamp({ withTimezone: true }),
    closedBy: uuid().references(() => people.id),
    closeReason: text(),
    contentHash: text(),
    /** A trainee's run: the qualified person who witnesses it and co-signs before it is signed. */
    witnessId: uuid().references(() => people.id),
    /** The bench's usual instrument, taking each reading unless another is chosen for it. */
    defaultInstrumentId: uuid().references(() => instruments.id),
    /**
     * Readings copied in from a blank bench sheet: the date written on the paper (entries made while it
     * is set keep it as the day they were taken) and the sheet's identifier as printed, when given.
     */
    paperSheetDate: date({ mode: 'string' }),
    paperSheetRef: text(),
    /** The unit as it was when the run sheet was signed (the register itself stays editable). */
    unitRecord: jsonb().$type<{
      id: string;
      model: string;
      serial: string;
      owner: string;
      jobNumber: string;
    }>(),
  },
  (t) => [
    index('runs_unit_idx').on(t.unitId),
    index('runs_revision_idx').on(t.revisionId),
    index('runs_status_idx').on(t.status),
    check('runs_status_ck', sql`${t.status} in ('in_progress', 'signed', 'abandoned')`),
    check(
      'runs_abandoned_ck',
      sql`${t.status} <> 'abandoned' or (${t.closedAt} is not null and ${t.closedBy} is not null and ${t.closeReason} is not null)`,
    ),
  ],
);

/** Append-only: each handover of a run from one technician to another, with who made it and why. */
export const runHandovers = pgTable(
  'run_handovers',
  {
    id: uuid().primaryKey().defaultRandom(),
    runId: uuid()
      .notNull()
      .references(() => runs.id),
    fromId: uuid()
      .notNull()
      .references(() => people.id),
    fromName: text().notNull(),
    toId: uuid()
      .notNull()
      .references(() => people.id),
    toName: text().notNull(),
    /** The performer handing over, or an admin reassigning the run. */
    byId: uuid()
      .notNull()
      .references(() => people.id),
    byName: text().notNull(),
    reason: text().notNull(),
    at: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('run_handovers_run_idx').on(t.runId)],
);

/** The current entry for each step of a run; every version is also kept in run_entry_history. */
export const runEntries = pgTable(
  'run_entries',
  {
    id: uuid().primaryKey().defaultRandom(),
    runId: uuid()
      .notNull()
      .references(() => runs.id),
    stepId: text().notNull(),
    kind: text().$type<'reading' | 'check' | 'hazard'>().notNull(),
    /** The measurement exactly as typed ("352 V"), and its value in the base unit. */
    raw: text(),
    measured: doublePrecision(),
    unit: text(),
    expected: doublePrecision(),
    low: doublePrecision(),
    high: doublePrecision(),
    /** Decided by the server with checkReading; null when the reading has no band. */
    within: boolean(),
    deviation: doublePrecision(),
    deviationPercent: doublePrecision(),
    /** The instrument that took the reading, and its calibration due date at the time. */
    instrumentId: uuid().references(() => instruments.id),
    instrumentDue: date({ mode: 'string' }),
    /** Copied from a paper bench sheet: the day it was taken there (the run's paper sheet date then). */
    takenOn: date({ mode: 'string' }),
    /** Check step ticked, or hazard note acknowledged. */
    done: boolean().notNull().default(false),
    note: text().notNull().default(''),
    version: integer().notNull().default(1),
    lastKey: uuid().notNull(),
    enteredBy: uuid()
      .notNull()
      .references(() => people.id),
    firstEnteredAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    enteredAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('run_entries_run_step_uq').on(t.runId, t.stepId)],
);

/** Append-only: every version of every entry, with who, when (database time) and why. */
export const runEntryHistory = pgTable(
  'run_entry_history',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    runId: uuid()
      .notNull()
      .references(() => runs.id),
    entryId: uuid()
      .notNull()
      .references(() => runEntries.id),
    stepId: text().notNull(),
    version: integer().notNull(),
    /** The client's idempotency key: the same key twice is one entry. */
    idempotencyKey: uuid().notNull().unique(),
    /** SHA-256 of the request the key came with: the same key with another body is refused. */
    requestHash: text(),
    raw: text(),
    measured: doublePrecision(),
    within: boolean(),
    done: boolean().notNull(),
    note: text().notNull(),
    reason: text(),
    /** Copied from a paper bench sheet dated this day. */
    takenOn: date({ mode: 'string' }),
    enteredBy: uuid()
      .notNull()
      .references(() => people.id),
    enteredByName: text().notNull(),
    enteredAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('run_entry_history_entry_idx').on(t.entryId), index('run_entry_history_run_idx').on(t.runId)],
);

export const runPhotos = pgTable(
  'run_photos',
  {
    id: uuid().primaryKey().defaultRandom(),
    runId: uuid()
      .notNull()
      .references(() => runs.id),
    stepId: text(),
    attachmentId: uuid()
      .notNull()
      .references(() => attachments.id),
    addedBy: uuid()
      .notNull()
      .references(() => people.id),
    addedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('run_photos_run_idx').on(t.runId), index('run_photos_attachment_idx').on(t.attachmentId)],
);

/** The technician's signature on a run sheet (append-only; refused UPDATE/DELETE by trigger). */
export const runSignatures = pgTable(
  'run_signatures',
  {
    id: uuid().primaryKey().defaultRandom(),
    runId: uuid()
      .notNull()
      .references(() => runs.id),
    signerId: uuid()
      .notNull()
      .references(() => people.id),
    signerName: text().notNull(),
    signerRole: text().notNull(),
    meaning: text().$type<'performed'>().notNull(),
    reason: text(),
    contentHash: text().notNull(),
    revisionId: uuid()
      .notNull()
      .references(() => revisions.id),
    revisionHash: text().notNull(),
    requestId: text(),
    signedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('run_signatures_run_meaning_uq').on(t.runId, t.meaning)],
);
