import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mailOutbox } from '../../server/db/schema';
import { startFakeSmtp } from '../../server/mail/fake-smtp';
import { createTestApp, demo, type TestApp } from '../support/test-app';
import { approve, decodedMail, goodDoc, inReview, newDraft, params } from './review-support';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { mail: true });
});
afterAll(() => t.close());

/**
 * A transition starts a background flush right after its commit; a flush() called while a pass is
 * running joins that pass, which may have read the outbox before the latest commit. A second
 * flush starts a fresh pass that sees everything committed so far.
 */
async function deliverAll() {
  await t.mailer!.flush();
  await t.mailer!.flush();
}

/** Messages the catcher got whose raw text mentions `needle`, by recipient. */
const recipientsOf = (received: { to: string[]; raw: string }[], needle: string) =>
  received
    .filter((m) => decodedMail(m.raw).includes(needle))
    .flatMap((m) => m.to)
    .sort();
const withText = (received: { to: string[]; raw: string }[], ...needles: string[]) =>
  received.filter((m) => needles.every((n) => decodedMail(m.raw).includes(n)));

describe('review mail through the outbox and a real SMTP conversation', () => {
  it('review requested reaches every active reviewer except the author and editors', async () => {
    const d = await newDraft(t, 'hal');
    // Dee (reviewer + author) edits the draft, so she must not be asked to review it.
    const dee = await t.as('dee');
    const meta = { ...d.meta, tags: [] };
    expect(
      (
        await dee
          .put(`/api/revisions/${d.revision.id}`)
          .send({ ...meta, params, lockVersion: d.revision.lockVersion, document: goodDoc('0.15 A') })
      ).status,
    ).toBe(200);
    expect((await d.c.post(`/api/revisions/${d.revision.id}/submit`).send({})).status).toBe(200);
    await deliverAll();
    const got = recipientsOf(t.catcher!.received, `/review/revisions/${d.revision.id}`);
    expect(got).toEqual([demo.marek.email]);

    // Hal's own draft, untouched by Dee: both reviewers, never Hal, never a technician or admin.
    const solo = await inReview(t, 'hal');
    await deliverAll();
    const soloTo = recipientsOf(t.catcher!.received, `/review/revisions/${solo.revision.id}`);
    expect(soloTo).toEqual([demo.dee.email, demo.marek.email].sort());
    const msg = withText(t.catcher!.received, `/review/revisions/${solo.revision.id}`)[0]!;
    expect(msg.raw).toMatch(/Subject: Review requested/);
    expect(msg.raw).toMatch(/Content-Type: text\/plain/i);
    expect(msg.raw).toMatch(/Content-Type: text\/html/i);
    expect(decodedMail(msg.raw)).toContain(
      `<a href="http://127.0.0.1/review/revisions/${solo.revision.id}">`,
    );
  });

  it('approved and returned reach the author, with the reviewer’s comment', async () => {
    const a = await inReview(t, 'ruth');
    const marek = await t.as('marek');
    expect(
      (await approve(marek, a.revision.id, 'marek', 'Bleeder value confirmed on the bench.')).status,
    ).toBe(200);
    const r = await inReview(t, 'ruth');
    expect(
      (
        await marek
          .post(`/api/revisions/${r.revision.id}/return`)
          .send({ password: demo.marek.password, comment: 'Add the discharge check before the HT reading.' })
      ).status,
    ).toBe(200);
    await deliverAll();
    const approved = withText(t.catcher!.received, 'Subject: Approved', `/review/revisions/${a.revision.id}`);
    expect(approved.map((m) => m.to)).toEqual([[demo.ruth.email]]);
    expect(decodedMail(approved[0]!.raw)).toContain('Comment: Bleeder value confirmed on the bench.');
    const returned = withText(t.catcher!.received, 'Subject: Returned', `/review/revisions/${r.revision.id}`);
    expect(returned.map((m) => m.to)).toEqual([[demo.ruth.email]]);
    expect(decodedMail(returned[0]!.raw)).toContain(
      'Comment: Add the discharge check before the HT reading.',
    );
  });

  it('with the mail server down the approval still succeeds, and the mail goes out once it is back', async () => {
    const a = await inReview(t, 'hal');
    await deliverAll();
    const port = t.catcher!.port;
    await t.catcher!.close(); // the shop's mail server is down

    const res = await approve(await t.as('marek'), a.revision.id, 'marek', 'Approved while mail was down.');
    expect(res.status).toBe(200);
    expect(res.body.revision.state).toBe('approved');
    await deliverAll();
    const [pending] = await t.db
      .select()
      .from(mailOutbox)
      .where(eq(mailOutbox.reason, 'revision-approved'))
      .then((rows) => rows.filter((m) => m.text.includes('Approved while mail was down.')));
    expect(pending!.sentAt).toBeNull();
    expect(pending!.attempts).toBeGreaterThanOrEqual(1);
    expect(pending!.lastError).toBeTruthy();

    const back = await startFakeSmtp(port);
    try {
      await t.db.update(mailOutbox).set({ nextAttemptAt: new Date() }).where(eq(mailOutbox.id, pending!.id));
      await deliverAll();
      const delivered = withText(back.received, 'Approved while mail was down.');
      expect(delivered.map((m) => m.to)).toEqual([[demo.hal.email]]);
      const [sent] = await t.db.select().from(mailOutbox).where(eq(mailOutbox.id, pending!.id));
      expect(sent!.sentAt).not.toBeNull();
    } finally {
      await back.close();
    }
  });
});
