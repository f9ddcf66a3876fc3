// The job queue: pg-boss, kept in PostgreSQL (schema `pgboss`), so a job survives a crash of the
// process that queued it and is worked by whichever app process is free. The schema and the queues
// are made by the owner with the migrations (installJobQueue); the app role only reads and writes
// their rows.
import { sql } from 'drizzle-orm';
import PgBoss from 'pg-boss';
import type { Db, Tx } from '../db/client';
import { APP_ROLE } from '../bootstrap/postgres';

export const JOB_SCHEMA = 'pgboss';

/** Every queue, once: its name and what a job in it carries. */
export const QUEUES = {
  /** Deliver one outbox row (data: { mailId }); the row is the idempotency key. */
  mail: 'mail-deliver',
  /** Deliver every outbox row that is due (retries after a failed attempt). */
  mailSweep: 'mail-sweep',
  /** Recompute the audit hash chain and log its head. */
  auditChain: 'audit-chain',
  /** Mail the reviewers about revisions whose periodic review fell due. */
  reviewDue: 'review-due',
} as const;

/** pg-boss's internal queue that schedules go through (src/timekeeper.js in pg-boss 10). */
const SCHEDULE_QUEUE = '__pgboss__send-it';

export type QueueName = (typeof QUEUES)[keyof typeof QUEUES];

/**
 * pg-boss's statements run on the caller's connection (a transaction, so a job exists exactly when
 * the change that queued it does). Its `$n` placeholders become Drizzle parameters.
 */
const onConnection = (db: Db | Tx) => ({
  async executeSql(text: string, values: unknown[]) {
    const parts = text.split(/\$(\d+)/);
    const query = sql.join(
      parts.map((p, i) => (i % 2 ? sql`${values[Number(p) - 1] ?? null}` : sql.raw(p))),
      sql``,
    );
    const result = await db.execute(query);
    return { rows: result.rows as Record<string, unknown>[] };
  },
});

// Only builds statements: every send passes the connection to run on.
const writer = new PgBoss({
  schema: JOB_SCHEMA,
  db: { executeSql: () => Promise.reject(new Error('a job is sent on the caller’s connection')) },
});

/** Queues a job on the caller's connection or transaction. */
export function sendJob(db: Db | Tx, name: QueueName, data: object, options: PgBoss.SendOptions = {}) {
  return writer.send(name, data, { ...options, db: onConnection(db) });
}

/**
 * As the database owner: creates or upgrades pg-boss's schema, makes every queue, and lets the
 * app role use their rows (it may not create tables, so it cannot make a queue itself).
 */
export async function installJobQueue(ownerUrl: string) {
  const boss = new PgBoss({
    connectionString: ownerUrl,
    schema: JOB_SCHEMA,
    max: 2,
    supervise: false,
    schedule: false,
  });
  boss.on('error', () => undefined);
  await boss.start();
  try {
    const existing = new Set((await boss.getQueues()).map((q) => q.name));
    for (const name of Object.values(QUEUES))
      if (!existing.has(name)) await boss.createQueue(name, { name, ...QUEUE_POLICY[name] });
    // pg-boss's own queue for the jobs its schedules send (it would make it at start, as the owner).
    if (!existing.has(SCHEDULE_QUEUE)) await boss.createQueue(SCHEDULE_QUEUE);
    const db = boss.getDb();
    await db.executeSql(`GRANT USAGE ON SCHEMA ${JOB_SCHEMA} TO ${APP_ROLE}`, []);
    await db.executeSql(
      `GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA ${JOB_SCHEMA} TO ${APP_ROLE}`,
      [],
    );
  } finally {
    await boss.stop({ graceful: false, wait: true });
  }
}

/** Retries and expiry per queue; a job a crashed process held comes back after its expiry. */
const QUEUE_POLICY: Record<QueueName, Omit<PgBoss.Queue, 'name'>> = {
  [QUEUES.mail]: { retryLimit: 3, retryDelay: 5, retryBackoff: true, expireInSeconds: 60 },
  [QUEUES.mailSweep]: { retryLimit: 0, expireInSeconds: 300 },
  [QUEUES.auditChain]: { retryLimit: 0, expireInSeconds: 900 },
  [QUEUES.reviewDue]: { retryLimit: 1, expireInSeconds: 300 },
};
