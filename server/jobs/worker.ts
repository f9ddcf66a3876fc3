// Each app process works the job queue; pg-boss hands every job to one of them, and fires each
// schedule once for all of them (its cron clock is kept in PostgreSQL).
import type pg from 'pg';
import PgBoss from 'pg-boss';
import type { Logger } from 'pino';
import { checkAuditChain } from '../audit/watch';
import type { Db } from '../db/client';
import type { MailSender } from '../mail/sender';
import { notifyDueReviews } from '../modules/review-due/review-due.service';
import { JOB_SCHEMA, QUEUES, type QueueName } from './queue';

export interface JobSettings {
  publicUrl: string;
  reviewIntervalMonths: number;
  /** Audit chain re-check, minutes (0: at start only). */
  auditCheckMinutes: number;
  /** Review-due check, minutes (0: at start only). */
  reviewDueCheckMinutes: number;
  /** How often a worker asks for new jobs. */
  pollingSeconds?: number;
}

/** A cron line for "every n minutes" (n < 60: within the hour; otherwise every whole hour or day). */
export function everyMinutes(n: number) {
  if (n < 60) return `*/${Math.max(1, Math.round(n))} * * * *`;
  const hours = Math.round(n / 60);
  return hours < 24 ? `0 */${hours} * * *` : '0 0 * * *';
}

export async function startJobs(
  pool: pg.Pool,
  db: Db,
  logger: Logger,
  mailer: MailSender | undefined,
  settings: JobSettings,
) {
  const boss = new PgBoss({
    schema: JOB_SCHEMA,
    db: { executeSql: (text: string, values: unknown[]) => pool.query(text, values) },
    migrate: false, // the owner installs and upgrades the schema (installJobQueue)
  });
  boss.on('error', (err: Error) => logger.warn({ msg: err.message }, 'job queue error'));
  await boss.start();
  const polling = { pollingIntervalSeconds: settings.pollingSeconds ?? 2 };
  const handlers: Record<QueueName, (data: Record<string, unknown>) => Promise<unknown>> = {
    [QUEUES.mail]: async (data) => mailer?.deliver(String(data.mailId)),
    [QUEUES.mailSweep]: async () => mailer?.flush(),
    [QUEUES.auditChain]: async () => checkAuditChain(db, logger),
    [QUEUES.reviewDue]: async () => {
      const n = await notifyDueReviews(db, {
        months: settings.reviewIntervalMonths,
        publicUrl: settings.publicUrl,
        mailer,
      });
      if (n) logger.info({ fellDue: n }, 'periodic reviews fell due; reviewers mailed');
    },
  };
  for (const [name, handle] of Object.entries(handlers))
    await boss.work<Record<string, unknown>>(name, { ...polling, batchSize: 5 }, async (jobs) => {
      for (const job of jobs) await handle(job.data ?? {});
    });
  // Schedules are rows in PostgreSQL: setting them from every process is one schedule.
  await boss.schedule(QUEUES.mailSweep, '* * * * *');
  const periodic: [QueueName, number][] = [
    [QUEUES.auditChain, settings.auditCheckMinutes],
    [QUEUES.reviewDue, settings.reviewDueCheckMinutes],
  ];
  for (const [name, minutes] of periodic) {
    if (minutes > 0) await boss.schedule(name, everyMinutes(minutes));
    else await boss.unschedule(name);
    // At start: one check for processes starting within the same minute, not one each.
    await boss.sendThrottled(name, {}, {}, 60, 'start');
  }
  return {
    boss,
    async stop() {
      await boss.stop({ graceful: true, wait: true, timeout: 5_000 });
    },
  };
}
