import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import type { Logger } from 'pino';
import * as schema from './schema';

/**
 * One pool for the process. Idle-client and checked-out-client errors are logged (code and
 * message only: err.client holds connection settings) instead of crashing the process when
 * PostgreSQL restarts.
 */
export function createPool(connectionString: string, logger?: Logger) {
  const pool = new pg.Pool({
    connectionString,
    max: 10,
    connectionTimeoutMillis: 3_000,
    idleTimeoutMillis: 30_000,
    statement_timeout: 15_000,
  });
  const report = (err: Error & { code?: string }) =>
    logger?.warn({ code: err.code, msg: err.message }, 'database connection error');
  pool.on('error', report);
  pool.on('connect', (client) => client.on('error', report));
  return pool;
}

export function createDb(pool: pg.Pool) {
  return drizzle(pool, { schema, casing: 'snake_case' });
}

export type Db = ReturnType<typeof createDb>;
/** A transaction on Db: what a service takes when it runs inside its caller's transaction. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
export { schema };
