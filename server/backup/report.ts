import { createDb, createPool } from '../db/client';
import type { FileStore } from '../storage/files';
import { checkRecords, describeCheck } from './check';

/** Runs the records check on a database and its file store and says what it found, line by line. */
export async function reportRecords(databaseUrl: string, files: FileStore, say: (line: string) => void) {
  const pool = createPool(databaseUrl);
  try {
    const lines = describeCheck(await checkRecords(createDb(pool), files));
    for (const line of lines) say(line);
  } catch (err) {
    // An archive from an older version is checked once the app has migrated it.
    say(`the records could not be checked: ${(err as Error).message}`);
  } finally {
    await pool.end();
  }
}
