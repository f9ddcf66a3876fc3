// The server checks the audit hash chain when it starts and then on a schedule (a job: server/jobs/worker.ts), and writes the
// head (position and hash of the last entry) to its log each time. The log lives apart from the
// database, so a later truncation of the audit log, or a chain recomputed by someone with owner
// rights, shows against a head written down before it.
import type { Logger } from 'pino';
import type { Db } from '../db/client';
import { verifyAuditChain } from './chain';

/** One check: info with the head when every link holds, error naming the first broken one. */
export async function checkAuditChain(db: Db, logger: Logger) {
  const started = Date.now();
  try {
    const report = await verifyAuditChain(db);
    const ms = Date.now() - started;
    if (report.firstBroken)
      logger.error({ checked: report.checked, firstBroken: report.firstBroken, ms }, 'audit chain broken');
    else logger.info({ checked: report.checked, head: report.head, ms }, 'audit chain verified');
    return report;
  } catch (err) {
    logger.warn(
      { msg: (err as Error).message },
      'audit chain check could not run; trying again at the next one',
    );
    return null;
  }
}

export const DEFAULT_CHECK_INTERVAL_MS = 3600_000;
