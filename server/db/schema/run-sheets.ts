import { sql } from 'drizzle-orm';
import { check, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { runs } from './runs';

/**
 * Issued run sheets: the PDF of a signed run, drawn once and then served from the file store, where
 * its bytes sit under their SHA-256. `sheetKey` is the SHA-256 of everything the sheet draws (the run
 * as served, signature check included; server/modules/runs/run-sheet-file.ts), so a sheet that would
 * now read differently is drawn anew.
 */
export const runSheetFiles = pgTable(
  'run_sheet_files',
  {
    sheetKey: text().primaryKey(),
    runId: uuid()
      .notNull()
      .references(() => runs.id),
    sha256: text().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [check('run_sheet_files_sha256_hex', sql`${t.sha256} ~ '^[0-9a-f]{64}$'`)],
);
