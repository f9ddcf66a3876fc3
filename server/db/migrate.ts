import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import type { Db } from './client';

const migrationsFolder = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../drizzle');

/** Applies the committed migrations in drizzle/ (idempotent). */
export async function applyMigrations(db: Db) {
  await migrate(db, { migrationsFolder });
}
