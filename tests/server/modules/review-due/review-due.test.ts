import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { people, reviewDueNotices } from '../../../../server/db/schema';
import { toSessionUser } from '../../../../server/auth/passport';
import { startNextDraft } from '../../../../server/modules/procedures/procedures.service';
import { startServer } from '../../../../server/index';
import { createLogger } from '../../../../server/logger';
import { notifyDueReviews } from '../../../../server/modules/review-due/review-due.service';
import { parseMails } from '../../../support/parsed-mail';
import { approveRevision, procedureInState, textDoc } from '../../../support/review-path';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { mail: true });
});
afterAll(() => t.close());

/** An approved revision whose approval is dated `months` ago (the approval time is not signed content). */
async function approvedMonthsAgo(title: string, months: number) {
  const { revision } = await procedureInState(t.db, 'approved', {
    title,
    equipmentFamily: 'Table radio',
    equipmentModel: 'TC-5R',
    tags: [],
    document: textDoc('Check the dial lamp and the rectifier.'),
  });
  await t.ownerDb.execute(
    sql`update revisions set decided_at = now() - make_interval(months => ${months}::int) where id = ${revision.id}`,
  );
  return revision;
}

const publicUrl = 'http://127.0.0.1';
const reviewers = Object.values(demo)
  .filter((p) => p.roles.includes('reviewer'))
  .map((p) => p.email)
  .sort();

describe('periodic review', () => {
  it('lists approved revisions due within 60 days or overdue, for reviewers only', async () => {
    const overdue = await approvedMonthsAgo('TC-5R dial lamp check, approved long ago', 25);
    const soon = await approvedMonthsAgo('TC-5R dial lamp check, due next month', 23);
    const fresh = await approvedMonthsAgo('TC-5R dial lamp check, approved last year', 12);
    const marek = await t.as('marek');
    const res = await marek.get('/api/review/due');
    expect(res.status).toBe(200);
    expect(res.body.intervalMonths).toBe(24);
    const byId = new Map(res.body.items.map((i: { revisionId: string }) => [i.revisionId, i]));
    expect(byId.get(overdue.id)).toMatchObject({ status: 'overdue', number: 1 });
    expect(byId.get(soon.id)).toMatchObject({ status: 'due' });
    expect(byId.has(fresh.id)).toBe(false);
    // Two years after the approval, by the calendar (23 months ago + 24 months = a month ahead).
    const due = new Date((byId.get(soon.id) as { dueAt: string }).dueAt);
    const approved = new Date((byId.get(soon.id) as { approvedAt: string }).approvedAt);
    expect(
      due.getUTCFullYear() * 12 +
        due.getUTCMonth() -
        (approved.getUTCFullYear() * 12 + approved.getUTCMonth()),
    ).toBe(24);
    expect((await (await t.as('tom')).get('/api/review/due')).status).toBe(403);
    expect((await (await t.as('hal')).get('/api/review/due')).status).toBe(403);
  });

  it('mails the reviewers once when a revision falls due, through the outbox and the local catcher', async () => {
    const due = await approvedMonthsAgo('TC-5R rectifier swap, due for review', 24);
    const before = t.catcher!.received.length;
    const first = await notifyDueReviews(t.db, { months: 24, publicUrl, mailer: t.mailer });
    expect(first).toBeGreaterThanOrEqual(1);
    await t.mailer!.flush();
    const mails = (await parseMails(t.catcher!.received.slice(before))).filter((m) =>
      m.subject.includes('TC-5R rectifier swap, due for review'),
    );
    expect(mails).toHaveLength(1);
    expect(mails[0]!.subject).toMatch(/^Review due: /);
    expect(mails[0]!.to.sort()).toEqual(reviewers);
    expect(mails[0]!.links).toContain(`${publicUrl}/review/due`);
    const [notice] = await t.db
      .select()
      .from(reviewDueNotices)
      .where(eq(reviewDueNotices.revisionId, due.id));
    expect(notice).toBeDefined();

    // Checked again (a restart, the next hour, a second process): nothing more is sent.
    const count = t.catcher!.received.length;
    expect(await notifyDueReviews(t.db, { months: 24, publicUrl, mailer: t.mailer })).toBe(0);
    const both = await Promise.all([
      notifyDueReviews(t.db, { months: 24, publicUrl, mailer: t.mailer }),
      notifyDueReviews(t.db, { months: 24, publicUrl, mailer: t.mailer }),
    ]);
    expect(both).toEqual([0, 0]);
    await t.mailer!.flush();
    expect(t.catcher!.received.length).toBe(count);
  });

  it('only the approved revision is due: once superseded by a new approval, it leaves the list', async () => {
    const old = await approvedMonthsAgo('TC-5R chassis check, replaced', 30);
    const marek = await t.as('marek');
    const listed = async () =>
      (await marek.get('/api/review/due')).body.items.map((i: { revisionId: string }) => i.revisionId);
    expect(await listed()).toContain(old.id);
    const [hal] = await t.db.select().from(people).where(eq(people.email, demo.hal.email));
    const next = await startNextDraft(t.db, toSessionUser(hal!), old.procedureId);
    await approveRevision(t.db, next.id);
    const now = await listed();
    expect(now).not.toContain(old.id);
    expect(now).not.toContain(next.id);
  });

  it('a running server looks for reviews that fell due as it starts', async () => {
    const due = await approvedMonthsAgo('TC-5R hum check, due when the server starts', 26);
    const before = t.catcher!.received.length;
    const running = await startServer({
      databaseUrl: t.databaseUrl,
      port: 0,
      logger: createLogger('silent'),
      config: {
        sessionSecret: 'review-due-watch'.padEnd(40, 'x'),
        uploadDir: t.uploadDir,
        smtp: { host: '127.0.0.1', port: t.catcher!.port, from: 'Benchwright <bench@tallowcreek.example>' },
        auditCheckIntervalMs: 0,
        reviewDueCheckIntervalMs: 0,
      },
    });
    try {
      await expect
        .poll(
          async () =>
            (await parseMails(t.catcher!.received.slice(before))).filter((m) =>
              m.subject.includes('TC-5R hum check, due when the server starts'),
            ).length,
          { timeout: 10_000, interval: 100 },
        )
        .toBe(1);
    } finally {
      await running.close();
    }
    expect(
      await t.db.select().from(reviewDueNotices).where(eq(reviewDueNotices.revisionId, due.id)),
    ).toHaveLength(1);
  });
});
