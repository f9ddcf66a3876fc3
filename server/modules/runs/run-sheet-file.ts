// A signed run's sheet is drawn once and then served from the file store (S3 or disk): the PDF's
// bytes sit under their SHA-256 like any file, found through run_sheet_files by the SHA-256 of what
// the sheet draws. A run still open is drawn on each request (it changes with every entry).
import { eq } from 'drizzle-orm';
import type { RunView } from '../../../shared/schemas/runs';
import type { Db } from '../../db/client';
import { runSheetFiles } from '../../db/schema';
import { sha256Of, type FileStore } from '../../storage/files';
import { renderRunSheetPdf } from './pdf';

/** Raise when pdf.ts draws a sheet differently, so signed runs are drawn again with the new layout. */
const SHEET_LAYOUT = 1;

/**
 * The key covers the whole run as served, the signature check included: a photo altered after
 * signing, a later co-signature or hand-over makes another key, so the sheet never shows a stale
 * state. Serialised the same way each time (the view is built in a fixed order).
 */
const sheetKey = (run: RunView) => sha256Of(Buffer.from(JSON.stringify([SHEET_LAYOUT, run])));

export async function runSheetPdf(db: Db, files: FileStore, run: RunView): Promise<Buffer> {
  if (run.status !== 'signed') return renderRunSheetPdf(run);
  const key = sheetKey(run);
  const [issued] = await db
    .select({ sha256: runSheetFiles.sha256 })
    .from(runSheetFiles)
    .where(eq(runSheetFiles.sheetKey, key));
  const stored = issued && (await files.get(issued.sha256));
  if (stored) return stored;
  // Not issued yet, or its bytes are gone or altered: drawn again and kept.
  const pdf = await renderRunSheetPdf(run);
  const sha256 = await files.put(pdf);
  if (issued) await db.update(runSheetFiles).set({ sha256 }).where(eq(runSheetFiles.sheetKey, key));
  else await db.insert(runSheetFiles).values({ sheetKey: key, runId: run.id, sha256 }).onConflictDoNothing();
  return pdf;
}
