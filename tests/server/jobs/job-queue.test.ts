// Mail and the periodic checks go through the job queue in PostgreSQL (pg-boss): a mail queued by
// a process that stopped before sending is sent by the processes that come after, once; the
// schedules and the start-up checks are one for all processes.
import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, createPool } from '../../../server/db/client';
import { mailOutbox } from '../../../server/db/schema';
import { startFakeSmtp } from '../../../server/mail/fake-smtp';
import { composeMail, enqueueMail } from '../../../server/mail/outbox';
import { parseMails } from '../../support/parsed-mail';
import { startSecondServer, type ServerProcess } from '../../support/second-server';
import { createTestDatabase } from '../../support/test-db';

let database: Awaited<ReturnType<typeof createTestDatabase>>;
let pool: ReturnType<typeof createPool>;
let db: ReturnType<typeof createDb>;
let catcher: Awaited<ReturnType<typeof startFakeSmtp>>;
const servers: ServerProcess[] = [];

beforeAll(async () => {
  database = await createTestDatabase();
  pool = createPool(database.url);
  db = createDb(pool);
  catcher = await startFakeSmtp(0);
});
afterAll(async () => {
  for (const s of servers) s.stop();
  await Promise.all(servers.map((s) => s.exited));
  await catcher.close();
  await pool.end();
  await database.drop();
});

const subject = 'Review requested: TC-18 (queued before a crash)';

describe('the job queue', () => {
  it('a mail queued by a process that stopped before sending is sent once by two processes started after it', async () => {
    // What a process leaves behind when it dies right after committing: the outbox row and its job.
    await enqueueMail(db, {
      to: ['marek@tallowcreek.example'],
      subject,
      reason: 'test',
      ...composeMail({
        greeting: 'Hello Marek,',
        lines: ['Revision 2 awaits your review.'],
        link: { url: 'http://127.0.0.1:5480/revisions/x', label: 'Open the revision' },
      }),
    });
    const [row] = await db.select().from(mailOutbox).where(eq(mailOutbox.subject, subject));
    const job = await db.execute<{ state: string }>(
      sql`select state from pgboss.job where name = 'mail-deliver' and singleton_key = ${row!.id}`,
    );
    expect(job.rows.map((r) => r.state)).toEqual(['created']);
    expect(catcher.received).toHaveLength(0);

    // Two processes start at once; both work the queue and both sweep the outbox.
    const smtp = { host: '127.0.0.1', port: catcher.port, from: 'Benchwright <bench@tallowcreek.example>' };
    servers.push(
      ...(await Promise.all([
        startSecondServer(database.url, { config: { smtp } }),
        startSecondServer(database.url, { config: { smtp } }),
      ])),
    );
    const copies = async () =>
      (await parseMails(catcher.received)).filter((m) => m.subject === subject).length;
    await expect.poll(copies, { timeout: 15_000, interval: 100 }).toBe(1);
    // Longer than both processes' polling and start-up sweeps: still one copy.
    await new Promise((r) => setTimeout(r, 5_000));
    expect(await copies()).toBe(1);
    const [sent] = await db.select().from(mailOutbox).where(eq(mailOutbox.id, row!.id));
    expect(sent!.sentAt).not.toBeNull();
    expect(sent!.attempts).toBe(1);
  }, 90_000);

  it('the schedules and the start-up checks are one for all processes', async () => {
    const schedules = await db.execute<{ name: string; cron: string }>(
      sql`select name, cron from pgboss.schedule order by name`,
    );
    // Defaults: the audit chain and reviews due hourly, the outbox sweep every minute.
    expect(schedules.rows).toEqual([
      { name: 'audit-chain', cron: '0 */1 * * *' },
      { name: 'mail-sweep', cron: '* * * * *' },
      { name: 'review-due', cron: '0 */1 * * *' },
    ]);
    const started = await db.execute<{ name: string; n: number }>(
      sql`select name, count(*)::int as n from pgboss.job where singleton_key = 'start' group by name order by name`,
    );
    expect(started.rows).toEqual([
      { name: 'audit-chain', n: 1 },
      { name: 'review-due', n: 1 },
    ]);
  });

  it('a schedule fires, once for all processes: the outbox sweep runs each minute, not once per process', async () => {
    const sweeps = async () =>
      (
        await db.execute<{ at: Date }>(
          sql`select created_on as at from pgboss.job where name = 'mail-sweep' order by created_on`,
        )
      ).rows.map((r) => new Date(r.at).getTime());
    // The first at start, the next in the next minute: two processes, yet never two at once.
    await expect
      .poll(async () => (await sweeps()).length, { timeout: 80_000, interval: 500 })
      .toBeGreaterThanOrEqual(2);
    const at = await sweeps();
    for (let i = 1; i < at.length; i++) expect(at[i]! - at[i - 1]!).toBeGreaterThan(20_000);
  }, 90_000);
});
