import { sql } from 'drizzle-orm';
import { check, date, integer, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import type { InstrumentKind } from '../../../shared/schemas/registers';
import { people } from './people';
import { attachments } from './procedures';

/** The shop's test instruments, each with its calibration due date and latest certificate. */
export const instruments = pgTable(
  'instruments',
  {
    id: uuid().primaryKey().defaultRandom(),
    identifier: text().notNull(),
    kind: text().$type<InstrumentKind>().notNull(),
    description: text().notNull().default(''),
    calibrationDue: date({ mode: 'string' }).notNull(),
    certificateId: uuid().references(() => attachments.id),
    lockVersion: integer().notNull().default(1),
    createdBy: uuid()
      .notNull()
      .references(() => people.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('instruments_identifier_uq').on(sql`lower(${t.identifier})`),
    check(
      'instruments_kind_ck',
      sql`${t.kind} in ('meter', 'oscilloscope', 'variac-meter', 'insulation-tester')`,
    ),
  ],
);
