import type pg from 'pg';

/** Whether PostgreSQL answers a trivial query now. */
export async function databaseReachable(pool: pg.Pool) {
  try {
    await pool.query('SELECT 1');
    return true;
  } catch {
    return false;
  }
}
